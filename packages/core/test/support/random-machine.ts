/**
 * Seeded random machines for property tests, built directly as core models (no parser).
 * Shared by the analysis, synthesis and export test suites: change it additively.
 */
import type {
    CompareOp, EncodingKind, Emit, FlipFlopKind, Guard, Input, Machine, Otherwise, Output, Reset, SourceRange, State, Transition,
} from '../../src/model/machine.js';

export type Rng = () => number;

/** mulberry32: a small, well-distributed 32-bit PRNG (public domain, Tommy Ettinger). */
export function mulberry32(seed: number): Rng {
    let a = seed >>> 0;
    return () => {
        a = (a + 0x6d2b79f5) >>> 0;
        let t = a;
        t = Math.imul(t ^ (t >>> 15), t | 1);
        t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
        return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
    };
}

export const int = (rng: Rng, lo: number, hi: number): number => lo + Math.floor(rng() * (hi - lo + 1));
export const pick = <T>(rng: Rng, items: readonly T[]): T => items[Math.floor(rng() * items.length)]!;
const chance = (rng: Rng, p: number): boolean => rng() < p;

export interface RandomMachineOptions {
    readonly minStates?: number;
    readonly maxStates?: number;
    /** Number of 1-bit inputs (range). */
    readonly maxBitInputs?: number;
    /** Lower end of the number of 1-bit inputs. Default 0. */
    readonly minBitInputs?: number;
    /** Lower end of the number of buses. Default 0. */
    readonly minBuses?: number;
    /** Lower end of each bus width. Default 2. */
    readonly minBusWidth?: number;
    /** Number of transitions per state (range). Default 0..3. */
    readonly minTransitions?: number;
    readonly maxTransitions?: number;
    /** Number of bus inputs (range 0..maxBuses), each 2..maxBusWidth bits. */
    readonly maxBuses?: number;
    readonly maxBusWidth?: number;
    readonly maxOutputs?: number;
    /** Plain (non-priority) states get pairwise-disjoint guards, so no `overlap` error arises. Default true. */
    readonly disjointPlainGuards?: boolean;
    /** Probability that a state is `priority`. Default 0.3. */
    readonly priorityRate?: number;
    /** Allow Mealy outputs. Default true. */
    readonly mealy?: boolean;
    /** Allow `otherwise dontcare`. Default true. */
    readonly dontcare?: boolean;
    /** Encodings to draw from. Default: all fixed ones and explicit. */
    readonly encodings?: readonly EncodingKind[];
    readonly flipflops?: readonly FlipFlopKind[];
    /** Probability of `recover -> S`. Default 0.2. */
    readonly recoverRate?: number;
    /** Reset kinds to draw from. Default all. */
    readonly resets?: readonly ('none' | 'target' | 'clear')[];
}

let lineCounter = 0;
/** Distinct synthetic ranges (one line each), so tests can tell elements apart by range. */
function nextRange(): SourceRange {
    const line = lineCounter++;
    return { start: { line, character: 0 }, end: { line, character: 10 } };
}

const OPS: readonly CompareOp[] = ['==', '!=', '<', '<=', '>', '>='];

function randomLeaf(rng: Rng, inputs: readonly Input[]): Guard {
    const idx = int(rng, 0, inputs.length - 1);
    const input = inputs[idx]!;
    if (!input.isBus) return { kind: 'input', input: idx, range: nextRange() };
    if (chance(rng, 0.4)) return { kind: 'bit', input: idx, bit: int(rng, 0, input.width - 1), range: nextRange() };
    return { kind: 'compare', input: idx, op: pick(rng, OPS), value: int(rng, 0, 2 ** input.width - 1), range: nextRange() };
}

export function randomGuard(rng: Rng, inputs: readonly Input[], depth = 3): Guard {
    if (inputs.length === 0) return { kind: 'const', value: chance(rng, 0.8), range: nextRange() };
    if (depth <= 0 || chance(rng, 0.35)) {
        if (chance(rng, 0.03)) return { kind: 'const', value: chance(rng, 0.5), range: nextRange() };
        return randomLeaf(rng, inputs);
    }
    const r = rng();
    if (r < 0.2) return { kind: 'not', operand: randomGuard(rng, inputs, depth - 1), range: nextRange() };
    const kind = r < 0.55 ? 'and' : r < 0.85 ? 'or' : 'xor';
    const n = int(rng, 2, 3);
    return { kind, operands: Array.from({ length: n }, () => randomGuard(rng, inputs, depth - 1)), range: nextRange() };
}

/**
 * Pairwise-disjoint guards: the cells of a partition of the input space on one or two 1-bit
 * variables or bus bits, or on value ranges of one bus; some cells may be merged by `|`.
 * Returns the guards of the cells chosen for transitions and whether cells remain uncovered.
 */
function disjointGuards(rng: Rng, inputs: readonly Input[], count: number): { guards: Guard[]; uncovered: boolean } {
    if (inputs.length === 0 || count === 0) return { guards: [], uncovered: true };
    const cells: Guard[] = [];
    const busIdx = inputs.findIndex((i) => i.isBus);
    if (busIdx >= 0 && chance(rng, 0.4)) {
        const width = inputs[busIdx]!.width;
        const max = 2 ** width;
        const cuts = [...new Set(Array.from({ length: int(rng, 1, 3) }, () => int(rng, 1, max - 1)))].sort((a, b) => a - b);
        let lo = 0;
        for (const cut of [...cuts, max]) {
            const parts: Guard[] = [];
            if (lo > 0) parts.push({ kind: 'compare', input: busIdx, op: '>=', value: lo, range: nextRange() });
            if (cut < max) parts.push({ kind: 'compare', input: busIdx, op: '<', value: cut, range: nextRange() });
            cells.push(parts.length === 1 ? parts[0]! : { kind: 'and', operands: parts, range: nextRange() });
            lo = cut;
        }
    } else {
        const literals: { make: (v: boolean) => Guard }[] = [];
        const pickVar = () => {
            const idx = int(rng, 0, inputs.length - 1);
            const input = inputs[idx]!;
            const bit = input.isBus ? int(rng, 0, input.width - 1) : 0;
            return { idx, bit, bus: input.isBus, key: `${idx}:${bit}` };
        };
        const seen = new Set<string>();
        const nvars = Math.min(2, inputs.reduce((a, i) => a + i.width, 0));
        while (literals.length < nvars) {
            const v = pickVar();
            if (seen.has(v.key)) continue;
            seen.add(v.key);
            literals.push({
                make: (positive) => {
                    const leaf: Guard = v.bus ? { kind: 'bit', input: v.idx, bit: v.bit, range: nextRange() } : { kind: 'input', input: v.idx, range: nextRange() };
                    return positive ? leaf : { kind: 'not', operand: leaf, range: nextRange() };
                },
            });
        }
        for (let m = 0; m < 1 << literals.length; m++) {
            const parts = literals.map((l, k) => l.make(((m >> k) & 1) === 1));
            cells.push(parts.length === 1 ? parts[0]! : { kind: 'and', operands: parts, range: nextRange() });
        }
    }
    // Shuffle cells, then take up to `count` groups (a group of two cells becomes an `|`).
    for (let i = cells.length - 1; i > 0; i--) {
        const j = int(rng, 0, i);
        [cells[i], cells[j]] = [cells[j]!, cells[i]!];
    }
    const guards: Guard[] = [];
    let used = 0;
    while (guards.length < count && used < cells.length) {
        if (used + 1 < cells.length && chance(rng, 0.25)) {
            guards.push({ kind: 'or', operands: [cells[used]!, cells[used + 1]!], range: nextRange() });
            used += 2;
        } else {
            guards.push(cells[used]!);
            used += 1;
        }
    }
    return { guards, uncovered: used < cells.length };
}

function randomEmits(rng: Rng, outputs: readonly Output[], allowRegistered: boolean, avoid: ReadonlySet<number> = new Set()): Emit[] {
    const emits: Emit[] = [];
    outputs.forEach((o, idx) => {
        if (avoid.has(idx) || (o.registered && !allowRegistered)) return;
        if (chance(rng, 0.4)) emits.push({ output: idx, value: o.isBus ? int(rng, 0, 2 ** o.width - 1) : 1, range: nextRange() });
    });
    return emits;
}

export function randomMachine(rng: Rng, options: RandomMachineOptions = {}, name = 'Random'): Machine {
    const nStates = int(rng, options.minStates ?? 1, options.maxStates ?? 6);
    const inputs: Input[] = [];
    const nBits = int(rng, options.minBitInputs ?? 0, options.maxBitInputs ?? 3);
    for (let i = 0; i < nBits; i++) inputs.push({ name: `in${i}`, width: 1, isBus: false, async: chance(rng, 0.1), range: nextRange(), nameRange: nextRange() });
    const nBuses = int(rng, options.minBuses ?? 0, options.maxBuses ?? 1);
    for (let i = 0; i < nBuses; i++) inputs.push({ name: `bus${i}`, width: int(rng, options.minBusWidth ?? 2, options.maxBusWidth ?? 3), isBus: true, async: false, range: nextRange(), nameRange: nextRange() });
    const outputs: Output[] = [];
    const nOut = int(rng, 0, options.maxOutputs ?? 3);
    for (let i = 0; i < nOut; i++) {
        const bus = chance(rng, 0.25);
        outputs.push({ name: `out${i}`, width: bus ? 2 : 1, isBus: bus, registered: chance(rng, 0.2), range: nextRange(), nameRange: nextRange() });
    }
    const mealy = options.mealy ?? true;
    const states: State[] = [];
    for (let s = 0; s < nStates; s++) {
        const priority = chance(rng, options.priorityRate ?? 0.3);
        const moore = randomEmits(rng, outputs, true);
        const mooreSet = new Set(moore.map((e) => e.output));
        const nTrans = int(rng, options.minTransitions ?? 0, options.maxTransitions ?? 3);
        let guards: Guard[];
        let uncovered = true;
        if (priority || options.disjointPlainGuards === false) {
            guards = Array.from({ length: nTrans }, () => randomGuard(rng, inputs));
        } else {
            const d = disjointGuards(rng, inputs, nTrans);
            guards = d.guards;
            uncovered = d.uncovered;
        }
        const transitions: Transition[] = guards.map((guard) => ({
            guard,
            target: int(rng, 0, nStates - 1),
            emits: mealy ? randomEmits(rng, outputs, false, mooreSet) : [],
            range: nextRange(),
            targetRange: nextRange(),
        }));
        let otherwise: Otherwise | undefined;
        const r = rng();
        if (r < 0.3 && uncovered) otherwise = { kind: 'stay', range: nextRange() };
        else if (r < 0.6) otherwise = { kind: 'goto', target: int(rng, 0, nStates - 1), emits: mealy ? randomEmits(rng, outputs, false, mooreSet) : [], range: nextRange(), targetRange: nextRange() };
        else if (r < 0.7 && (options.dontcare ?? true)) otherwise = { kind: 'dontcare', range: nextRange() };
        states.push({ name: `S${s}`, index: s, priority, emits: moore, transitions, otherwise, range: nextRange(), nameRange: nextRange() });
    }
    const encodings = options.encodings ?? ['binary', 'gray', 'onehot', 'onecold', 'johnson', 'explicit'];
    const encoding = pick(rng, encodings);
    if (encoding === 'explicit') {
        const width = Math.max(1, Math.ceil(Math.log2(Math.max(nStates, 1)))) + int(rng, 0, 1);
        const pool = Array.from({ length: 2 ** width }, (_, i) => i);
        for (let i = pool.length - 1; i > 0; i--) { const j = int(rng, 0, i); [pool[i], pool[j]] = [pool[j]!, pool[i]!]; }
        states.forEach((s, i) => {
            (s as { code?: State['code'] }).code = { bits: pool[i]!.toString(2).padStart(width, '0'), range: nextRange() };
        });
    }
    const resetKind = pick(rng, options.resets ?? ['none', 'target', 'target', 'clear']);
    let reset: Reset | undefined;
    if (resetKind !== 'none') {
        reset = {
            name: chance(rng, 0.5) ? 'rst' : 'rst_n',
            activeHigh: chance(rng, 0.5),
            async: chance(rng, 0.5),
            target: resetKind === 'clear' ? 'clear' : int(rng, 0, nStates - 1),
            range: nextRange(),
            nameRange: nextRange(),
        };
    }
    const recover = chance(rng, options.recoverRate ?? 0.2) ? { target: int(rng, 0, nStates - 1), range: nextRange() } : undefined;
    return {
        name,
        clock: { name: 'clk', edge: chance(rng, 0.85) ? 'rising' : 'falling', range: nextRange() },
        reset,
        inputs,
        outputs,
        states,
        encoding,
        encodingRange: nextRange(),
        flipflop: pick(rng, options.flipflops ?? ['D', 'T', 'JK', 'SR']),
        flipflopRange: nextRange(),
        recover,
        scenarios: [],
        range: nextRange(),
        nameRange: nextRange(),
    };
}

/** Independent guard evaluator for oracles: value of the guard for a concrete input valuation (by input index). */
export function evalGuard(guard: Guard, values: readonly number[]): boolean {
    switch (guard.kind) {
        case 'const': return guard.value;
        case 'input': return values[guard.input] === 1;
        case 'bit': return ((values[guard.input]! >> guard.bit) & 1) === 1;
        case 'compare': return compare(values[guard.input]!, guard.op, guard.value);
        case 'not': return !evalGuard(guard.operand, values);
        case 'and': return guard.operands.every((g) => evalGuard(g, values));
        case 'or': return guard.operands.some((g) => evalGuard(g, values));
        case 'xor': return guard.operands.reduce((acc, g) => acc !== evalGuard(g, values), false);
    }
}

function compare(v: number, op: CompareOp, value: number): boolean {
    switch (op) {
        case '==': return v === value;
        case '!=': return v !== value;
        case '<': return v < value;
        case '<=': return v <= value;
        case '>': return v > value;
        case '>=': return v >= value;
    }
}

/** Every input valuation (by input index), for brute-force oracles. */
export function* allInputValuations(machine: Machine): Generator<number[]> {
    const widths = machine.inputs.map((i) => i.width);
    const total = widths.reduce((a, b) => a + b, 0);
    for (let m = 0; m < 2 ** total; m++) {
        const values: number[] = [];
        let rest = m;
        for (const w of widths) {
            values.push(rest % 2 ** w);
            rest = Math.floor(rest / 2 ** w);
        }
        yield values;
    }
}
