/**
 * The input space of one machine as covers, and the effective transition relation: for every
 * state, the input region where each transition is the one actually taken.
 *
 * "Taken" follows the simulator (LANGUAGE.md, "States and transitions"): the first true `when`
 * in source order (for priority states by definition, for plain states because that is what
 * the simulator does when guards overlap); `otherwise` takes the rest; without `otherwise`, or
 * with `otherwise stay`, the rest holds the state. `otherwise dontcare` is recorded as its own
 * region kind; reachability treats it as hold, equivalence keeps such states apart.
 */
import type { Machine, Emit } from '../model/machine.js';
import type { Witness } from '../model/finding.js';
import { type Cube, getVar, FREE, intersect, intersects, someMinterm } from '../boolean/cube.js';
import { type Cover, complement, coverIntersect, coverUnion } from '../boolean/cover.js';
import { type GuardContext, guardContext, guardCover } from '../boolean/guard.js';

export type RegionKind = 'when' | 'otherwise' | 'hold' | 'dontcare';

export interface Region {
    readonly kind: RegionKind;
    /** Transition index for `when` regions. */
    readonly transition?: number;
    /** Non-empty cover of the inputs for which this region decides the step. */
    readonly cover: Cube[];
    readonly target: number;
    /** Interned id of the observable output vector (Moore overlaid with Mealy) in this region. */
    readonly outputs: number;
}

export interface StateSpace {
    /** Cover of each transition's guard. */
    readonly guards: readonly Cube[][];
    /** Where each transition is the first true one (may be empty). */
    readonly fires: readonly Cube[][];
    /** Union of all guards. */
    readonly covered: Cube[];
    /** Inputs no guard takes (the `otherwise` region). */
    readonly rest: Cube[];
    /** Non-empty regions; together they partition the input space. */
    readonly regions: readonly Region[];
    /** True when the state has an `otherwise dontcare` that covers some input. */
    readonly dontcare: boolean;
}

export interface MachineSpace {
    readonly ctx: GuardContext;
    readonly states: readonly StateSpace[];
    /** Output vectors by id (value per output index). */
    readonly outputVectors: readonly (readonly number[])[];
}

/** Observable outputs: unassigned outputs are 0, Mealy values override Moore ones. */
function outputVector(machine: Machine, moore: readonly Emit[], mealy: readonly Emit[]): number[] {
    const v = new Array<number>(machine.outputs.length).fill(0);
    for (const e of moore) if (e.output < v.length) v[e.output] = e.value;
    for (const e of mealy) if (e.output < v.length) v[e.output] = e.value;
    return v;
}

export function buildSpace(machine: Machine): MachineSpace {
    const ctx = guardContext(machine);
    const n = ctx.nvars;
    const ids = new Map<string, number>();
    const outputVectors: number[][] = [];
    const intern = (v: number[]): number => {
        const key = v.join(',');
        let id = ids.get(key);
        if (id === undefined) { id = outputVectors.length; outputVectors.push(v); ids.set(key, id); }
        return id;
    };
    const states = machine.states.map((state): StateSpace => {
        const guards = state.transitions.map((t) => guardCover(t.guard, ctx));
        const fires: Cube[][] = [];
        const regions: Region[] = [];
        let covered: Cube[] = [];
        guards.forEach((g, i) => {
            const t = state.transitions[i]!;
            const fire = covered.length === 0 ? g : coverIntersect(g, complement(covered, n), n);
            fires.push(fire);
            if (fire.length > 0) regions.push({ kind: 'when', transition: i, cover: fire, target: t.target, outputs: intern(outputVector(machine, state.emits, t.emits)) });
            if (g.length > 0) covered = coverUnion(covered, g);
        });
        const rest = complement(covered, n);
        let dontcare = false;
        if (rest.length > 0) {
            const o = state.otherwise;
            if (o?.kind === 'goto') regions.push({ kind: 'otherwise', cover: rest, target: o.target, outputs: intern(outputVector(machine, state.emits, o.emits)) });
            else if (o?.kind === 'dontcare') {
                dontcare = true;
                regions.push({ kind: 'dontcare', cover: rest, target: state.index, outputs: intern(outputVector(machine, state.emits, [])) });
            } else regions.push({ kind: 'hold', cover: rest, target: state.index, outputs: intern(outputVector(machine, state.emits, [])) });
        }
        return { guards, fires, covered, rest, regions, dontcare };
    });
    return { ctx, states, outputVectors };
}

/** Some minterm in both covers, or undefined. */
export function commonMinterm(f: Cover, g: Cover, nvars: number): (0 | 1)[] | undefined {
    for (const a of f) for (const b of g) {
        if (!intersects(a, b, nvars)) continue;
        const c = intersect(a, b, nvars);
        if (c) return someMinterm(c, nvars);
    }
    return undefined;
}

/** Some minterm of a non-empty cover (the first cube, free variables 0). */
export function firstMinterm(f: Cover, nvars: number): (0 | 1)[] | undefined {
    return f.length > 0 ? someMinterm(f[0]!, nvars) : undefined;
}

/** The inputs a cube fixes (names of inputs with at least one literal), for messages. */
export function fixedInputs(machine: Machine, ctx: GuardContext, cubes: readonly Cube[]): Set<string> {
    const names = new Set<string>();
    machine.inputs.forEach((input, i) => {
        for (let b = 0; b < input.width; b++) {
            const v = ctx.offsets[i]! + b;
            if (cubes.some((c) => getVar(c, v) !== FREE)) { names.add(input.name); return; }
        }
    });
    return names;
}

/** Input values by name from a minterm (bus bits LSB first → unsigned integer). */
export function mintermInputs(machine: Machine, ctx: GuardContext, bits: readonly (0 | 1)[]): Record<string, number> {
    const r: Record<string, number> = {};
    machine.inputs.forEach((input, i) => {
        let value = 0;
        for (let b = input.width - 1; b >= 0; b--) value = value * 2 + (bits[ctx.offsets[i]! + b] ?? 0);
        r[input.name] = value;
    });
    return r;
}

export function inputWitness(machine: Machine, ctx: GuardContext, bits: readonly (0 | 1)[]): Witness {
    return { inputs: mintermInputs(machine, ctx, bits) };
}
