/**
 * Robustness: random edits of the example machines (character deletions, duplications,
 * insertions of punctuation or keywords) never make parsing/lowering throw, and every finding's
 * range lies inside the text (bounds computed from the text itself); checkText runs the core
 * checks on what stays usable without throwing either. Fixed seed (fast-check).
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { expect, test } from 'vitest';
import { checkText, parseDetent } from '@detent/language';

const examples = fileURLToPath(new URL('../../../examples/', import.meta.url));
const sources = readdirSync(examples).filter((f) => f.endsWith('.detent')).map((f) => readFileSync(join(examples, f), 'utf8'));
const snippets = [';', '{', '}', '(', ')', '->', 'state', 'when', 'emit', '!', '&', '==', '0b', '[', ']', '*', 'otherwise', 'input', '/*', '"', '12345678901234567890'];

type Edit = { kind: 'delete' | 'duplicate' | 'insert'; at: number; length: number; snippet: number };

function apply(text: string, edits: readonly Edit[]): string {
    let t = text;
    for (const e of edits) {
        const at = Math.floor(e.at * t.length);
        if (e.kind === 'delete') t = t.slice(0, at) + t.slice(at + e.length);
        else if (e.kind === 'duplicate') t = t.slice(0, at) + t.slice(at, at + e.length) + t.slice(at);
        else t = `${t.slice(0, at)} ${snippets[e.snippet % snippets.length]} ${t.slice(at)}`;
    }
    return t;
}

function inside(text: string, p: { line: number; character: number }): boolean {
    const lines = text.split(/\r\n|\r|\n/);
    return p.line >= 0 && p.line < lines.length && p.character >= 0 && p.character <= lines[p.line]!.length;
}

test('random edits never throw; every range lies inside the text', () => {
    const edit = fc.record({
        kind: fc.constantFrom<'delete' | 'duplicate' | 'insert'>('delete', 'duplicate', 'insert'),
        at: fc.double({ min: 0, max: 1, noNaN: true }),
        length: fc.integer({ min: 1, max: 12 }),
        snippet: fc.nat(),
    });
    fc.assert(fc.property(fc.nat(sources.length - 1), fc.array(edit, { minLength: 1, maxLength: 4 }), (which, edits) => {
        const text = apply(sources[which]!, edits);
        const r = parseDetent(text);
        // the design analyses and scenarios run on whatever stays usable (as-built skipped: slow and time-bounded)
        const all = checkText(text, undefined, { skipAsBuilt: true });
        for (const f of all) expect(inside(text, f.range.start) && inside(text, f.range.end)).toBe(true);
        for (const f of [...r.findings, ...r.machines.flatMap((m) => m.findings)]) {
            expect(inside(text, f.range.start) && inside(text, f.range.end)).toBe(true);
        }
        for (const m of r.machines) {
            for (const s of m.machine.states) expect(inside(text, s.nameRange.start)).toBe(true);
        }
    }), { seed: 20261202, numRuns: 120 });
});
