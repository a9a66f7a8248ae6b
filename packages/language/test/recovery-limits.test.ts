/**
 * Error recovery (one typo must not hide the rest), the size limits of docs/language.md, speed,
 * and the Langium services' diagnostics mapping.
 */
import { describe, expect, test } from 'vitest';
import { EmptyFileSystem, URI } from 'langium';
import { MAX_GUARD_DEPTH, MAX_NAME_LENGTH, checkText, createDetentServices, parseDetent } from '@detent/language';
import { at } from './text-ranges.js';

describe('error recovery', () => {
    test('a typo in state 1 still leaves a lowering finding in state 3 reported', () => {
        const t = `machine M {
    input a, b;
    state S1 { when a -> S2; otherwize stay; }
    state S2 { when b -> S3; otherwise stay; }
    state S3 { when a -> Nowhere; otherwise stay; }
}`;
        const f = parseDetent(t).findings;
        expect(f.map((x) => x.code)).toEqual(['syntax', 'unknown-name']);
        expect(f[0]!.range).toEqual(at(t, 'otherwize'));
        expect(f[1]!.range).toEqual(at(t, 'Nowhere'));
    });

    test('a broken guard and a missing semicolon in different states are both reported, with later findings', () => {
        const t = `machine M {
    input a;
    state S1 { when a & -> S1; otherwise stay; }
    state S2 { when a -> S1 otherwise stay; }
    state S3 { emit nothing; otherwise stay; }
}`;
        const f = parseDetent(t).findings;
        expect(f.map((x) => x.code)).toEqual(['syntax', 'syntax', 'unknown-name']);
        expect(f[0]!.range).toEqual(at(t, '->', 1, 'a & ->'));
        expect(f[2]!.range).toEqual(at(t, 'nothing'));
    });

    test('an error in one machine leaves the next machine usable', () => {
        const r = parseDetent('machine P { state X { when -> X; } } machine Q { input a; state Y { when a -> Y; otherwise stay; } }');
        expect(r.machines.map((m) => [m.machine.name, m.usable])).toEqual([['P', false], ['Q', true]]);
    });

    test('a missing closing brace at the end belongs to the last machine', () => {
        const r = parseDetent('machine P { state X { otherwise stay; } ');
        expect(r.findings.map((f) => f.code)).toEqual(['syntax']);
        expect(r.machines[0]!.usable).toBe(false);
    });

    test('a keyword used as a name gets a message saying so', () => {
        const t = 'machine P { input high; state X { otherwise stay; } }';
        const f = parseDetent(t).findings;
        expect(f.map((x) => [x.code, x.range])).toEqual([['syntax', at(t, 'high')]]);
        expect(f[0]!.message).toBe("'high' is a Detent keyword and cannot be used as a name here");
    });

    test('a byte-order mark at the start is ignored', () => {
        expect(parseDetent('\uFEFFmachine P { state X { otherwise stay; } }').findings).toEqual([]);
    });

    test('unexpected characters are syntax errors at their position', () => {
        const t = 'machine P { input a; state X { when a $ -> X; otherwise stay; } }';
        expect(parseDetent(t).findings.map((f) => [f.code, f.range])).toEqual([['syntax', at(t, '$')]]);
    });
});

describe('limits', () => {
    test(`guard nesting up to ${MAX_GUARD_DEPTH} is fine`, () => {
        const g = `${'('.repeat(MAX_GUARD_DEPTH)}a${')'.repeat(MAX_GUARD_DEPTH)}`;
        expect(parseDetent(`machine M { input a; state X { when ${g} -> X; otherwise stay; } }`).findings).toEqual([]);
        const n = `${'!'.repeat(MAX_GUARD_DEPTH)}a`;
        expect(parseDetent(`machine M { input a; state X { when ${n} -> X; otherwise stay; } }`).findings).toEqual([]);
    });

    test('deeper nesting gives ONE clear error and no stack overflow, even 100 000 deep; the rest is still checked', () => {
        for (const depth of [MAX_GUARD_DEPTH + 1, 100_000]) {
            const g = `${'('.repeat(depth)}a${')'.repeat(depth)}`;
            const t = `machine M { input a; state X { when ${g} -> X; otherwise stay; } state Y { when q -> X; otherwise stay; } }`;
            const f = parseDetent(t).findings;
            expect(f.map((x) => x.code)).toEqual(['syntax', 'unknown-name']);
            expect(f[0]!.message).toContain(`deeper than ${MAX_GUARD_DEPTH}`);
            expect(f[0]!.range.start.character).toBe(t.indexOf('(') + MAX_GUARD_DEPTH);
        }
        const nots = `machine M { input a; state X { when ${'!'.repeat(50_000)}a -> X; otherwise stay; } }`;
        expect(parseDetent(nots).findings.map((x) => x.code)).toEqual(['syntax']);
    });

    test('long & chains are flat, not nested: 5 000 operands are fine', () => {
        const chain = Array.from({ length: 5000 }, () => 'a').join(' & ');
        const r = parseDetent(`machine M { input a; state X { when ${chain} -> X; otherwise stay; } }`);
        expect(r.findings).toEqual([]);
    });

    test(`names up to ${MAX_NAME_LENGTH} characters; longer is a syntax error`, () => {
        const ok = `s${'x'.repeat(MAX_NAME_LENGTH - 1)}`;
        expect(parseDetent(`machine M { state ${ok} { otherwise stay; } }`).findings).toEqual([]);
        const long = `s${'x'.repeat(MAX_NAME_LENGTH)}`;
        const t = `machine M { state ${long} { otherwise stay; } }`;
        expect(parseDetent(t).findings.map((f) => [f.code, f.range])).toEqual([['syntax', at(t, long)]]);
    });
});

describe('speed', () => {
    test('a generated 512-state machine parses and lowers without a blow-up (under 1 s; the figure is printed)', () => {
        const states = Array.from({ length: 512 }, (_, i) => `    state S${i} {
        emit busy, lvl = ${i % 16};
        when go & level == ${i % 16} -> S${(i + 1) % 512};
        when !go | stop -> S0 emit flag;
        otherwise stay;
    }`).join('\n');
        const text = `machine Big {\n    reset rst -> S0;\n    input go, stop;\n    input [4] level;\n    output busy, flag;\n    output [4] lvl;\n${states}\n}\n`;
        // CPU time of this process (not wall time): the test runs beside other test processes on 2 cores
        const cpu = () => { const u = process.cpuUsage(); return (u.user + u.system) / 1000; };
        for (let i = 0; i < 5; i++) parseDetent(text); // warm-up: parser construction and JIT
        const times: number[] = [];
        for (let i = 0; i < 25; i++) {
            const t0 = cpu();
            const r = parseDetent(text);
            times.push(cpu() - t0);
            expect(r.findings).toEqual([]);
            expect(r.machines[0]!.machine.states).toHaveLength(512);
        }
        times.sort((a, b) => a - b);
        console.log(`512-state parse+lower (${text.length} chars): min ${times[0]!.toFixed(1)} ms, median ${times[12]!.toFixed(1)} ms CPU`);
        // A guard against quadratic behaviour, not a benchmark: typically 60–140 ms on the shared
        // 2-core machine (varies with its load); a quadratic step at 512 states takes seconds.
        expect(times[0]!).toBeLessThan(1000);
    });
});

describe('Langium services', () => {
    test('document diagnostics are the checkText findings: code, source detent, data, relatedInformation', async () => {
        const { shared } = createDetentServices({ ...EmptyFileSystem });
        const text = 'machine M { input door; output door; state Idle { when gate -> Idle; otherwise stay; } }';
        const doc = shared.workspace.LangiumDocumentFactory.fromString(text, URI.parse('memory:///t.detent'));
        await shared.workspace.DocumentBuilder.build([doc], { validation: true });
        const diags = doc.diagnostics ?? [];
        const expected = checkText(text);
        expect(diags.map((d) => [d.code, d.range, d.message])).toEqual(expected.map((f) => [f.code, f.range, f.message]));
        expect(diags.every((d) => d.source === 'detent')).toBe(true);
        expect(diags[0]!.data).toEqual({ code: 'duplicate-name', signal: 'door' });
        expect(diags[0]!.relatedInformation?.[0]?.location.uri).toBe(URI.parse('memory:///t.detent').toString());
        expect(diags[1]!.data).toEqual({ code: 'unknown-name', signal: 'gate' });
    });

    test('cross-references resolve through Langium scoping (inputs visible in the whole machine)', async () => {
        const { shared } = createDetentServices({ ...EmptyFileSystem });
        const text = 'machine M { input go; output lamp; state Idle { emit lamp; when go -> Busy; otherwise stay; } state Busy { otherwise -> Idle; } }';
        const doc = shared.workspace.LangiumDocumentFactory.fromString(text, URI.parse('memory:///r.detent'));
        await shared.workspace.DocumentBuilder.build([doc], { validation: true });
        const model = doc.parseResult.value as unknown as { machines: { members: { $type: string; items?: { $type: string; guard?: { signal?: { ref?: { name: string } } }; target?: { ref?: { name: string } }; emits?: { output: { ref?: { name: string } } }[] }[] }[] }[] };
        const idle = model.machines[0]!.members.find((m) => m.$type === 'State')!;
        const when = idle.items!.find((i) => i.$type === 'Transition')!;
        expect(when.guard?.signal?.ref?.name).toBe('go');
        expect(when.target?.ref?.name).toBe('Busy');
        const moore = idle.items!.find((i) => i.$type === 'MooreEmit')!;
        expect(moore.emits![0]!.output.ref?.name).toBe('lamp');
    });
});
