// The formatter's three promises, checked on every example and on seeded random re-spacings:
// idempotent, every comment kept verbatim and in order, meaning unchanged. "Meaning" is judged by
// re-parsing both texts and comparing the lowered machines with every source range removed, and
// the finding codes; comments are found by this file's own scan (not the formatter's lexer).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseDetent, checkText } from '@detent/language';
import { formatDetentText } from '../../packages/language/src/lsp/formatter.js';
import { ROOT } from './harness.js';

function examples(): { name: string; text: string }[] {
    const dirs = [join(ROOT, 'examples'), join(ROOT, 'examples', 'defects'), join(ROOT, 'tests', 'lsp', 'fixtures')];
    return dirs.flatMap((dir) => {
        try {
            return readdirSync(dir).filter((f) => f.endsWith('.detent')).map((f) => ({ name: f, text: readFileSync(join(dir, f), 'utf8') }));
        } catch {
            return [];
        }
    });
}

/** Comments in source order, found by a scan written here (strings do not exist in Detent). */
function comments(text: string): string[] {
    return text.match(/\/\/[^\n\r]*|\/\*[\s\S]*?\*\//g) ?? [];
}

/** The lowered model without ranges (positions move when spacing changes; nothing else may). */
function meaning(text: string): unknown {
    const strip = (v: unknown): unknown => {
        if (Array.isArray(v)) return v.map(strip);
        if (v && typeof v === 'object') {
            return Object.fromEntries(Object.entries(v).filter(([k]) => !/range$/i.test(k)).map(([k, x]) => [k, strip(x)]));
        }
        return v;
    };
    return strip(parseDetent(text).machines.map((m) => ({ machine: m.machine, usable: m.usable })));
}

const findingCodes = (text: string) => checkText(text).map((f) => f.code).sort();

describe('formatter', () => {
    const all = examples();

    it('has examples to work on', () => {
        expect(all.length).toBeGreaterThan(3);
    });

    for (const { name, text } of all) {
        it(`keeps meaning and comments, and is idempotent: ${name}`, () => {
            const once = formatDetentText(text);
            if (once === undefined) {
                // only text the lexer cannot read may be refused; syntax-error files still format
                expect(name).toMatch(/syntax/);
                return;
            }
            expect(formatDetentText(once)).toBe(once);
            expect(comments(once)).toEqual(comments(text));
            if (!/syntax/.test(name)) {
                expect(meaning(once)).toEqual(meaning(text));
                expect(findingCodes(once)).toEqual(findingCodes(text));
            }
        });
    }

    it('any horizontal re-spacing formats to the same text (seeded)', () => {
        const sources = all.filter((e) => !/syntax/.test(e.name));
        fc.assert(fc.property(fc.integer({ min: 0, max: sources.length - 1 }), fc.array(fc.integer({ min: 0, max: 3 }), { minLength: 64, maxLength: 64 }), (k, choices) => {
            const canonical = formatDetentText(sources[k]!.text)!;
            let c = 0;
            // Re-space: each run of spaces between two tokens on a line becomes 1–3 spaces, or none
            // where neither side is a word character and no two-character operator could form.
            let inComment = false;
            const respaced = canonical.split('\n').map((line) => {
                // lines of a multi-line block comment are comment text: never touched
                const opensComment = /\/\*(?![\s\S]*\*\/)/.test(line.replace(/\/\*.*?\*\//g, ''));
                if (inComment) {
                    if (line.includes('*/')) inComment = false;
                    return line;
                }
                if (opensComment) { inComment = true; return line; }
                const indent = /^\s*/.exec(line)![0];
                const body = line.slice(indent.length);
                const tokens = body.match(/\/\/.*$|\/\*.*?\*\/|\s+|[A-Za-z_0-9]+|->|==|!=|<=|>=|./g) ?? [];
                let out = ' '.repeat(choices[c++ % choices.length]!);
                tokens.forEach((t, i) => {
                    const prev = tokens[i - 1];
                    const next = tokens[i + 1];
                    if (/^\s+$/.test(t) && prev && next && !next.startsWith('//') && !next.startsWith('/*')) {
                        const n = choices[c++ % choices.length]!;
                        const wordy = /\w$/.test(prev) && /^\w/.test(next);
                        const opChars = /[-<>=!]$/.test(prev) || /^[-<>=!]/.test(next);
                        out += ' '.repeat(n === 0 && (wordy || opChars) ? 1 : n);
                    } else {
                        out += t;
                    }
                });
                return out;
            }).join('\n');
            expect(formatDetentText(respaced)).toBe(canonical);
        }), { seed: 1202, numRuns: 150 });
    });

    it('indents by braces and continuation, keeps trailing comment gaps', () => {
        const text = 'machine M {\nstate A {\nwhen a &\nb -> A;   // both\notherwise stay;\n}\n}\n';
        // common practice for brace languages: one level per open brace, one more for a continued statement
        expect(formatDetentText(text)).toBe('machine M {\n    state A {\n        when a &\n            b -> A;   // both\n        otherwise stay;\n    }\n}\n');
    });
});
