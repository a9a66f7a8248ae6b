/**
 * The as-built machine of a synthesis result: next code and outputs computed from the
 * minimized equations and the flip-flops' characteristic equations, for every code and input.
 * Used to simulate codes that are no state's code, and as the reference for structural exports.
 */
import type { SynthesisResult } from '../synthesis/types.js';
import { evaluate } from '../boolean/cover.js';
import { inputVariables } from '../model/variables.js';

export interface AsBuilt {
    /** Next code (MSB first) from a code and input values by input index. */
    next(code: string, inputs: readonly number[]): string;
    /** Combinational outputs by output index (registered outputs: the value their D input loads). */
    outputs(code: string, inputs: readonly number[]): number[];
}

export function asBuilt(synth: SynthesisResult): AsBuilt {
    const machine = synth.machine;
    const vars = inputVariables(machine);
    const width = synth.assignment.width;
    const bits = (code: string, inputs: readonly number[]): (0 | 1)[] => {
        const b: (0 | 1)[] = vars.map((v) => (Math.floor((inputs[v.input] ?? 0) / 2 ** v.bit) % 2 === 1 ? 1 : 0));
        for (let i = 0; i < width; i++) b.push(code[code.length - 1 - i] === '1' ? 1 : 0);
        return b;
    };
    const eq = (name: string) => synth.equations.find((e) => e.name === name && e.role === 'excitation');
    return {
        next(code, inputs) {
            const x = bits(code, inputs);
            const val = (name: string) => { const e = eq(name); return e ? evaluate(e.cover, x) : false; };
            let s = '';
            for (let i = width - 1; i >= 0; i--) {
                const q = code[code.length - 1 - i] === '1';
                let n: boolean;
                switch (synth.flipflop) {
                    case 'D': n = val(`d${i}`); break;
                    case 'T': n = q !== val(`t${i}`); break;
                    case 'JK': n = q ? !val(`k${i}`) : val(`j${i}`); break;
                    case 'SR': n = val(`s${i}`) || (q && !val(`r${i}`)); break;
                }
                s += n ? '1' : '0';
            }
            return s;
        },
        outputs(code, inputs) {
            const x = bits(code, inputs);
            return machine.outputs.map((o, k) => {
                let v = 0;
                for (const e of synth.equations) {
                    if (e.output !== k || e.role === 'excitation') continue;
                    if (evaluate(e.cover, x)) v += 2 ** (e.outputBit ?? 0);
                }
                void o;
                return v;
            });
        },
    };
}
