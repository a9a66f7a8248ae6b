/** Declaration-level findings: `no-reset`, `unused-input`, `unused-output`. */
import type { Guard, Machine } from '../model/machine.js';
import { type Finding, finding } from '../model/finding.js';

function readInputs(g: Guard, into: Set<number>): void {
    switch (g.kind) {
        case 'const': return;
        case 'input': case 'bit': case 'compare': into.add(g.input); return;
        case 'not': readInputs(g.operand, into); return;
        default: for (const o of g.operands) readInputs(o, into);
    }
}

/** Inputs some guard mentions (syntactically: `a | !a` still reads `a`). */
export function inputsRead(machine: Machine): Set<number> {
    const read = new Set<number>();
    for (const s of machine.states) for (const t of s.transitions) readInputs(t.guard, read);
    return read;
}

/** Outputs some `emit` assigns: Moore, Mealy or `otherwise -> … emit` (even `= 0`). */
export function outputsAssigned(machine: Machine): Set<number> {
    const set = new Set<number>();
    for (const s of machine.states) {
        for (const e of s.emits) set.add(e.output);
        for (const t of s.transitions) for (const e of t.emits) set.add(e.output);
        if (s.otherwise?.kind === 'goto') for (const e of s.otherwise.emits) set.add(e.output);
    }
    return set;
}

export function signalFindings(machine: Machine): Finding[] {
    const out: Finding[] = [];
    if (!machine.reset) {
        out.push(finding('no-reset', `machine '${machine.name}' declares no reset, so its power-up state is undefined in hardware (declare 'reset r -> S;')`, machine.nameRange));
    }
    const read = inputsRead(machine);
    machine.inputs.forEach((input, i) => {
        if (!read.has(i)) out.push(finding('unused-input', `input '${input.name}' is declared but no guard reads it`, input.nameRange, { signal: input.name }));
    });
    const assigned = outputsAssigned(machine);
    machine.outputs.forEach((output, i) => {
        if (!assigned.has(i)) out.push(finding('unused-output', `output '${output.name}' is declared but no emit assigns it; it is always 0`, output.nameRange, { signal: output.name }));
    });
    return out;
}
