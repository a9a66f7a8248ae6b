/**
 * examples/defects/<code>.detent produces exactly the diagnostics it is named for (that code
 * only, possibly several times): each file's expected code is its name, which was chosen by
 * reasoning through LANGUAGE.md (the reasoning is in each file's doc comment), not copied from
 * our output. The realistic examples in examples/*.detent have no error and no warning.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, test } from 'vitest';
import { checkText } from '@detent/language';
import { DEFAULT_SEVERITY, type FindingCode } from '@detent/core';

const examples = fileURLToPath(new URL('../../examples/', import.meta.url));
const defects = join(examples, 'defects');

// Every diagnostic code of LANGUAGE.md's table (Detent's own `limit` code has no defect file).
const LANGUAGE_MD_CODES: readonly FindingCode[] = [
    'syntax', 'unknown-name', 'duplicate-name', 'reserved-name', 'width', 'encoding', 'output-conflict',
    'overlap', 'incomplete', 'shadowed', 'never', 'unreachable', 'equivalent', 'no-return', 'lockup',
    'reset-code', 'no-reset', 'async-input', 'unused-input', 'unused-output', 'scenario',
];

describe('examples/defects', () => {
    test('one file per diagnostic code of LANGUAGE.md', () => {
        const files = readdirSync(defects).filter((f) => f.endsWith('.detent')).map((f) => f.replace(/\.detent$/, '')).sort();
        expect(files).toEqual([...LANGUAGE_MD_CODES].sort());
    });

    for (const code of LANGUAGE_MD_CODES) {
        test(`${code}.detent reports exactly {${code}}`, () => {
            const findings = checkText(readFileSync(join(defects, `${code}.detent`), 'utf8'), `${code}.detent`);
            expect(new Set(findings.map((f) => f.code))).toEqual(new Set([code]));
            // severity as LANGUAGE.md's table gives it
            for (const f of findings) expect(f.severity).toBe(DEFAULT_SEVERITY[code]);
        });
    }
});

describe('examples', () => {
    const files = readdirSync(examples).filter((f) => f.endsWith('.detent')).sort();

    test('the four realistic machines are there', () => {
        expect(files).toEqual(expect.arrayContaining(['barrier-gate.detent', 'frame-receiver.detent', 'press-guard.detent', 'sump-pump.detent']));
    });

    for (const file of files) {
        test(`${file}: no error, no warning`, () => {
            const findings = checkText(readFileSync(join(examples, file), 'utf8'), file);
            expect(findings.filter((f) => f.severity !== 'info').map((f) => `${f.code}: ${f.message}`)).toEqual([]);
        });
        test(`${file}: documented, with at least two scenarios per machine`, () => {
            const text = readFileSync(join(examples, file), 'utf8');
            expect(text).toMatch(/\/\*\*[\s\S]*?\*\/\s*machine/);
            expect((text.match(/^\s*scenario /gm) ?? []).length).toBeGreaterThanOrEqual(2);
        });
    }
});
