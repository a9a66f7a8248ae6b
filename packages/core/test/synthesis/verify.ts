/** Exhaustive-simulation check of a synthesis result against the model (oracles in oracle.ts). */
import { expect } from 'vitest';
import type { FlipFlopKind, Machine } from '../../src/model/machine.js';
import type { SynthesisResult } from '../../src/synthesis/types.js';
import { allInputValuations } from '../support/random-machine.js';
import { bitsOfCode, characteristicOracle, evalCover, inputBits, modelStep } from './oracle.js';

/** expect() only on a mismatch: the loops run millions of comparisons. */
function same(actual: unknown, wanted: unknown, message: string): void {
    if (actual !== wanted) expect(actual, message).toBe(wanted);
}

const PORTS: Record<FlipFlopKind, readonly [string, string?]> = { D: ['d'], T: ['t'], JK: ['j', 'k'], SR: ['s', 'r'] };

/** Evaluates every equation by name at (code, inputs). */
function equationValues(r: SynthesisResult, codeBits: readonly number[], inBits: readonly number[]): Map<string, number> {
    const bits = [...inBits, ...codeBits];
    const values = new Map<string, number>();
    for (const e of r.equations) values.set(e.name, evalCover(e.cover, bits) ? 1 : 0);
    return values;
}

/** The as-built next code: characteristic equation applied to the synthesized excitation. */
function builtNext(r: SynthesisResult, codeBits: readonly number[], values: Map<string, number>): number[] {
    const [a, b] = PORTS[r.flipflop];
    return codeBits.map((q, i) => characteristicOracle(r.flipflop, q, values.get(`${a}${i}`)!, b ? values.get(`${b}${i}`)! : 0));
}

/**
 * Checks a synthesis result against the model by exhaustive simulation (see oracle.ts): every
 * used code and input gives the model's next state and outputs; S·R = 0 on every code and input;
 * with `recover -> S`, every unused code goes to S with outputs 0.
 */
export function verify(machine: Machine, r: SynthesisResult): void {
    const width = r.assignment.width;
    const codes = r.assignment.codes;
    expect(new Set(codes).size, 'codes distinct').toBe(codes.length);
    expect(codes.every((c) => c.length === width)).toBe(true);
    expect(r.variables.length).toBe(r.inputCount + width);
    const codeIndex = new Map(codes.map((c, i) => [c, i]));
    const valuations = [...allInputValuations(machine)];
    const label = `${machine.name} ${r.assignment.encoding}/${r.flipflop}`;
    for (let s = 0; s < machine.states.length; s++) {
        const q = bitsOfCode(codes[s]!);
        for (const values of valuations) {
            const inBits = inputBits(machine, values);
            const eq = equationValues(r, q, inBits);
            const step = modelStep(machine, s, values);
            if (step.next !== undefined) {
                const next = builtNext(r, q, eq);
                const nextCode = [...next].reverse().join('');
                same(codeIndex.get(nextCode), step.next, `${label}: next of ${machine.states[s]!.name} at ${values}`);
            }
            machine.outputs.forEach((o, k) => {
                const want = step.outputs[k];
                if (want === undefined) return;
                for (let bit = 0; bit < o.width; bit++) {
                    const name = o.isBus ? `${o.name}[${bit}]` : o.name;
                    same(eq.get(name), Math.floor(want / 2 ** bit) % 2, `${label}: ${name} in ${machine.states[s]!.name} at ${values}`);
                }
            });
        }
    }
    const space = 2 ** width * valuations.length;
    if ((r.flipflop === 'SR' || machine.recover) && space <= 1 << 14) {
        for (let code = 0; code < 2 ** width; code++) {
            const q = Array.from({ length: width }, (_, i) => (code >> i) & 1);
            const codeText = [...q].reverse().join('');
            for (const values of valuations) {
                const eq = equationValues(r, q, inputBits(machine, values));
                if (r.flipflop === 'SR') {
                    for (let i = 0; i < width; i++) same(eq.get(`s${i}`)! & eq.get(`r${i}`)!, 0, `${label}: S·R at ${codeText}`);
                }
                if (machine.recover && !codeIndex.has(codeText)) {
                    const next = [...builtNext(r, q, eq)].reverse().join('');
                    same(next, codes[machine.recover.target], `${label}: recovery from ${codeText}`);
                    for (const e of r.equations) if (e.role === 'output') same(eq.get(e.name), 0, `${label}: ${e.name} at unused ${codeText}`);
                }
            }
        }
    }
}

