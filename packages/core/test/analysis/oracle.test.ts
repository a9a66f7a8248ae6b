/**
 * Property test: every design analysis against a brute-force oracle written here.
 *
 * The oracle enumerates every input valuation (allInputValuations) and evaluates guards with the
 * independent evaluator evalGuard; it never calls the analysis code nor core's cube/cover
 * functions. Definitions follow LANGUAGE.md ("States and transitions", "Diagnostics") and the
 * Analysis section of docs/decisions.md. Reachability is plain BFS (common practice); state
 * equivalence is the textbook iterative refinement of a Mealy machine's states by output and
 * next-state class over explicit inputs (Moore's partition refinement, from memory).
 * Seeds are fixed (fast-check `seed:`), machines stay at ≤ 8 input bits.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { Emit, Guard, Machine, SourceRange, State } from '../../src/model/machine.js';
import type { Finding } from '../../src/model/finding.js';
import { analyzeMachine } from '../../src/analysis/index.js';
import { allInputValuations, evalGuard, mulberry32, randomMachine, type RandomMachineOptions, type Rng } from '../support/random-machine.js';

const rangeKey = (r: SourceRange) => `${r.start.line}:${r.start.character}-${r.end.line}:${r.end.character}`;

/** Observable outputs (unassigned 0, Mealy overriding Moore) as text. */
function outputs(m: Machine, moore: readonly Emit[], mealy: readonly Emit[]): string {
    const v = m.outputs.map(() => 0);
    for (const e of moore) v[e.output] = e.value;
    for (const e of mealy) v[e.output] = e.value;
    return v.join(',');
}

/** The reset state, computed from LANGUAGE.md's encoding definitions (not from synthesis code). */
function oracleStart(m: Machine): number {
    const r = m.reset;
    if (!r) return 0;
    if (typeof r.target === 'number') return r.target;
    const n = m.states.length;
    let zero: number | undefined;
    switch (m.encoding) {
        // binary/gray/johnson give state 0 the all-zeros code; onehot never has it; onecold only for one state.
        case 'binary': case 'gray': case 'johnson': zero = 0; break;
        case 'onehot': zero = undefined; break;
        case 'onecold': zero = n === 1 ? 0 : undefined; break;
        case 'explicit': {
            const i = m.states.findIndex((s) => s.code !== undefined && /^0+$/.test(s.code.bits));
            zero = i < 0 ? undefined : i; break;
        }
        case 'auto': return 0;
    }
    if (zero !== undefined) return zero;
    return m.recover ? m.recover.target : 0;
}

function readsInputs(g: Guard, into: Set<number>): void {
    if (g.kind === 'input' || g.kind === 'bit' || g.kind === 'compare') into.add(g.input);
    else if (g.kind === 'not') readsInputs(g.operand, into);
    else if (g.kind !== 'const') g.operands.forEach((o) => readsInputs(o, into));
}

interface OracleModel {
    readonly vals: number[][];
    readonly next: number[][];
    readonly start: number;
    readonly keys: Set<string>;
}

function oracle(m: Machine): OracleModel {
    const vals = [...allInputValuations(m)];
    const keys = new Set<string>();
    const n = m.states.length;
    const next: number[][] = [];
    const out: string[][] = [];
    const dontcare: boolean[] = [];
    m.states.forEach((s, si) => {
        const truth = s.transitions.map((t) => vals.map((v) => evalGuard(t.guard, v)));
        const eff = s.transitions.map((t) => `${t.target}/${outputs(m, s.emits, t.emits)}`);
        truth.forEach((row, i) => { if (!row.some(Boolean)) keys.add(`never|${s.name}|t${i}`); });
        if (!s.priority) {
            for (let j = 0; j < truth.length; j++) for (let i = 0; i < j; i++) {
                if (eff[i] !== eff[j] && vals.some((_, k) => truth[i]![k] && truth[j]![k])) keys.add(`overlap|${s.name}|t${i}-t${j}`);
            }
        } else {
            truth.forEach((row, i) => {
                if (!row.some(Boolean)) return;
                if (vals.every((_, k) => !row[k] || truth.slice(0, i).some((r) => r[k]))) keys.add(`shadowed|${s.name}|t${i}`);
            });
        }
        const uncovered = vals.some((_, k) => truth.every((r) => !r[k]));
        if (!s.otherwise && uncovered) keys.add(`incomplete|${s.name}`);
        dontcare.push(s.otherwise?.kind === 'dontcare' && uncovered);
        const nx: number[] = [];
        const ox: string[] = [];
        vals.forEach((_, k) => {
            const i = truth.findIndex((r) => r[k]);
            if (i >= 0) { nx.push(s.transitions[i]!.target); ox.push(outputs(m, s.emits, s.transitions[i]!.emits)); }
            else if (s.otherwise?.kind === 'goto') { nx.push(s.otherwise.target); ox.push(outputs(m, s.emits, s.otherwise.emits)); }
            else { nx.push(si); ox.push(outputs(m, s.emits, [])); }
        });
        next.push(nx);
        out.push(ox);
    });
    // Reachability: BFS forward from the start, and backward to it.
    const start = oracleStart(m);
    const reach = new Array<boolean>(n).fill(false);
    reach[start] = true;
    for (const queue = [start]; queue.length > 0;) {
        const u = queue.shift()!;
        for (const v of next[u]!) if (!reach[v]) { reach[v] = true; queue.push(v); }
    }
    const back = new Array<boolean>(n).fill(false);
    back[start] = true;
    for (let changed = true; changed;) {
        changed = false;
        for (let u = 0; u < n; u++) if (!back[u] && next[u]!.some((v) => back[v])) { back[u] = true; changed = true; }
    }
    m.states.forEach((s, i) => {
        if (!reach[i]) keys.add(`unreachable|${s.name}`);
        else if (!back[i]) keys.add(`no-return|${s.name}`);
    });
    // Equivalence: naive refinement; states with a don't-care region stay alone.
    let cls: string[] = m.states.map((_, i) => (dontcare[i] ? `d${i}` : 'c'));
    let count = new Set(cls).size;
    for (;;) {
        const sig = m.states.map((_, i) => `${cls[i]}|${vals.map((__, k) => `${out[i]![k]}>${cls[next[i]![k]!]}`).join(';')}`);
        const ids = new Map<string, string>();
        for (const x of sig) if (!ids.has(x)) ids.set(x, `k${ids.size}`);
        const size = ids.size;
        cls = sig.map((x) => ids.get(x)!);
        if (size === count) break;
        count = size;
    }
    const firstOf = new Map<string, string>();
    m.states.forEach((s, i) => {
        const f = firstOf.get(cls[i]!);
        if (f === undefined) firstOf.set(cls[i]!, s.name); else keys.add(`equivalent|${s.name}|${f}`);
    });
    if (!m.reset) keys.add('no-reset|');
    const read = new Set<number>();
    m.states.forEach((s) => s.transitions.forEach((t) => readsInputs(t.guard, read)));
    m.inputs.forEach((inp, i) => { if (!read.has(i)) keys.add(`unused-input|${inp.name}`); });
    const assigned = new Set<number>();
    m.states.forEach((s) => {
        s.emits.forEach((e) => assigned.add(e.output));
        s.transitions.forEach((t) => t.emits.forEach((e) => assigned.add(e.output)));
        if (s.otherwise?.kind === 'goto') s.otherwise.emits.forEach((e) => assigned.add(e.output));
    });
    m.outputs.forEach((o, i) => { if (!assigned.has(i)) keys.add(`unused-output|${o.name}`); });
    return { vals, next, start, keys };
}

/** Which transition a guard range belongs to. */
function guardIndex(m: Machine): Map<string, { state: State; index: number }> {
    const map = new Map<string, { state: State; index: number }>();
    for (const s of m.states) s.transitions.forEach((t, index) => map.set(rangeKey(t.guard.range), { state: s, index }));
    return map;
}

function findingKey(m: Machine, f: Finding, guards: Map<string, { state: State; index: number }>): string {
    switch (f.code) {
        case 'never': case 'shadowed': return `${f.code}|${f.state}|t${guards.get(rangeKey(f.range))?.index}`;
        case 'overlap': return `overlap|${f.state}|t${guards.get(rangeKey(f.related![0]!.range))?.index}-t${guards.get(rangeKey(f.range))?.index}`;
        case 'equivalent': {
            const partner = m.states.find((s) => rangeKey(s.nameRange) === rangeKey(f.related![0]!.range));
            return `equivalent|${f.state}|${partner?.name}`;
        }
        case 'unused-input': case 'unused-output': return `${f.code}|${f.signal}`;
        case 'no-reset': return 'no-reset|';
        default: return `${f.code}|${f.state}`;
    }
}

/** Witness input record → values by input index; every input present, values in range. */
function witnessValues(m: Machine, f: Finding): number[] {
    const inputs = f.witness?.inputs;
    expect(inputs, `${f.code} needs an input witness`).toBeDefined();
    return m.inputs.map((inp) => {
        const v = inputs![inp.name];
        expect(Number.isInteger(v) && v! >= 0 && v! < 2 ** inp.width, `${inp.name}=${v}`).toBe(true);
        return v!;
    });
}

function checkWitness(m: Machine, f: Finding, o: OracleModel, guards: Map<string, { state: State; index: number }>): void {
    const state = m.states.find((s) => s.name === f.state);
    switch (f.code) {
        case 'overlap': {
            const v = witnessValues(m, f);
            const a = guards.get(rangeKey(f.related![0]!.range))!;
            const b = guards.get(rangeKey(f.range))!;
            expect(evalGuard(a.state.transitions[a.index]!.guard, v) && evalGuard(b.state.transitions[b.index]!.guard, v)).toBe(true);
            break;
        }
        case 'incomplete': {
            const v = witnessValues(m, f);
            expect(state!.transitions.some((t) => evalGuard(t.guard, v))).toBe(false);
            break;
        }
        case 'shadowed': {
            const v = witnessValues(m, f);
            const { index } = guards.get(rangeKey(f.range))!;
            expect(evalGuard(state!.transitions[index]!.guard, v)).toBe(true);
            expect(state!.transitions.slice(0, index).some((t) => evalGuard(t.guard, v))).toBe(true);
            break;
        }
        case 'no-return': {
            const path = f.witness?.path ?? [];
            const idx = path.map((name) => m.states.findIndex((s) => s.name === name));
            expect(idx[0]).toBe(o.start);
            expect(path[path.length - 1]).toBe(f.state);
            for (let k = 1; k < idx.length; k++) expect(o.next[idx[k - 1]!]!.includes(idx[k]!)).toBe(true);
            break;
        }
        default: break;
    }
}

/** Appends copies of some states (same behaviour, new names) and points some transitions at them, so classes of equivalent states appear. */
function withDuplicates(rng: Rng, m: Machine): Machine {
    if (m.states.length === 0) return m;
    const states: State[] = [...m.states];
    let line = 100_000 + Math.floor(rng() * 1000) * 100;
    const range = (): SourceRange => { const l = line++; return { start: { line: l, character: 0 }, end: { line: l, character: 5 } }; };
    const copies = 1 + Math.floor(rng() * 2);
    for (let c = 0; c < copies; c++) {
        const src = m.states[Math.floor(rng() * m.states.length)]!;
        const index = states.length;
        states.push({
            ...src, name: `${src.name}_copy${c}`, index, range: range(), nameRange: range(),
            transitions: src.transitions.map((t) => ({ ...t, guard: { ...t.guard, range: range() } as Guard, range: range() })),
            // A `stay` otherwise of the copy holds the copy, which an equivalent state also does.
        });
        // Redirect one transition somewhere to the copy, so it is reachable.
        const from = states[Math.floor(rng() * states.length)]!;
        if (from.transitions.length > 0 && rng() < 0.7) {
            const k = Math.floor(rng() * from.transitions.length);
            const ts = from.transitions.map((t, i) => (i === k && t.target === src.index ? { ...t, target: index } : t));
            states[from.index] = { ...from, transitions: ts };
        }
    }
    // Explicit codes must stay complete and distinct for the start-state rule; drop to binary otherwise.
    const encoding = m.encoding === 'explicit' ? 'binary' : m.encoding;
    return { ...m, states: states.map((s) => (encoding === m.encoding ? s : { ...s, code: undefined })), encoding };
}

const families: { name: string; runs: number; options: RandomMachineOptions; duplicate?: boolean }[] = [
    { name: 'default generator (disjoint plain guards)', runs: 120, options: {} },
    { name: 'overlapping plain guards, priority states, buses up to 8 bits', runs: 160, options: { disjointPlainGuards: false, priorityRate: 0.5, maxBitInputs: 4, maxBuses: 1, maxBusWidth: 4, maxStates: 7 } },
    { name: 'few inputs and outputs, many states (equivalence)', runs: 120, options: { minStates: 3, maxStates: 10, maxBitInputs: 2, maxBuses: 0, maxOutputs: 1, disjointPlainGuards: false }, duplicate: true },
    { name: 'seven or eight input bits (sampled fingerprints), duplicated states', runs: 120, options: { minBitInputs: 4, maxBitInputs: 5, minBuses: 1, maxBuses: 1, minBusWidth: 3, maxBusWidth: 3, maxStates: 6, disjointPlainGuards: false, maxOutputs: 2 }, duplicate: true },
    { name: 'no inputs at all, constant guards', runs: 40, options: { maxBitInputs: 0, maxBuses: 0, maxStates: 5 } },
    // Beyond the 8-bit budget, a few machines with a 16-bit bus (2^16..2^17 valuations each) check that wide buses are exact too.
    { name: 'a 16-bit bus (few machines)', runs: 8, options: { maxBitInputs: 1, minBuses: 1, maxBuses: 1, minBusWidth: 16, maxBusWidth: 16, maxStates: 3, disjointPlainGuards: false, maxOutputs: 1 } },
    { name: 'reset clear under every encoding, often with recover (start-state rules)', runs: 100, options: { resets: ['clear'], encodings: ['auto', 'binary', 'gray', 'johnson', 'onehot', 'onecold', 'explicit'], recoverRate: 0.5, minStates: 1, maxStates: 6, maxOutputs: 2 } },
];

describe('design analyses against a brute-force oracle (seeded)', () => {
    families.forEach((fam, fi) => {
        it(`${fam.name}: findings equal the oracle's, witnesses hold`, () => {
            const seen = new Map<string, number>();
            fc.assert(fc.property(fc.integer({ min: 0, max: 2 ** 31 - 1 }), (seed) => {
                const rng = mulberry32(seed);
                let m = randomMachine(rng, fam.options, `M${seed}`);
                if (fam.duplicate) m = withDuplicates(rng, m);
                const expected = oracle(m);
                const guards = guardIndex(m);
                const findings = analyzeMachine(m);
                const got = new Set(findings.map((f) => findingKey(m, f, guards)));
                expect(findings.length, 'no duplicate findings').toBe(got.size);
                expect([...got].sort()).toEqual([...expected.keys].sort());
                for (const f of findings) checkWitness(m, f, expected, guards);
                for (const k of got) { const c = k.split('|')[0]!; seen.set(c, (seen.get(c) ?? 0) + 1); }
            }), { seed: 4242 + fi, numRuns: fam.runs });
            // The family must actually exercise the analyses it is meant for (a test that cannot fail is no test).
            if (fam.options.disjointPlainGuards === false && fam.options.maxBitInputs !== 0) expect(seen.get('overlap') ?? 0).toBeGreaterThan(0);
            if (fam.duplicate) expect(seen.get('equivalent') ?? 0).toBeGreaterThan(0);
            if (fi === 1) for (const code of ['shadowed', 'never', 'incomplete', 'unreachable', 'no-return']) expect(seen.get(code) ?? 0, code).toBeGreaterThan(0);
        });
    });
});
