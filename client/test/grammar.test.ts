// The TextMate grammar, tokenized by vscode-textmate + vscode-oniguruma (the tokenizer VS Code itself
// runs). The keyword list is copied from LANGUAGE.md § Lexical (the language contract); the scopes
// expected are TextMate naming conventions (common practice).
import { describe, expect, it, beforeAll } from 'vitest';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath } from 'node:url';
import * as oniguruma from 'vscode-oniguruma';
import * as vsctm from 'vscode-textmate';

const require = createRequire(import.meta.url);
const grammarPath = fileURLToPath(new URL('../../syntaxes/detent.tmLanguage.json', import.meta.url));

const KEYWORDS = `machine clock rising falling reset high low sync async clear input output registered
encoding binary gray onehot onecold johnson explicit auto flipflop D T JK SR code recover state
priority emit when otherwise stay dontcare scenario step expect with`.split(/\s+/);

let grammar: vsctm.IGrammar;

beforeAll(async () => {
    const wasm = readFileSync(require.resolve('vscode-oniguruma/release/onig.wasm'));
    await oniguruma.loadWASM(wasm.buffer.slice(wasm.byteOffset, wasm.byteOffset + wasm.byteLength) as ArrayBuffer);
    const registry = new vsctm.Registry({
        onigLib: Promise.resolve({ createOnigScanner: (p: string[]) => new oniguruma.OnigScanner(p), createOnigString: (s: string) => new oniguruma.OnigString(s) }),
        loadGrammar: async (scope: string) => (scope === 'source.detent' ? vsctm.parseRawGrammar(readFileSync(grammarPath, 'utf8'), grammarPath) : null),
    });
    grammar = (await registry.loadGrammar('source.detent'))!;
});

/** [text, innermost scope] pairs of each line, state carried across lines. */
function tokenize(text: string): { text: string; scopes: string[] }[] {
    let state = vsctm.INITIAL;
    const out: { text: string; scopes: string[] }[] = [];
    for (const line of text.split('\n')) {
        const r = grammar.tokenizeLine(line, state);
        for (const t of r.tokens) out.push({ text: line.slice(t.startIndex, t.endIndex), scopes: t.scopes });
        state = r.ruleStack;
    }
    return out;
}

function scopeOf(text: string, word: string): string {
    const t = tokenize(text).find((x) => x.text === word);
    if (!t) throw new Error(`no token ${word} in ${text}`);
    return t.scopes[t.scopes.length - 1]!;
}

describe('Detent TextMate grammar', () => {
    it('gives every keyword of the contract a keyword-like scope, never a plain identifier', () => {
        for (const k of KEYWORDS) {
            const s = scopeOf(`${k} `, k);
            expect(s, k).toMatch(/^(keyword|storage|support\.constant|constant)\./);
        }
        expect(scopeOf('when level_ok -> Idle;', 'level_ok')).toMatch(/^variable\./);
    });
    it('names machines, states and transition targets', () => {
        expect(scopeOf('machine SumpPump {', 'SumpPump')).toBe('entity.name.type.machine.detent');
        expect(scopeOf('state Pumping priority {', 'Pumping')).toBe('entity.name.function.state.detent');
        expect(scopeOf('when overload -> Fault emit alarm;', 'Fault')).toBe('entity.name.function.state.detent');
        expect(scopeOf('reset rst sync clear;', 'clear')).toMatch(/^storage\.modifier/);
    });
    it('scopes comments, doc comments across lines, and numbers in all three radixes', () => {
        const doc = tokenize('/** Duty pump\n  pair. */ machine M {}');
        expect(doc.find((t) => t.text.includes('pair.'))!.scopes).toContain('comment.block.documentation.detent');
        expect(doc.find((t) => t.text === 'machine')!.scopes.at(-1)).toBe('storage.type.machine.detent');
        expect(scopeOf('x; // state Idle', ' state Idle')).toBe('comment.line.double-slash.detent');
        expect(tokenize('/* when */').every((t) => t.scopes.includes('comment.block.detent'))).toBe(true);
        expect(scopeOf('code A = 0b0010;', '0b0010')).toBe('constant.numeric.binary.detent');
        expect(scopeOf('level == 0xC', '0xC')).toBe('constant.numeric.hex.detent');
        expect(scopeOf('level >= 12', '12')).toBe('constant.numeric.decimal.detent');
    });
    it('scopes operators', () => {
        expect(scopeOf('when !a & b -> S;', '!')).toBe('keyword.operator.logical.detent');
        expect(scopeOf('when a ^ b -> S;', '^')).toBe('keyword.operator.logical.detent');
        expect(scopeOf('when a | b -> S;', '|')).toBe('keyword.operator.logical.detent');
        expect(scopeOf('when level <= 3 -> S;', '<=')).toBe('keyword.operator.comparison.detent');
        expect(scopeOf('when level != 3 -> S;', '!=')).toBe('keyword.operator.comparison.detent');
        expect(scopeOf('when a -> S;', '->')).toBe('keyword.operator.arrow.detent');
        expect(scopeOf('step overload * 2;', '*')).toBe('keyword.operator.repeat.detent');
    });
});
