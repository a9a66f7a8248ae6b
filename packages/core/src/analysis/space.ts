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
import { type Cube, FREE, ONE, ZERO, cubeOf, getVar, intersect, intersects, isUniverse, someMinterm, universe } from '../boolean/cube.js';
import { type Cover, coverCofactor, coverContainsCover, coverContainsCube, tautology } from '../boolean/cover.js';
import { type GuardContext, guardContext, guardCover } from '../boolean/guard.js';

export type RegionKind = 'when' | 'otherwise' | 'hold' | 'dontcare';

/**
 * One region of a state's input space, kept as a difference `on \ off` rather than a cover:
 * the first-true rule makes regions "this guard minus every earlier guard", and complementing
 * the union of earlier guards is what makes covers explode (a 16-bit comparison is 16 cubes);
 * emptiness and intersection of differences need only containment (tautology) checks.
 */
export interface Region {
    readonly kind: RegionKind;
    /** Transition index for `when` regions. */
    readonly transition?: number;
    /** The guard (for `when`) or the universe (for the rest of the inputs). */
    readonly on: Cube[];
    /** The union of the guards before it; the region is `on` minus `off`, never empty. */
    readonly off: Cube[];
    readonly target: number;
    /** Interned id of the observable output vector (Moore overlaid with Mealy) in this region. */
    readonly outputs: number;
}

export interface StateSpace {
    /** Cover of each transition's guard. */
    readonly guards: readonly Cube[][];
    /** Whether each transition is the first true one for some input. */
    readonly fires: readonly boolean[];
    /** Union of all guards. */
    readonly covered: Cube[];
    /** True when some input makes no guard true (the `otherwise` region is not empty). */
    readonly hasRest: boolean;
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
    const all = [universe(n)];
    const states = machine.states.map((state): StateSpace => {
        const guards = state.transitions.map((t) => guardCover(t.guard, ctx));
        const fires: boolean[] = [];
        const regions: Region[] = [];
        let covered: Cube[] = [];
        guards.forEach((g, i) => {
            const t = state.transitions[i]!;
            const fire = g.length > 0 && !coverContainsCover(covered, g, n);
            fires.push(fire);
            if (fire) regions.push({ kind: 'when', transition: i, on: g, off: covered, target: t.target, outputs: intern(outputVector(machine, state.emits, t.emits)) });
            // Plain concatenation: single-cube containment would cost more than the redundant cubes do.
            if (g.length > 0) covered = covered.length === 0 ? g : [...covered, ...g];
        });
        const hasRest = !tautology(covered, n);
        let dontcare = false;
        if (hasRest) {
            const o = state.otherwise;
            const rest = { on: all, off: covered };
            if (o?.kind === 'goto') regions.push({ kind: 'otherwise', ...rest, target: o.target, outputs: intern(outputVector(machine, state.emits, o.emits)) });
            else if (o?.kind === 'dontcare') {
                dontcare = true;
                regions.push({ kind: 'dontcare', ...rest, target: state.index, outputs: intern(outputVector(machine, state.emits, [])) });
            } else regions.push({ kind: 'hold', ...rest, target: state.index, outputs: intern(outputVector(machine, state.emits, [])) });
        }
        return { guards, fires, covered, hasRest, regions, dontcare };
    });
    return { ctx, states, outputVectors };
}

/** True when the minterm cube m lies in the region. */
export function regionHas(r: Region, m: Cube, nvars: number): boolean {
    return r.on.some((c) => intersects(c, m, nvars)) && !r.off.some((c) => intersects(c, m, nvars));
}

/** True when two regions share an input: some cube of on_a ∩ on_b is not inside off_a ∪ off_b. */
export function regionsIntersect(a: Region, b: Region, nvars: number): boolean {
    let off: Cube[] | undefined;
    for (const ca of a.on) for (const cb of b.on) {
        const c = intersect(ca, cb, nvars);
        if (!c) continue;
        off ??= [...a.off, ...b.off];
        if (!coverContainsCube(off, c, nvars)) return true;
    }
    return false;
}

/**
 * A minterm no cube of f contains, or undefined when f is a tautology. Splits like the
 * tautology check (most binate variable, 0 before 1, so witnesses favour zeros); a unate
 * cover without the universal cube is always escapable (see unateEscape).
 */
export function mintermOutside(f: Cover, nvars: number): (0 | 1)[] | undefined {
    if (f.length === 0) return new Array<0 | 1>(nvars).fill(0);
    for (const c of f) if (isUniverse(c, nvars)) return undefined;
    const zeros = new Int32Array(nvars);
    const ones = new Int32Array(nvars);
    for (const c of f) for (let v = 0; v < nvars; v++) {
        const x = getVar(c, v);
        if (x === ZERO) zeros[v]!++; else if (x === ONE) ones[v]!++;
    }
    let split = -1;
    let best = 0;
    for (let v = 0; v < nvars; v++) if (zeros[v]! > 0 && ones[v]! > 0 && zeros[v]! + ones[v]! > best) { best = zeros[v]! + ones[v]!; split = v; }
    if (split < 0) return unateEscape(f, nvars);
    for (const value of [0, 1] as const) {
        const sub = coverCofactor(f, cubeOf(nvars, [[split, value]]), nvars);
        const r = mintermOutside(sub, nvars);
        if (r) { r[split] = value; return r; }
    }
    return undefined;
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


/**
 * A minterm outside a unate cover that lacks the universal cube. Start from all zeros; while
 * some cube still contains it (all of that cube's literals are complemented ones), set to 1
 * the variable that kills most such cubes. Unate means no cube has that variable's positive
 * literal, so no cube is revived; the result has few ones, which reads well in messages.
 */
function unateEscape(f: Cover, nvars: number): (0 | 1)[] {
    const m = new Array<0 | 1>(nvars).fill(0);
    let alive = f.filter((c) => containsAssignment(c, m, nvars));
    while (alive.length > 0) {
        const hits = new Int32Array(nvars);
        for (const c of alive) for (let v = 0; v < nvars; v++) if (getVar(c, v) === ZERO) hits[v]!++;
        let best = 0;
        for (let v = 1; v < nvars; v++) if (hits[v]! > hits[best]!) best = v;
        m[best] = 1;
        alive = alive.filter((c) => containsAssignment(c, m, nvars));
    }
    return m;
}

function containsAssignment(c: Cube, m: readonly (0 | 1)[], nvars: number): boolean {
    for (let v = 0; v < nvars; v++) {
        const x = getVar(c, v);
        if (x === FREE) continue;
        if ((x === ONE) !== (m[v] === 1)) return false;
    }
    return true;
}
