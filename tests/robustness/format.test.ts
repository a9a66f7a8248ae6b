/**
 * Formatter properties on the fuzz corpus's valid files (scripts/fuzz-lib.ts, fixed seed):
 * idempotent; the analysed model is unchanged (lowered machines with ranges stripped, findings'
 * codes and messages); every comment kept in order. The comment oracle is a scanner written here
 * from LANGUAGE.md "Lexical" (`// …` to the end of the line, `/* … *\/`), not the formatter's lexer.
 */
import { describe, expect, test } from 'vitest';
import { join } from 'node:path';
import fc from 'fast-check';
import { checkParsed, parseDetent } from '@detent/language';
import { formatDetentText } from '../../packages/language/src/lsp/formatter.js';
import { corpus } from '../../scripts/fuzz-lib.js';

const root = join(__dirname, '..', '..');

function comments(text: string): string[] {
    const out: string[] = [];
    let i = 0;
    while (i < text.length) {
        if (text.startsWith('//', i)) {
            let j = i;
            while (j < text.length && text[j] !== '\n' && text[j] !== '\r') j++;
            out.push(text.slice(i, j).trimEnd()); // trailing blanks of a line are not part of what the author wrote
            i = j;
        } else if (text.startsWith('/*', i)) {
            const end = text.indexOf('*/', i + 2);
            const j = end < 0 ? text.length : end + 2;
            out.push(text.slice(i, j));
            i = j;
        } else {
            i++;
        }
    }
    return out;
}

/** The lowered model without source positions (the formatter may move text, never meaning). */
function modelOf(text: string): unknown {
    const parsed = parseDetent(text);
    const strip = (value: unknown): unknown => {
        if (Array.isArray(value)) return value.map(strip);
        if (value && typeof value === 'object') {
            const o: Record<string, unknown> = {};
            for (const [k, v] of Object.entries(value)) if (!/range$/i.test(k) && k !== 'related') o[k] = strip(v);
            return o;
        }
        return value;
    };
    const findings = checkParsed(parsed).map((f) => `${f.severity} ${f.code}: ${f.message}`).sort();
    return { machines: strip(parsed.machines.map((m) => ({ machine: m.machine, usable: m.usable }))), findings };
}

const all = corpus({ seed: 0xf0a7, count: 1500, root });
const valid = all.filter((input) => {
    const parsed = parseDetent(input.text);
    return parsed.machines.length > 0 && !parsed.findings.some((f) => f.code === 'syntax');
});

describe('formatter on the fuzz corpus', () => {
    test('the corpus has enough valid files to mean something', () => {
        expect(valid.length).toBeGreaterThan(150);
    });

    test('idempotent, same model and findings, every comment kept', () => {
        let formatted = 0;
        let refused = 0;
        for (const input of valid) {
            const once = formatDetentText(input.text);
            if (once === undefined) { refused++; continue; }
            formatted++;
            expect(formatDetentText(once), `idempotent: ${input.id}`).toBe(once);
            expect(comments(once), `comments: ${input.id}`).toEqual(comments(input.text));
            expect(modelOf(once), `model: ${input.id}`).toEqual(modelOf(input.text));
        }
        process.stdout.write(`format: ${formatted} valid corpus files formatted, ${refused} refused (left unchanged)\n`);
        // refusing is allowed (the formatter gives up rather than risk meaning), but not as the rule
        expect(formatted).toBeGreaterThan(valid.length * 0.9);
    }, 240_000);

    test('re-spaced files format to a fixed point with the same model (fast-check, fixed seed)', () => {
        const seeds = valid.filter((v) => v.id.startsWith('seed:'));
        fc.assert(fc.property(fc.constantFrom(...seeds), fc.array(fc.integer({ min: 0, max: 1 << 20 }), { minLength: 1, maxLength: 30 }), fc.constantFrom(' ', '  ', '\t', ' \t '), (input, positions, blank) => {
            // insert blanks next to existing blanks only: never inside a token, never inside a comment's text meaningfully
            let text = input.text;
            for (const p of positions) {
                const at = text.indexOf(' ', p % text.length);
                if (at < 0) continue;
                const lineStart = text.lastIndexOf('\n', at) + 1;
                const line = text.slice(lineStart, text.indexOf('\n', at) < 0 ? text.length : text.indexOf('\n', at));
                if (line.includes('//') || line.includes('/*') || line.trimStart().startsWith('*')) continue;
                text = text.slice(0, at) + blank + text.slice(at);
            }
            const once = formatDetentText(text);
            if (once === undefined) return;
            expect(formatDetentText(once)).toBe(once);
            expect(modelOf(once)).toEqual(modelOf(input.text));
        }), { seed: 20261202, numRuns: 60 });
    }, 240_000);
});

describe('formatter limits', () => {
    test('a text past the file-length limit is left alone, quickly (the server would block on it)', async () => {
        const { MAX_SOURCE_LENGTH } = await import('@detent/language');
        const text = `machine M {\n${'    state S0 { otherwise stay; }\n'.repeat(Math.ceil(MAX_SOURCE_LENGTH / 30) + 10)}}\n`;
        const t0 = Date.now();
        expect(formatDetentText(text)).toBeUndefined();
        expect(Date.now() - t0).toBeLessThan(1000);
    });
});
