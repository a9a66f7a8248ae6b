/**
 * Fuzzing corpus and invariants, shared by the fuzz runner (scripts/fuzz.mjs → fuzz-worker.ts)
 * and the robustness tests (tests/robustness/**). Everything is a pure function of a seed, so a
 * failing input can be regenerated from its id alone.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import type { Emit, Guard, Machine, SourceRange } from '@detent/core';
import { mulberry32, randomMachine, type Rng } from '../packages/core/test/support/random-machine.js';

export interface FuzzInput {
    /** Stable id: how the input was made (`mutate:sump-pump.detent:#123`). */
    readonly id: string;
    readonly text: string;
    /** Per-input time budget in ms (pathological inputs get more). */
    readonly budgetMs?: number;
    /** Skip synthesis/export (used for the huge inputs, where parse + check is the point). */
    readonly parseOnly?: boolean;
}

// ---------------------------------------------------------------------------------------------
// Seeds: the examples, the defect files, and printed random machines.

export function exampleSeeds(root: string): { name: string; text: string }[] {
    const out: { name: string; text: string }[] = [];
    const walk = (dir: string) => {
        for (const e of readdirSync(dir, { withFileTypes: true }).sort((a, b) => a.name.localeCompare(b.name))) {
            const p = join(dir, e.name);
            if (e.isDirectory()) walk(p);
            else if (e.name.endsWith('.detent')) out.push({ name: p.slice(root.length + 1), text: readFileSync(p, 'utf8') });
        }
    };
    walk(join(root, 'examples'));
    return out;
}

function guardText(m: Machine, g: Guard): string {
    switch (g.kind) {
        case 'const': return g.value ? '1' : '0';
        case 'input': return m.inputs[g.input]!.name;
        case 'bit': return `${m.inputs[g.input]!.name}[${g.bit}]`;
        case 'compare': return `${m.inputs[g.input]!.name} ${g.op} ${g.value}`;
        case 'not': return `!(${guardText(m, g.operand)})`;
        case 'and': case 'or': case 'xor': {
            const op = g.kind === 'and' ? ' & ' : g.kind === 'or' ? ' | ' : ' ^ ';
            return g.operands.map((o) => `(${guardText(m, o)})`).join(op);
        }
    }
}

function emitsText(m: Machine, emits: readonly Emit[]): string {
    return emits.map((e) => (m.outputs[e.output]!.isBus ? `${m.outputs[e.output]!.name} = ${e.value}` : m.outputs[e.output]!.name)).join(', ');
}

/** Detent source for a core model (used to turn generated machines into text). */
export function machineText(m: Machine): string {
    const L: string[] = [];
    L.push(`machine ${m.name} {`);
    L.push(`    clock ${m.clock.name}${m.clock.edge === 'falling' ? ' falling' : ''};`);
    if (m.reset) {
        const r = m.reset;
        const target = r.target === 'clear' ? 'clear' : `-> ${m.states[r.target]!.name}`;
        L.push(`    reset ${r.name} ${r.activeHigh ? 'high' : 'low'} ${r.async ? 'async' : 'sync'} ${target};`);
    }
    for (const i of m.inputs) L.push(`    input ${i.async ? 'async ' : ''}${i.isBus ? `[${i.width}] ` : ''}${i.name};`);
    for (const o of m.outputs) L.push(`    output ${o.registered ? 'registered ' : ''}${o.isBus ? `[${o.width}] ` : ''}${o.name};`);
    L.push(`    encoding ${m.encoding};`);
    L.push(`    flipflop ${m.flipflop};`);
    if (m.recover) L.push(`    recover -> ${m.states[m.recover.target]!.name};`);
    if (m.encoding === 'explicit') for (const s of m.states) if (s.code) L.push(`    code ${s.name} = 0b${s.code.bits};`);
    for (const s of m.states) {
        L.push(`    /** State ${s.name}. */`);
        L.push(`    state ${s.name}${s.priority ? ' priority' : ''} {`);
        if (s.emits.length) L.push(`        emit ${emitsText(m, s.emits)};`);
        for (const t of s.transitions) {
            L.push(`        when ${guardText(m, t.guard)} -> ${m.states[t.target]!.name}${t.emits.length ? ` emit ${emitsText(m, t.emits)}` : ''}; // to ${m.states[t.target]!.name}`);
        }
        const o = s.otherwise;
        if (o?.kind === 'stay') L.push('        otherwise stay;');
        else if (o?.kind === 'dontcare') L.push('        otherwise dontcare;');
        else if (o?.kind === 'goto') L.push(`        otherwise -> ${m.states[o.target]!.name}${o.emits.length ? ` emit ${emitsText(m, o.emits)}` : ''};`);
        L.push('    }');
    }
    L.push('}');
    return `${L.join('\n')}\n`;
}

export function generatedSeeds(seed: number, count: number): { name: string; text: string }[] {
    const rng = mulberry32(seed);
    const out: { name: string; text: string }[] = [];
    for (let k = 0; k < count; k++) {
        const m = randomMachine(rng, { maxStates: 7, maxBitInputs: 3, maxBuses: 1, maxBusWidth: 3 }, `Gen${k}`);
        out.push({ name: `generated#${k}`, text: machineText(m) });
    }
    return out;
}

// ---------------------------------------------------------------------------------------------
// Mutations.

const KEYWORDS = 'machine clock rising falling reset high low sync async clear input output registered encoding binary gray onehot onecold johnson explicit auto flipflop D T JK SR code recover state priority emit when otherwise stay dontcare scenario step expect with'.split(' ');
const PUNCT = ['{', '}', '(', ')', '[', ']', ';', ',', '=', '!', '&', '^', '|', '<', '>', '*', '->', '==', '!=', '<=', '>=', '//', '/*', '*/', '/**'];
const ODD = ['\0', '\uFEFF', '\uD800', '\uDC00', '\r', '\r\n', '\t', '\u2028', 'é', '😀', '\\', '"', '`', '$', '@', '#', '0b', '0x', '0b1111111111111111111111111111111111', '99999999999999999999999', '-1', 'signal', 'begin', 'state', 'Idle', 'Fault', 'level', 'x'.repeat(200)];

function int(rng: Rng, lo: number, hi: number): number {
    return lo + Math.floor(rng() * (hi - lo + 1));
}
function pick<T>(rng: Rng, xs: readonly T[]): T {
    return xs[Math.floor(rng() * xs.length)]!;
}

function randomToken(rng: Rng): string {
    const r = rng();
    if (r < 0.35) return pick(rng, KEYWORDS);
    if (r < 0.7) return pick(rng, PUNCT);
    if (r < 0.8) return String(int(rng, 0, 70000));
    if (r < 0.9) return `n${int(rng, 0, 9)}`;
    return pick(rng, ODD);
}

/** Token boundaries: runs of word characters, runs of space, single other characters. */
function tokens(text: string): string[] {
    return text.match(/[A-Za-z0-9_]+|\s+|[\s\S]/g) ?? [];
}

export type MutationKind = 'byte-insert' | 'byte-delete' | 'token-insert' | 'token-delete' | 'token-swap' | 'line-duplicate' | 'line-delete' | 'truncate' | 'random-tokens';
export const MUTATIONS: readonly MutationKind[] = ['byte-insert', 'byte-delete', 'token-insert', 'token-delete', 'token-swap', 'line-duplicate', 'line-delete', 'truncate', 'random-tokens'];

export function mutate(rng: Rng, text: string, kind: MutationKind): string {
    switch (kind) {
        case 'byte-insert': {
            const at = int(rng, 0, text.length);
            const ch = rng() < 0.7 ? String.fromCharCode(int(rng, 32, 126)) : pick(rng, ODD).slice(0, 2);
            return text.slice(0, at) + ch + text.slice(at);
        }
        case 'byte-delete': {
            const at = int(rng, 0, Math.max(0, text.length - 1));
            return text.slice(0, at) + text.slice(at + int(rng, 1, 3));
        }
        case 'token-insert': {
            const t = tokens(text);
            t.splice(int(rng, 0, t.length), 0, ` ${randomToken(rng)} `);
            return t.join('');
        }
        case 'token-delete': {
            const t = tokens(text);
            if (t.length) t.splice(int(rng, 0, t.length - 1), 1);
            return t.join('');
        }
        case 'token-swap': {
            const t = tokens(text);
            if (t.length > 1) {
                const a = int(rng, 0, t.length - 1);
                const b = int(rng, 0, t.length - 1);
                [t[a], t[b]] = [t[b]!, t[a]!];
            }
            return t.join('');
        }
        case 'line-duplicate': {
            const lines = text.split('\n');
            const i = int(rng, 0, lines.length - 1);
            lines.splice(i, 0, lines[i]!);
            return lines.join('\n');
        }
        case 'line-delete': {
            const lines = text.split('\n');
            lines.splice(int(rng, 0, lines.length - 1), 1);
            return lines.join('\n');
        }
        case 'truncate':
            return text.slice(0, int(rng, 0, text.length));
        case 'random-tokens': {
            const n = int(rng, 1, 300);
            const out: string[] = [];
            for (let i = 0; i < n; i++) out.push(randomToken(rng), rng() < 0.1 ? '\n' : ' ');
            return out.join('');
        }
    }
}

// ---------------------------------------------------------------------------------------------
// Pathological inputs (the limits).

const SMALL = (guard: string) => `machine Deep {\n    input a;\n    state S0 {\n        when ${guard} -> S0;\n        otherwise stay;\n    }\n}\n`;

export function pathologicalInputs(): FuzzInput[] {
    const out: FuzzInput[] = [];
    const add = (id: string, text: string, extra: Partial<FuzzInput> = {}) => out.push({ id: `pathological:${id}`, text, budgetMs: 60_000, ...extra });
    add('parens-10000', SMALL(`${'('.repeat(10_000)}a${')'.repeat(10_000)}`));
    add('parens-10000-unclosed', SMALL(`${'('.repeat(10_000)}a`));
    add('nots-10000', SMALL(`${'!'.repeat(10_000)}a`));
    add('mixed-10000', SMALL(`${'!('.repeat(5_000)}a${')'.repeat(5_000)}`));
    add('parens-10000-no-machine', '('.repeat(10_000));
    add('braces-10000', `machine B {${'{'.repeat(10_000)}${'}'.repeat(10_000)}}`);
    add('and-chain-20000', SMALL(Array.from({ length: 20_000 }, () => 'a').join(' & ')));
    add('identifier-1MB', `machine ${'m'.repeat(1 << 20)} { state S { otherwise stay; } }\n`);
    add('identifier-1MB-state', `machine M { state ${'s'.repeat(1 << 20)} { otherwise stay; } }\n`);
    const states = ['machine Many {', '    input a;', '    reset rst -> S0;'];
    for (let i = 0; i < 100_000; i++) states.push(`    state S${i} { when a -> S${(i + 1) % 100_000}; otherwise stay; }`);
    states.push('}');
    add('states-100000', `${states.join('\n')}\n`, { parseOnly: false, budgetMs: 120_000 });
    const bin = `0b${'1'.repeat(5_000)}`;
    add('binary-5000-digits-code', `machine N {\n    encoding explicit;\n    code S0 = ${bin};\n    state S0 { otherwise stay; }\n}\n`);
    add('binary-5000-digits-compare', `machine N {\n    input [4] v;\n    state S0 { when v == ${bin} -> S0; otherwise stay; }\n}\n`);
    add('decimal-5000-digits', `machine N {\n    input [${'9'.repeat(5_000)}] v;\n    output [4] y;\n    state S0 { emit y = ${'9'.repeat(5_000)}; when v >= 0x${'f'.repeat(5_000)} -> S0; otherwise stay; }\n    scenario s { step v = 3 * ${'9'.repeat(5_000)}; expect S0; }\n}\n`);
    add('bus-width-65536', 'machine W {\n    input [65536] v;\n    output [65536] y;\n    state S0 { when v[65535] -> S0; otherwise stay; }\n}\n');
    add('inputs-1000', `machine I {\n${Array.from({ length: 1000 }, (_, i) => `    input a${i};`).join('\n')}\n    state S0 { when ${Array.from({ length: 1000 }, (_, i) => `a${i}`).join(' ^ ')} -> S1; otherwise stay; }\n    state S1 { when a0 -> S0; otherwise stay; }\n}\n`);
    add('inputs-40-xor', `machine X {\n    input ${Array.from({ length: 40 }, (_, i) => `a${i}`).join(', ')};\n    state S0 { when ${Array.from({ length: 40 }, (_, i) => `a${i}`).join(' ^ ')} -> S1; otherwise stay; }\n    state S1 { when a0 -> S0; otherwise stay; }\n}\n`);
    add('buses-16x16', `machine Buses {\n${Array.from({ length: 16 }, (_, i) => `    input [16] b${i};`).join('\n')}\n    state S0 { when ${Array.from({ length: 16 }, (_, i) => `b${i} > ${i * 1000}`).join(' & ')} -> S1; otherwise stay; }\n    state S1 { when b0 == 3 -> S0; otherwise stay; }\n}\n`);
    add('states-300-onehot', `machine Ring {\n    input a;\n    reset rst -> S0;\n    encoding onehot;\n${Array.from({ length: 300 }, (_, i) => `    state S${i} { when a -> S${(i + 1) % 300}; otherwise stay; }`).join('\n')}\n}\n`);
    add('states-300-binary', `machine Ring {\n    input a;\n    reset rst -> S0;\n${Array.from({ length: 300 }, (_, i) => `    state S${i} { when a -> S${(i + 1) % 300}; otherwise stay; }`).join('\n')}\n}\n`);
    add('nul-bytes', `machine N\0 { state S0 {\0 otherwise stay; } }\0\0\n`);
    add('nul-only', '\0'.repeat(1000));
    add('lone-surrogates', `machine L { state S0 { otherwise stay; } } // \uD800 \uDC00\n\uD800machine\uDFFF`);
    add('crlf', 'machine C {\r\n    input a;\r\n    state S0 {\r\n        when a -> S1;\r\n        otherwise stay;\r\n    }\r\n    state S1 { when !a -> S0; otherwise stay; }\r\n    state S2 { otherwise stay; }\r\n}\r\n');
    add('cr-only', 'machine C {\r    input a;\r    state S0 {\r        when a & b -> S1;\r    }\r    state S1 { otherwise stay; }\r}\r');
    add('bom', '\uFEFFmachine B {\n    input a;\n    state S0 { when a -> S0; }\n}\n');
    add('bom-inside', 'machine B {\n    input \uFEFFa;\n    state S0 { when a -> S0; }\n}\n');
    add('unterminated-block-comment', `machine U { /* ${'x'.repeat(100_000)}`);
    add('unterminated-doc-comment', '/** never closed\nmachine U { state S0 { otherwise stay; } }\n');
    add('comment-1MB', `// ${'c'.repeat(1 << 20)}\nmachine K { state S0 { otherwise stay; } }\n`);
    add('empty', '');
    add('only-newlines', '\n'.repeat(100_000));
    add('long-line-of-semicolons', ';'.repeat(200_000));
    add('machines-300', Array.from({ length: 300 }, (_, i) => `machine M${i} { input a; state S0 { when a -> S0; } }`).join('\n'));
    add('transitions-250', `machine T {\n    input [12] v;\n    reset rst -> S0;\n    state S0 {\n${Array.from({ length: 250 }, (_, i) => `        when v == ${(i * 7) % 4096} -> S1;`).join('\n')}\n    }\n    state S1 { otherwise -> S0; }\n}\n`);
    add('transitions-5000', `machine T {\n    input [12] v;\n    state S0 {\n${Array.from({ length: 5000 }, (_, i) => `        when v == ${i % 4096} -> S1;`).join('\n')}\n    }\n    state S1 { otherwise -> S0; }\n}\n`);
    add('step-repeat-huge', 'machine R {\n    input a;\n    state S0 { when a -> S0; otherwise stay; }\n    scenario s { step a * 4294967296; step * 99999999999; expect S0; }\n}\n');
    add('scenario-steps-20000', `machine R {\n    input a;\n    state S0 { when a -> S0; otherwise stay; }\n    scenario s {\n${'        step a;\n'.repeat(20_000)}        expect S0;\n    }\n}\n`);
    return out;
}

// ---------------------------------------------------------------------------------------------
// The corpus.

export interface CorpusOptions {
    readonly seed: number;
    /** Mutated/truncated/random inputs to generate. */
    readonly count: number;
    readonly root: string;
}

export function seedTexts(root: string, seed: number): { name: string; text: string }[] {
    return [...exampleSeeds(root), ...generatedSeeds(seed ^ 0x5eed, 40)];
}

export function corpus(options: CorpusOptions): FuzzInput[] {
    const seeds = seedTexts(options.root, options.seed);
    const rng = mulberry32(options.seed);
    const out: FuzzInput[] = seeds.map((s) => ({ id: `seed:${s.name}`, text: s.text }));
    for (let k = 0; k < options.count; k++) {
        const base = pick(rng, seeds);
        const kind = pick(rng, MUTATIONS);
        let text = mutate(rng, base.text, kind);
        // a few rounds of stacked mutations, so inputs wander further from the seed
        const extra = rng() < 0.3 ? int(rng, 1, 4) : 0;
        for (let j = 0; j < extra; j++) text = mutate(rng, text, pick(rng, MUTATIONS.filter((m) => m !== 'random-tokens')));
        out.push({ id: `${kind}${extra ? `+${extra}` : ''}:${base.name}:#${k}`, text });
    }
    return out;
}

// ---------------------------------------------------------------------------------------------
// Invariants.

/** Line lengths the way LSP counts them (\n, \r\n and \r end a line; UTF-16 code units). */
export function lineLengths(text: string): number[] {
    const lengths: number[] = [];
    let start = 0;
    for (let i = 0; i < text.length; i++) {
        const c = text.charCodeAt(i);
        if (c === 10 || c === 13) {
            lengths.push(i - start);
            if (c === 13 && text.charCodeAt(i + 1) === 10) i++;
            start = i + 1;
        }
    }
    lengths.push(text.length - start);
    return lengths;
}

/** Why the range does not lie inside the document, or undefined when it does. */
export function rangeProblem(range: SourceRange | undefined, lengths: readonly number[]): string | undefined {
    if (!range || !range.start || !range.end) return 'missing range';
    for (const [name, p] of [['start', range.start], ['end', range.end]] as const) {
        if (!Number.isInteger(p.line) || !Number.isInteger(p.character) || p.line < 0 || p.character < 0) return `${name} ${JSON.stringify(p)} is not a position`;
        if (p.line >= lengths.length) return `${name} line ${p.line} ≥ line count ${lengths.length}`;
        if (p.character > lengths[p.line]!) return `${name} character ${p.character} > length ${lengths[p.line]} of line ${p.line}`;
    }
    if (range.start.line > range.end.line || (range.start.line === range.end.line && range.start.character > range.end.character)) return `start ${JSON.stringify(range.start)} after end ${JSON.stringify(range.end)}`;
    return undefined;
}
