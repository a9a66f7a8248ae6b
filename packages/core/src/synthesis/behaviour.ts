/**
 * The next-state / output table of a machine as input covers, before any state assignment.
 *
 * For every state: the effective cover of each transition (first true guard wins — for plain
 * states that is source order, which is what the simulator takes too), the rest of the input
 * space (`otherwise -> T`: to T; `stay` or no otherwise: hold; `dontcare`: free), and the output
 * values on each piece. Covers are over `nvars` variables whose first `inputCount` are the input
 * variables (model/variables.ts order); the remaining variables (state bits) are free, so the
 * covers can be ANDed with state-code cubes directly.
 */
import type { Emit, Machine } from '../model/machine.js';
import { type Cube, universe } from '../boolean/cube.js';
import { coverDifference, coverIntersect, removeContained } from '../boolean/cover.js';
import { guardCover, type GuardContext } from '../boolean/guard.js';
import { inputOffsets, inputVariables } from '../model/variables.js';

/** Value of one output bit on a piece: 0, 1, or free (don't-care). */
export type BitValue = 0 | 1 | 'x';

/** One flat output bit: `y` or `y[i]`. */
export interface OutputBit {
    readonly name: string;
    readonly output: number;
    readonly bit: number;
    readonly registered: boolean;
    /** True when some transition (or `otherwise ->`) emits the output: it is a Mealy output. */
    readonly mealy: boolean;
}

/** A piece of one state's input space with one behaviour. */
export interface Piece {
    readonly inputs: readonly Cube[];
    /** Target state index, or 'x' for `otherwise dontcare`. Hold is the state's own index. */
    readonly target: number | 'x';
    /** Value of every combinational (non-registered) output bit, aligned with `outputBits`. */
    readonly outputs: readonly BitValue[];
}

export interface StateBehaviour {
    readonly pieces: readonly Piece[];
    /** Moore value of every output bit in this state (registered outputs: the value loaded on entry). */
    readonly moore: readonly (0 | 1)[];
}

export interface BehaviourTable {
    readonly machine: Machine;
    readonly inputNames: readonly string[];
    readonly inputCount: number;
    readonly outputBits: readonly OutputBit[];
    readonly states: readonly StateBehaviour[];
}

/** Every output bit in declaration order, bus bits LSB first. */
export function outputBits(machine: Machine): OutputBit[] {
    const mealy = new Set<number>();
    for (const s of machine.states) {
        for (const t of s.transitions) for (const e of t.emits) mealy.add(e.output);
        if (s.otherwise?.kind === 'goto') for (const e of s.otherwise.emits) mealy.add(e.output);
    }
    const bits: OutputBit[] = [];
    machine.outputs.forEach((o, index) => {
        for (let b = 0; b < o.width; b++) {
            bits.push({ name: o.isBus ? `${o.name}[${b}]` : o.name, output: index, bit: b, registered: o.registered, mealy: mealy.has(index) });
        }
    });
    return bits;
}

function emitBit(emits: readonly Emit[], output: number, bit: number): 0 | 1 | undefined {
    const e = emits.find((x) => x.output === output);
    if (!e) return undefined;
    return (Math.floor(e.value / 2 ** bit) % 2) as 0 | 1;
}

/**
 * Builds the table. `nvars` ≥ the number of input variables: the covers are made over that many
 * variables so that synthesis can AND them with state cubes without re-packing.
 */
export function behaviourTable(machine: Machine, nvars: number): BehaviourTable {
    const inputNames = inputVariables(machine).map((v) => v.name);
    const inputCount = inputNames.length;
    const ctx: GuardContext = { nvars, offsets: inputOffsets(machine), widths: machine.inputs.map((i) => i.width) };
    const bits = outputBits(machine);
    const states: StateBehaviour[] = machine.states.map((state) => {
        const moore = bits.map((b) => emitBit(state.emits, b.output, b.bit) ?? 0);
        const pieceOutputs = (emits: readonly Emit[], dontcare: boolean): BitValue[] =>
            bits.map((b, k) => {
                if (dontcare && b.mealy) return 'x';
                const mealyValue = emitBit(emits, b.output, b.bit);
                return mealyValue ?? moore[k]!;
            });
        const pieces: Piece[] = [];
        let rest: Cube[] = [universe(nvars)];
        for (const t of state.transitions) {
            if (rest.length === 0) break;
            const g = guardCover(t.guard, ctx);
            const effective = removeContained(coverIntersect(g, rest, nvars));
            if (effective.length > 0) pieces.push({ inputs: effective, target: t.target, outputs: pieceOutputs(t.emits, false) });
            rest = g.length === 0 ? rest : removeContained(coverDifference(rest, g, nvars));
        }
        if (rest.length > 0) {
            const o = state.otherwise;
            if (o?.kind === 'goto') pieces.push({ inputs: rest, target: o.target, outputs: pieceOutputs(o.emits, false) });
            else if (o?.kind === 'dontcare') pieces.push({ inputs: rest, target: 'x', outputs: pieceOutputs([], true) });
            else pieces.push({ inputs: rest, target: state.index, outputs: pieceOutputs([], false) });
        }
        return { pieces, moore };
    });
    return { machine, inputNames, inputCount, outputBits: bits, states };
}
