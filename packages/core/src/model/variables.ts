import type { Machine } from './machine.js';

/** One Boolean input variable: a 1-bit input, or one bit of a bus. */
export interface InputVariable {
    /** `a` for a 1-bit input, `bus[i]` for a bus bit (also for a 1-bit bus). */
    readonly name: string;
    readonly input: number;
    readonly bit: number;
}

/**
 * The machine's input variables in a fixed order: inputs in declaration order, each bus
 * least significant bit first. Cubes over the inputs use exactly this order.
 */
export function inputVariables(machine: Machine): InputVariable[] {
    const vars: InputVariable[] = [];
    machine.inputs.forEach((input, index) => {
        if (!input.isBus) {
            vars.push({ name: input.name, input: index, bit: 0 });
        } else {
            for (let bit = 0; bit < input.width; bit++) {
                vars.push({ name: `${input.name}[${bit}]`, input: index, bit });
            }
        }
    });
    return vars;
}

/** Index of the first variable of each input in `inputVariables` order. */
export function inputOffsets(machine: Machine): number[] {
    const offsets: number[] = [];
    let next = 0;
    for (const input of machine.inputs) {
        offsets.push(next);
        next += input.width;
    }
    return offsets;
}
