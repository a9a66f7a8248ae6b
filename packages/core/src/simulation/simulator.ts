/**
 * Cycle-exact simulator of the model semantics (LANGUAGE.md "Semantics of one clock cycle").
 *
 * One cycle: the inputs (and the reset level) are applied, the active edge loads the next state,
 * and the outputs are observed after the edge with those inputs still applied — exactly where a
 * scenario's `expect` looks. Mealy outputs therefore see the new state and the current inputs.
 *
 * Decisions (docs/decisions.md, Export & simulation):
 * - `otherwise dontcare`: the simulator holds the state and drives Moore outputs only (no Mealy).
 * - A registered output is a flip-flop whose D input is the Moore value of the next state; after the
 *   edge it equals the Moore value of the new state (same timing as a Moore output, glitch-free).
 *   On reset it loads the Moore value of the reset target; a `clear` reset clears it to 0.
 * - A code that is no state's code (only reachable through `reset … clear`) drives outputs 0; it
 *   goes to the `recover` target on the next clock, otherwise to what `illegalNext` says (the
 *   as-built logic, see asbuilt.ts), otherwise it holds.
 */
import type { Guard, Machine, Emit, CompareOp } from '../model/machine.js';
import { initialState } from '../model/machine.js';
import { type StateAssignment, clearResetState, fixedAssignment } from '../synthesis/encoding.js';

/** The register contents of the simulated machine. */
export interface SimState {
    /** State index, or null when the code is no state's code. */
    readonly state: number | null;
    /** The state register's code, MSB first. */
    readonly code: string;
    /** Registered outputs' flip-flops by output index (0 for outputs that are not registered). */
    readonly registered: readonly number[];
}

export interface SimulatorOptions {
    /** The state assignment (codes); default: the machine's fixed encoding (`auto` falls back to binary). */
    readonly assignment?: StateAssignment;
    /** Next code of a code that is no state's code, e.g. from the synthesized logic. */
    readonly illegalNext?: (code: string, inputs: readonly number[]) => string;
}

export interface CycleResult {
    readonly state: SimState;
    /** Observed outputs after the edge with the same inputs applied, by output index. */
    readonly outputs: number[];
}

export interface Simulator {
    readonly machine: Machine;
    readonly assignment: StateAssignment;
    /** The power-up state: the reset state when there is a reset (its code for `clear`), otherwise the first state. */
    initial(): SimState;
    /** The state after one reset clock. */
    resetState(): SimState;
    /** One clock with these inputs (by input index) and the reset asserted or not. */
    cycle(state: SimState, inputs: readonly number[], reset: boolean): CycleResult;
    /** Outputs in a state with these inputs applied (no edge). */
    outputs(state: SimState, inputs: readonly number[]): number[];
    /** The transition taken in a legal state, or undefined when the state holds. */
    selected(state: number, inputs: readonly number[]): { target: number; emits: readonly Emit[] } | undefined;
}

/** The assignment the simulator and the exports use when none is given. */
export function defaultAssignment(machine: Machine): StateAssignment {
    const enc = machine.encoding === 'auto' ? 'binary' : machine.encoding;
    return fixedAssignment(machine, enc) ?? fixedAssignment(machine, 'binary')!;
}

export function guardValue(guard: Guard, inputs: readonly number[]): boolean {
    switch (guard.kind) {
        case 'const': return guard.value;
        case 'input': return (inputs[guard.input] ?? 0) % 2 === 1;
        case 'bit': return Math.floor((inputs[guard.input] ?? 0) / 2 ** guard.bit) % 2 === 1;
        case 'compare': return compareValue(inputs[guard.input] ?? 0, guard.op, guard.value);
        case 'not': return !guardValue(guard.operand, inputs);
        case 'and': return guard.operands.every((g) => guardValue(g, inputs));
        case 'or': return guard.operands.some((g) => guardValue(g, inputs));
        case 'xor': return guard.operands.filter((g) => guardValue(g, inputs)).length % 2 === 1;
    }
}

function compareValue(a: number, op: CompareOp, b: number): boolean {
    switch (op) {
        case '==': return a === b;
        case '!=': return a !== b;
        case '<': return a < b;
        case '<=': return a <= b;
        case '>': return a > b;
        case '>=': return a >= b;
    }
}

export function createSimulator(machine: Machine, options: SimulatorOptions = {}): Simulator {
    const assignment = options.assignment ?? defaultAssignment(machine);
    const zeroCode = '0'.repeat(assignment.width);
    const legal = (index: number): SimState => ({ state: index, code: assignment.codes[index]!, registered: registeredOf(index) });
    const byCode = new Map<string, number>();
    assignment.codes.forEach((c, i) => byCode.set(c, i));
    const fromCode = (code: string, registered: readonly number[]): SimState => ({ state: byCode.get(code) ?? null, code, registered });

    function mooreValue(state: number, output: number): number | undefined {
        return machine.states[state]!.emits.find((e) => e.output === output)?.value;
    }
    function registeredOf(state: number | null): number[] {
        return machine.outputs.map((o, i) => (o.registered && state !== null ? mooreValue(state, i) ?? 0 : 0));
    }

    function selected(state: number, inputs: readonly number[]): { target: number; emits: readonly Emit[] } | undefined {
        const s = machine.states[state]!;
        // Plain and priority states alike take the first true guard in source order.
        for (const t of s.transitions) if (guardValue(t.guard, inputs)) return { target: t.target, emits: t.emits };
        if (s.otherwise?.kind === 'goto') return { target: s.otherwise.target, emits: s.otherwise.emits };
        return undefined;
    }

    function resetState(): SimState {
        const target = machine.reset?.target;
        if (typeof target === 'number') return legal(target);
        if (target === 'clear') {
            const s = clearResetState(assignment);
            return { state: s ?? null, code: zeroCode, registered: machine.outputs.map(() => 0) };
        }
        return legal(initialState(machine));
    }

    function outputs(st: SimState, inputs: readonly number[]): number[] {
        const sel = st.state === null ? undefined : selected(st.state, inputs);
        return machine.outputs.map((o, i) => {
            if (o.registered) return st.registered[i] ?? 0;
            if (st.state === null) return 0;
            const moore = mooreValue(st.state, i);
            if (moore !== undefined) return moore;
            return sel?.emits.find((e) => e.output === i)?.value ?? 0;
        });
    }

    function cycle(st: SimState, inputs: readonly number[], reset: boolean): CycleResult {
        let next: SimState;
        if (reset && machine.reset) {
            next = resetState();
        } else if (st.state !== null) {
            const sel = selected(st.state, inputs);
            next = sel ? legal(sel.target) : legal(st.state);
        } else if (machine.recover) {
            next = legal(machine.recover.target);
        } else if (options.illegalNext) {
            const code = options.illegalNext(st.code, inputs);
            const s = byCode.get(code);
            next = s === undefined ? fromCode(code, registeredOf(null)) : legal(s);
        } else {
            next = st;
        }
        return { state: next, outputs: outputs(next, inputs) };
    }

    return {
        machine,
        assignment,
        initial: () => (machine.reset ? resetState() : legal(initialState(machine))),
        resetState,
        cycle,
        outputs,
        selected,
    };
}
