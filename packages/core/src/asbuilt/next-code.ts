/**
 * The as-built machine: the next code of every code (used or not) under every input, from the
 * MINIMIZED excitation equations and the flip-flop characteristic equations
 * (D: Q+ = D; T: Q+ = Q⊕T; JK: Q+ = J·Q' + K'·Q; SR: Q+ = S + R'·Q).
 */
import { FREE, ONE, containsMinterm, getVar } from '../boolean/cube.js';
import type { Cube } from '../boolean/cube.js';
import type { Machine } from '../model/machine.js';
import { characteristic, excitationInputs } from '../synthesis/excitation.js';
import type { SynthesisResult } from '../synthesis/types.js';

/** Excitation covers of each state bit, ports in excitationInputs order. */
export function excitationCovers(result: SynthesisResult): (readonly Cube[])[][] {
    const ports = excitationInputs(result.flipflop);
    const width = result.assignment.width;
    return Array.from({ length: width }, (_, i) => ports.map((p) => {
        const eq = result.equations.find((e) => e.name === `${p}${i}`);
        if (!eq) throw new Error(`as-built: no equation ${p}${i}`);
        return eq.cover;
    }));
}

/** A cube as (care, value) masks over the packed assignment inputs | code << inputCount (≤ 30 variables). */
interface PackedCube { readonly care: number; readonly value: number }

function pack(c: Cube, nvars: number): PackedCube {
    let care = 0, value = 0;
    for (let v = 0; v < nvars; v++) {
        const f = getVar(c, v);
        if (f === FREE) continue;
        care |= 1 << v;
        if (f === ONE) value |= 1 << v;
    }
    return { care, value };
}

/** The next-code function on packed integers (inputs in the low bits, code above). */
export function packedNextCode(result: SynthesisResult): (code: number, inputs: number) => number {
    const nvars = result.variables.length;
    if (nvars > 30) throw new Error('as-built: too many variables for packed evaluation');
    const nI = result.inputCount;
    const kind = result.flipflop;
    const covers = excitationCovers(result).map((ports) => ports.map((cover) => cover.map((c) => pack(c, nvars))));
    const width = covers.length;
    return (code, inputs) => {
        const a = inputs | (code << nI);
        let next = 0;
        for (let i = 0; i < width; i++) {
            const ports = covers[i]!.map((cover) => {
                for (const c of cover) if ((a & c.care) === c.value) return 1;
                return 0;
            });
            const q = ((code >> i) & 1) as 0 | 1;
            if (characteristic(kind, q, ports)) next |= 1 << i;
        }
        return next;
    };
}

/** Input values by input name (bus values as unsigned integers) from input-variable bits. */
export function inputsByName(machine: Machine, bit: (v: number) => number): Record<string, number> {
    const r: Record<string, number> = {};
    let v = 0;
    for (const input of machine.inputs) {
        let value = 0;
        for (let b = 0; b < input.width; b++) value += bit(v++) * 2 ** b;
        r[input.name] = value;
    }
    return r;
}

/** A code as text, MSB first, from bit i = q_i. */
export function codeText(bit: (i: number) => number, width: number): string {
    let s = '';
    for (let i = width - 1; i >= 0; i--) s += bit(i) ? '1' : '0';
    return s;
}

/**
 * The next code of one code under one input, from the minimized covers (any width: no packing).
 * `code` and `inputs` are bit arrays (code bit i = q_i; inputs in variable order).
 */
export function nextCodeAt(result: SynthesisResult, code: readonly (0 | 1)[], inputs: readonly (0 | 1)[]): (0 | 1)[] {
    const minterm = [...inputs, ...code];
    return excitationCovers(result).map((ports, i) =>
        characteristic(result.flipflop, code[i]!, ports.map((cover) => (cover.some((c) => containsMinterm(c, minterm)) ? 1 : 0))));
}
