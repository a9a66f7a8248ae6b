/**
 * Each size limit of docs/limits.md answers with a clear error instead of a hang or a stack
 * overflow, and its diagnostic lies inside the document. The inputs are built here; the expected
 * codes and numbers come from docs/limits.md (our own contract), the range rule from LSP
 * (0-based line < line count, character ≤ line length).
 */
import { describe, expect, test } from 'vitest';
import { checkText, parseDetent } from '@detent/language';
import { lineLengths, rangeProblem } from '../../scripts/fuzz-lib.js';

function check(text: string) {
    const t0 = Date.now();
    const findings = checkText(text);
    const ms = Date.now() - t0;
    const lengths = lineLengths(text);
    for (const f of findings) expect(rangeProblem(f.range, lengths), `${f.code}: ${f.message}`).toBeUndefined();
    return { findings, ms };
}

const one = (guard: string, decl = 'input a;') => `machine Deep {\n    ${decl}\n    reset rst -> S0;\n    state S0 {\n        when ${guard} -> S0;\n        otherwise stay;\n    }\n}\n`;

describe('text limits', () => {
    test('10 000 nested parentheses: a syntax error at the 65th level, no stack overflow', () => {
        const { findings } = check(one(`${'('.repeat(10_000)}a${')'.repeat(10_000)}`));
        const deep = findings.find((f) => /nested deeper than 64 levels/.test(f.message));
        expect(deep?.code).toBe('syntax');
        expect(deep?.range.start).toEqual({ line: 4, character: '        when '.length + 64 });
    });

    test('10 000 prefix ! and unclosed parentheses', () => {
        expect(check(one(`${'!'.repeat(10_000)}a`)).findings.some((f) => /nested deeper/.test(f.message))).toBe(true);
        expect(check(one(`${'('.repeat(10_000)}a`)).findings.some((f) => f.code === 'syntax')).toBe(true);
    });

    test('a 1 MiB identifier is a syntax error on the name', () => {
        const { findings } = check(`machine M {\n    state ${'s'.repeat(1 << 20)} { otherwise stay; }\n}\n`);
        const f = findings.find((x) => /name longer than 128 characters/.test(x.message));
        expect(f?.range).toEqual({ start: { line: 1, character: 10 }, end: { line: 1, character: 10 + (1 << 20) } });
    });

    test('a file over 2 MiB is refused at 1:1 without parsing', () => {
        const text = `machine Big {\n${'    // filler line of a generated file\n'.repeat(60_000)}}\n`;
        expect(text.length).toBeGreaterThan(2 * 1024 * 1024);
        const { findings, ms } = check(text);
        expect(findings).toHaveLength(1);
        expect(findings[0]).toMatchObject({ code: 'syntax', severity: 'error', range: { start: { line: 0, character: 0 } } });
        expect(findings[0]!.message).toContain(`file has ${text.length} characters`);
        expect(ms).toBeLessThan(5000);
    });
});

describe('machine limits', () => {
    test('1 025 states', () => {
        const states = Array.from({ length: 1025 }, (_, i) => `    state S${i} { when a -> S${(i + 1) % 1025}; otherwise stay; }`).join('\n');
        const { findings } = check(`machine Many {\n    input a;\n    reset rst -> S0;\n${states}\n}\n`);
        expect(findings.map((f) => [f.code, f.severity, f.message])).toEqual([['limit', 'error', "machine 'Many' has 1025 states; Detent analyses and synthesizes up to 1024 (split it into cooperating machines)"]]);
    });

    test('1 024 states are accepted (the limit is inclusive)', () => {
        const parsed = parseDetent(`machine Many {\n    input a;\n${Array.from({ length: 1024 }, (_, i) => `    state S${i} { when a -> S${(i + 1) % 1024}; otherwise stay; }`).join('\n')}\n}\n`);
        expect(parsed.findings.filter((f) => f.code === 'limit')).toEqual([]);
        expect(parsed.machines[0]!.usable).toBe(true);
    });

    test('257 input bits and 272 output bits', () => {
        const ins = [...Array.from({ length: 16 }, (_, i) => `    input [16] b${i};`), '    input extra;'].join('\n');
        const outs = Array.from({ length: 17 }, (_, i) => `    output [16] y${i};`).join('\n');
        const { findings } = check(`machine Wide {\n${ins}\n${outs}\n    state S0 { when extra -> S0; otherwise stay; }\n}\n`);
        const messages = findings.filter((f) => f.code === 'limit').map((f) => f.message);
        expect(messages).toContain("machine 'Wide' has 257 input bits; Detent analyses up to 256");
        expect(messages).toContain("machine 'Wide' has 272 output bits; Detent synthesizes up to 256");
    });

    test('a 40-input XOR (2^39 product terms) is refused quickly with the guard range', () => {
        const names = Array.from({ length: 40 }, (_, i) => `a${i}`);
        const text = one(names.join(' ^ '), `input ${names.join(', ')};`);
        const { findings, ms } = check(text);
        const f = findings.find((x) => x.code === 'limit');
        expect(f?.severity).toBe('error');
        expect(f?.message).toMatch(/more than 4096 product terms/);
        expect(f?.range.start).toEqual({ line: 4, character: '        when '.length });
        expect(ms).toBeLessThan(10_000);
    });

    test('an 8-input XOR (128 terms) is still analysed: no limit, and its overlap-free machine checks clean of errors', () => {
        const names = Array.from({ length: 8 }, (_, i) => `a${i}`);
        const { findings } = check(one(names.join(' ^ '), `input ${names.join(', ')};`));
        expect(findings.filter((f) => f.code === 'limit')).toEqual([]);
        expect(findings.filter((f) => f.severity === 'error')).toEqual([]);
    });

    test('257 transitions in one state', () => {
        const whens = Array.from({ length: 257 }, (_, i) => `        when v == ${i} -> S1;`).join('\n');
        const { findings } = check(`machine Decode {\n    input [12] v;\n    state S0 {\n${whens}\n    }\n    state S1 { otherwise -> S0; }\n}\n`);
        expect(findings.filter((f) => f.code === 'limit').map((f) => f.message)).toEqual(["state 'S0' has 257 transitions; Detent synthesizes up to 256 per state (decode the input outside the machine or split the state)"]);
    });

    test('a 5 000-digit binary number and bus width are errors, not crashes', () => {
        const bin = `0b${'1'.repeat(5000)}`;
        expect(check(`machine N {\n    input [4] v;\n    state S0 { when v == ${bin} -> S0; otherwise stay; }\n}\n`).findings.some((f) => f.severity === 'error')).toBe(true);
        expect(check('machine W {\n    input [65536] v;\n    state S0 { when v[65535] -> S0; otherwise stay; }\n}\n').findings.some((f) => f.code === 'width')).toBe(true);
    });
});

describe('parser recovery', () => {
    test('a nameless machine left by recovery is not usable (found by the fuzz suite: it was exported as ".v")', () => {
        // from fuzz input line-delete+3:examples/defects/no-return.detent (seed 777)
        const text = 'machine : {\nmachine : {\n    reset rst -> Empty;\n    input fill;\n    output valve;\n    state Empty { when fill -> Full; otherwise stay; }\n    state Full  { emit valve;  stay; }\n}\n';
        const parsed = parseDetent(text);
        expect(parsed.machines.length).toBeGreaterThan(0);
        for (const m of parsed.machines) if (m.machine.name === '') expect(m.usable).toBe(false);
        expect(parsed.findings.some((f) => f.code === 'syntax')).toBe(true);
    });
});
