/**
 * Independent oracles for the synthesis and as-built tests. Nothing here calls the code under
 * test: covers are evaluated straight from the positional-cube bit layout (2 bits per variable,
 * 16 variables per 32-bit word: 01 = 0, 10 = 1, 11 = free), the model is interpreted with
 * `evalGuard` and the cycle semantics of LANGUAGE.md, and the flip-flops with their textbook
 * characteristic equations (from memory: D Q+=D, T Q+=Q⊕T, JK Q+=JQ'+K'Q, SR Q+=S+R'Q).
 */
import type { Emit, FlipFlopKind, Machine } from '../../src/model/machine.js';
import type { SynthesisResult } from '../../src/synthesis/types.js';
import { evalGuard } from '../support/random-machine.js';

/** Value of a sum of products at a full assignment (bits[v] = variable v). */
export function evalCover(cover: readonly Uint32Array[], bits: readonly number[]): boolean {
    outer: for (const cube of cover) {
        for (let v = 0; v < bits.length; v++) {
            const field = (cube[v >>> 4]! >>> ((v & 15) * 2)) & 3;
            if (field === 3) continue;
            if (field === 0) continue outer;
            if ((field === 2) !== (bits[v] === 1)) continue outer;
        }
        return true;
    }
    return false;
}

/** Input variable bits in LANGUAGE.md order (inputs as declared, bus bits LSB first). */
export function inputBits(machine: Machine, values: readonly number[]): number[] {
    const bits: number[] = [];
    machine.inputs.forEach((input, i) => {
        for (let b = 0; b < input.width; b++) bits.push(Math.floor(values[i]! / 2 ** b) % 2);
    });
    return bits;
}

/** Code string (MSB first) → bits q0…q{w-1}. */
export function bitsOfCode(code: string): number[] {
    return [...code].reverse().map((c) => (c === '1' ? 1 : 0));
}

export function characteristicOracle(kind: FlipFlopKind, q: number, a: number, b: number): number {
    switch (kind) {
        case 'D': return a;
        case 'T': return q ^ a;
        case 'JK': return (a & (1 - q)) | ((1 - b) & q);
        case 'SR': return a | ((1 - b) & q);
    }
}

/** The excitation inputs of each flip-flop type, in the order characteristicOracle takes them. */
const PORTS: Record<FlipFlopKind, readonly string[]> = { D: ['d'], T: ['t'], JK: ['j', 'k'], SR: ['s', 'r'] };

/**
 * The as-built next code of every code (used or not) under an input vector: each state bit from
 * the synthesized excitation covers, evaluated on their cube bits, through the characteristic
 * equation. Inputs `x` and codes are integers, bit v = variable v (code bit i = q{i}).
 */
export function asBuiltNextCode(r: SynthesisResult): (code: number, x: number) => number {
    const w = r.assignment.width;
    const nI = r.inputCount;
    const byName = new Map(r.equations.map((e) => [e.name, e.cover]));
    return (code, x) => {
        const bits = [...Array.from({ length: nI }, (_, v) => (x >> v) & 1), ...Array.from({ length: w }, (_, i) => (code >> i) & 1)];
        let out = 0;
        for (let i = 0; i < w; i++) {
            const [a, b] = PORTS[r.flipflop].map((p) => (evalCover(byName.get(`${p}${i}`)!, bits) ? 1 : 0));
            if (characteristicOracle(r.flipflop, (code >> i) & 1, a!, b ?? 0)) out |= 1 << i;
        }
        return out;
    };
}

export interface ModelStep {
    /** Next state index, or undefined for `otherwise dontcare`. */
    readonly next: number | undefined;
    /** Value of each output (by output index), or undefined where it is a don't-care. */
    readonly outputs: readonly (number | undefined)[];
}

function emitted(emits: readonly Emit[], output: number): number | undefined {
    return emits.find((e) => e.output === output)?.value;
}

/** One clock of the model, straight from LANGUAGE.md: first true guard in source order, then otherwise. */
export function modelStep(machine: Machine, state: number, values: readonly number[]): ModelStep {
    const s = machine.states[state]!;
    const mealyOutputs = new Set<number>();
    for (const st of machine.states) {
        for (const t of st.transitions) for (const e of t.emits) mealyOutputs.add(e.output);
        if (st.otherwise?.kind === 'goto') for (const e of st.otherwise.emits) mealyOutputs.add(e.output);
    }
    let next: number | undefined;
    let mealy: readonly Emit[] = [];
    let dontcare = false;
    const taken = s.transitions.find((t) => evalGuard(t.guard, values));
    if (taken) { next = taken.target; mealy = taken.emits; }
    else if (s.otherwise?.kind === 'goto') { next = s.otherwise.target; mealy = s.otherwise.emits; }
    else if (s.otherwise?.kind === 'dontcare') dontcare = true;
    else next = state;
    const outputs = machine.outputs.map((o, k) => {
        if (o.registered) return next === undefined ? undefined : emitted(machine.states[next]!.emits, k) ?? 0;
        if (dontcare && mealyOutputs.has(k)) return undefined;
        return emitted(mealy, k) ?? emitted(s.emits, k) ?? 0;
    });
    return { next, outputs };
}
