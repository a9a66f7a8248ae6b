/**
 * Synthesis: next-state table → excitation and output equations, minimized, with cost.
 *
 * Two ways of building the covers:
 * - flat (binary, gray, johnson, explicit, auto): every used state is its full code cube; unused
 *   codes are don't-cares (or, with `recover -> S`, specified: next code S, outputs 0); each
 *   equation is minimized once over inputs and state bits.
 * - structured (one-hot, one-cold without `recover`): a legal code is identified by its single hot
 *   (cold) bit, so state s's terms carry only the literal q_s (q_s'); the minimizer gets only the
 *   input side of each state, which keeps 64-state machines fast. Illegal codes then behave as
 *   the OR of the terms of their hot bits (see docs/decisions.md).
 */
import type { EncodingKind, FlipFlopKind, Machine } from '../model/machine.js';
import {
    type Cube, ONE, ZERO, FREE, getVar, intersect, isUniverse, setVarInPlace, universe, withVar,
} from '../boolean/cube.js';
import {
    complement, coverContainsCover, coverDifference, coversIntersect, removeContained, tautology,
} from '../boolean/cover.js';
import { minimize } from '../boolean/minimize.js';
import { type BehaviourTable, type BitValue, behaviourTable } from './behaviour.js';
import { type StateAssignment, fixedAssignment } from './encoding.js';
import { excitationInputs, excitationValue } from './excitation.js';
import { compareCost, networkCost } from './cost.js';
import { minimizeMulti } from '../boolean/multi-output.js';
import type { Equation, SynthesisResult } from './types.js';

export interface SynthesisOptions {
    /** Overrides the machine's `encoding`. */
    readonly encoding?: EncodingKind;
    /** Overrides the machine's `flipflop`. */
    readonly flipflop?: FlipFlopKind;
    /** Count a product used by several equations once (multiple-output sharing). Default false. */
    readonly share?: boolean;
    /** Time budget for the `auto` search, in milliseconds (default 1000). */
    readonly budgetMs?: number;
    /** Budget per minimizer call, in milliseconds. */
    readonly minimizeBudgetMs?: number;
    /** Treat `recover` as absent (used to report what recovery costs). */
    readonly ignoreRecover?: boolean;
    /** Keystroke mode (as-built findings in the editor): cheaper S·R repair. */
    readonly quick?: boolean;
    /** Date.now() after which synthesis throws SynthesisBudgetError. */
    readonly deadline?: number;
    /** As-built analyses: skip minimizations that cannot change their findings (see FunctionOnly). */
    readonly functionOnly?: FunctionOnly;
    /**
     * Which equations to build (fixed encodings only; `auto` always builds all, since outputs take part
     * in its cost): 'all' (default); 'flipflops' — excitation and registered-output D inputs; 'state' —
     * excitation only. The as-built analyses use this: lock-up needs only the excitation logic. Every
     * equation is minimized on its own, so the ones built are the same as in a full synthesis; `cost`
     * then counts only them.
     */
    readonly equations?: EquationSelection;
}

export type EquationSelection = 'all' | 'flipflops' | 'state';

/** A region of the code space with one specified behaviour per input piece. */
interface Region {
    /** State-bit literals of the region (input variables free). */
    readonly cube: Cube;
    /** The code the region stands for (bit i = q_i), when it stands for one code. */
    readonly assumed?: readonly (0 | 1)[];
    readonly pieces: readonly RegionPiece[];
}

interface RegionPiece {
    readonly inputs: readonly Cube[];
    /** Next code (bit i = q_i), or 'x'. */
    readonly next: readonly (0 | 1)[] | 'x';
    /** Every output bit: combinational value, or for registered bits the D input (Moore value of the next state). */
    readonly outputs: readonly BitValue[];
}

interface EquationSpec {
    readonly name: string;
    readonly role: Equation['role'];
    readonly stateBit?: number;
    readonly port?: number;
    readonly output?: number;
    readonly outputBit?: number;
    /** Index into the output bits. */
    readonly flatOutput?: number;
}

/** Codes as bit arrays, bit i = q_i (codes are written MSB first). */
export function codeBits(code: string): (0 | 1)[] {
    const bits: (0 | 1)[] = [];
    for (let i = 0; i < code.length; i++) bits.push(code[code.length - 1 - i] === '1' ? 1 : 0);
    return bits;
}

function stateCube(bits: readonly (0 | 1)[], inputCount: number, nvars: number): Cube {
    const c = universe(nvars);
    bits.forEach((b, i) => setVarInPlace(c, inputCount + i, b === 1 ? ONE : ZERO));
    return c;
}

function and(a: Cube, b: Cube, nvars: number): Cube | null {
    return intersect(a, b, nvars);
}

function cubesAnd(cover: readonly Cube[], c: Cube, nvars: number): Cube[] {
    const r: Cube[] = [];
    for (const a of cover) {
        const x = and(a, c, nvars);
        if (x) r.push(x);
    }
    return r;
}

/** Illegal codes of one-hot (polarity 1) or one-cold (polarity 0) as cubes: none hot, or two hot. */
function illegalHotCubes(width: number, inputCount: number, nvars: number, hot: 0 | 1): Cube[] {
    const cold = hot === 1 ? ZERO : ONE;
    const hotField = hot === 1 ? ONE : ZERO;
    const none = universe(nvars);
    for (let i = 0; i < width; i++) setVarInPlace(none, inputCount + i, cold);
    const cubes: Cube[] = [none];
    for (let a = 0; a < width; a++) for (let b = a + 1; b < width; b++) {
        const c = universe(nvars);
        setVarInPlace(c, inputCount + a, hotField);
        setVarInPlace(c, inputCount + b, hotField);
        cubes.push(c);
    }
    return cubes;
}

/** Synthesis ran past `deadline` (keystroke budgets); the caller reports the skipped work. */
export class SynthesisBudgetError extends Error {}

/** Everything synthesis needs that does not depend on the state assignment (reused by the auto search). */
export interface SynthesisContext {
    readonly machine: Machine;
    readonly table: BehaviourTable;
    /** Number of cube variables the table was built with. */
    readonly nvars: number;
}

export function synthesisContext(machine: Machine, width: number): SynthesisContext {
    const inputCount = machine.inputs.reduce((a, i) => a + i.width, 0);
    const nvars = inputCount + width;
    return { machine, table: behaviourTable(machine, nvars), nvars };
}

export interface CodesOptions {
    readonly share?: boolean;
    /** Keystroke mode: repair S·R overlaps by cube subtraction only, without re-minimizing. */
    readonly quick?: boolean;
    /** Date.now() after which synthesis gives up with SynthesisBudgetError (checked between equations). */
    readonly deadline?: number;
    readonly minimizeBudgetMs?: number;
    readonly ignoreRecover?: boolean;
    /** See SynthesisOptions.equations. */
    readonly equations?: EquationSelection;
    /** See SynthesisOptions.functionOnly. */
    readonly functionOnly?: FunctionOnly;
}

/**
 * As-built analyses only: which minimizations can change what the analyses see. A function with no
 * don't-cares is the same function however it is minimized, so it keeps its ON-set cover unless its
 * literals matter. Literals matter for each input of `literalInputs` (async-input asks whether any
 * bit of it appears): an input the function's cubes never mention appears in no cover; an input one of
 * whose bits is necessary (an ON point whose neighbour across that bit is OFF, within one code)
 * appears in every valid cover, the minimized one and the ON-set alike; only otherwise does the
 * answer depend on the minimizer. With `dontCares: false` functions with don't-cares follow the same
 * rule (nothing reads the function's value on its don't-cares).
 */
export interface FunctionOnly {
    readonly dontCares: boolean;
    /** Input variables of each input whose literals matter. */
    readonly literalInputs: readonly (readonly number[])[];
}

/** Input-side ON and don't-care covers of one code (or code cube) of a function. */
interface CodeSpec { readonly on: readonly Cube[]; readonly dc: readonly Cube[] }

function flipVar(c: Cube, v: number): Cube {
    const f = getVar(c, v);
    return f === FREE ? c : withVar(c, v, f === ONE ? ZERO : ONE);
}

function needsMinimizing(f: FunctionOnly | undefined, on: readonly Cube[], dc: readonly Cube[], codes: readonly CodeSpec[], nvars: number): boolean {
    if (!f) return true;
    if (f.dontCares && dc.length > 0) return true;
    for (const vars of f.literalInputs) {
        const mentions = (c: Cube) => vars.some((v) => getVar(c, v) !== FREE);
        if (!on.some(mentions) && !dc.some(mentions)) continue;
        // Necessary bit: within one code, the ON set moved across the bit leaves ON ∪ DC.
        const necessary = vars.some((v) => codes.some((g) => g.on.length > 0
            && !coverContainsCover([...g.on, ...g.dc], g.on.map((c) => flipVar(c, v)), nvars)));
        if (!necessary) return true;
    }
    return false;
}

/** Synthesizes the machine under a given assignment (the core of `synthesize` and of the auto search). */
export function synthesizeWithAssignment(ctx: SynthesisContext, assignment: StateAssignment, flipflop: FlipFlopKind, options: CodesOptions = {}): SynthesisResult {
    const { machine, table, nvars } = ctx;
    const width = assignment.width;
    const inputCount = table.inputCount;
    if (inputCount + width !== nvars) throw new Error('synthesis: context built for another width');
    const recover = options.ignoreRecover ? undefined : machine.recover;
    const hotPolarity: 0 | 1 | undefined = assignment.encoding === 'onehot' ? 1 : assignment.encoding === 'onecold' ? 0 : undefined;
    const structured = hotPolarity !== undefined && width === machine.states.length && width > 1;
    const codes = assignment.codes.map(codeBits);
    const notes: string[] = [];

    // Regions of the code space.
    const regions: Region[] = [];
    const bitsOut = table.outputBits;
    const registeredOf = (target: number | 'x'): BitValue[] =>
        bitsOut.map((b, k) => (target === 'x' ? 'x' : b.registered ? table.states[target]!.moore[k]! : 0));
    table.states.forEach((st, s) => {
        const code = codes[s]!;
        let cube: Cube;
        if (structured && !recover) {
            cube = universe(nvars);
            setVarInPlace(cube, inputCount + s, hotPolarity === 1 ? ONE : ZERO);
        } else {
            cube = stateCube(code, inputCount, nvars);
        }
        const pieces: RegionPiece[] = st.pieces.map((p) => {
            const reg = registeredOf(p.target);
            return {
                inputs: p.inputs,
                next: p.target === 'x' ? 'x' : codes[p.target]!,
                outputs: bitsOut.map((b, k) => (b.registered ? reg[k]! : p.outputs[k]!)),
            };
        });
        regions.push({ cube, assumed: code, pieces });
    });
    let unusedDontCare: Cube[] = [];
    let unusedCodes: SynthesisResult['unusedCodes'];
    const usedCount = new Set(assignment.codes).size;
    const hasUnused = 2 ** width > usedCount;
    if (!hasUnused) {
        unusedCodes = 'dontcare';
    } else if (recover) {
        unusedCodes = 'recover';
        const unused = structured
            ? illegalHotCubes(width, inputCount, nvars, hotPolarity!)
            : complement(regions.map((r) => r.cube), nvars);
        const reg = registeredOf(recover.target);
        const piece: RegionPiece = {
            inputs: [universe(nvars)],
            next: codes[recover.target]!,
            outputs: bitsOut.map((b, k) => (b.registered ? reg[k]! : 0)),
        };
        for (const cube of unused) regions.push({ cube, pieces: [piece] });
    } else if (structured) {
        unusedCodes = 'structural';
    } else {
        unusedCodes = 'dontcare';
        unusedDontCare = complement(regions.map((r) => r.cube), nvars);
    }

    // Equation list.
    const specs: EquationSpec[] = [];
    const ports = excitationInputs(flipflop);
    for (let i = 0; i < width; i++) ports.forEach((p, port) => specs.push({ name: `${p}${i}`, role: 'excitation', stateBit: i, port }));
    const selection = options.equations ?? 'all';
    bitsOut.forEach((b, k) => {
        if (selection === 'state' || (selection === 'flipflops' && !b.registered)) return;
        specs.push({ name: b.name, role: b.registered ? 'registered-output' : 'output', output: b.output, outputBit: b.bit, flatOutput: k });
    });

    // Per equation: groups (one per region, split on q_i where the region leaves it open).
    const equations: Equation[] = [];
    const onOf = new Map<string, Cube[]>();
    const dcOf = new Map<string, Cube[]>();
    for (const spec of specs) {
        if (options.deadline !== undefined && Date.now() > options.deadline) throw new SynthesisBudgetError(`synthesis of ${machine.name} ran past its time budget`);
        interface Group { cube: Cube; on: Cube[]; dc: Cube[]; q?: 0 | 1 }
        const groups: Group[] = [];
        for (const region of regions) {
            const variants: { cube: Cube; q?: 0 | 1 }[] = [];
            if (spec.stateBit !== undefined) {
                const i = spec.stateBit;
                const known = region.assumed?.[i];
                const field = getVar(region.cube, inputCount + i);
                if (known !== undefined) variants.push({ cube: region.cube, q: known });
                else if (field !== FREE) variants.push({ cube: region.cube, q: field === ONE ? 1 : 0 });
                else {
                    variants.push({ cube: withVar(region.cube, inputCount + i, ZERO), q: 0 });
                    variants.push({ cube: withVar(region.cube, inputCount + i, ONE), q: 1 });
                }
            } else {
                variants.push({ cube: region.cube });
            }
            for (const variant of variants) {
                const g: Group = { cube: variant.cube, on: [], dc: [], q: variant.q };
                for (const piece of region.pieces) {
                    let v: BitValue;
                    if (spec.stateBit !== undefined) {
                        v = piece.next === 'x' ? 'x' : excitationValue(flipflop, spec.port!, variant.q!, piece.next[spec.stateBit]!);
                    } else {
                        v = piece.outputs[spec.flatOutput!]!;
                    }
                    if (v === 1) g.on.push(...piece.inputs);
                    else if (v === 'x') g.dc.push(...piece.inputs);
                }
                if (g.on.length > 0 || g.dc.length > 0) groups.push(g);
            }
        }
        let cover: Cube[];
        let exact = true;
        const on: Cube[] = [];
        const dc: Cube[] = [];
        if (structured) {
            cover = [];
            for (const g of groups) {
                if (g.on.length === 0) continue;
                const inputOn = removeContained(g.on);
                const inputDc = removeContained(g.dc);
                let inputCover: Cube[];
                if (tautology(inputOn, nvars)) inputCover = [universe(nvars)];
                else if (!needsMinimizing(options.functionOnly, inputOn, inputDc, [{ on: inputOn, dc: inputDc }], nvars)) { inputCover = inputOn; exact = false; }
                else {
                    const m = minimize(inputOn, inputDc, nvars, { budgetMs: options.minimizeBudgetMs });
                    exact &&= m.exact;
                    inputCover = verified(m.cover, inputOn, inputDc, nvars) ? m.cover : inputOn;
                }
                let stateLits = g.cube;
                // S·R = 0 on every code, legal or not: S products carry q_i', R products q_i
                // (hot-bit terms alone would let an illegal code assert both).
                if (flipflop === 'SR' && spec.stateBit !== undefined && g.q !== undefined) {
                    stateLits = withVar(stateLits, inputCount + spec.stateBit, g.q === 1 ? ONE : ZERO);
                }
                cover.push(...cubesAnd(inputCover, stateLits, nvars));
            }
            cover = removeContained(cover);
        } else {
            for (const g of groups) {
                on.push(...cubesAnd(g.on, g.cube, nvars));
                dc.push(...cubesAnd(g.dc, g.cube, nvars));
            }
            dc.push(...unusedDontCare);
            // As-built only: decided on the raw covers, before the quadratic containment pass.
            const skip = options.functionOnly !== undefined && !needsMinimizing(options.functionOnly, on, dc, groups, nvars);
            const onCover = skip ? on : removeContained(on);
            const dcCover = skip ? dc : removeContained(dc);
            if (onCover.length === 0) cover = [];
            else if (skip) { cover = onCover; exact = false; }
            else if (tautology(onCover, nvars)) cover = [universe(nvars)];
            else {
                const m = minimize(onCover, dcCover, nvars, { budgetMs: options.minimizeBudgetMs });
                exact = m.exact;
                if (verified(m.cover, onCover, dcCover, nvars)) cover = m.cover;
                else {
                    cover = onCover;
                    exact = false;
                    notes.push(`${spec.name}: the minimizer's cover did not match the specification; the unminimized cover is used`);
                }
            }
            onOf.set(spec.name, onCover);
            dcOf.set(spec.name, dcCover);
        }
        const sets = structured ? {} : { onSet: onOf.get(spec.name), dontCare: dcOf.get(spec.name) };
        equations.push({
            name: spec.name, role: spec.role, stateBit: spec.stateBit, output: spec.output, outputBit: spec.outputBit, cover, exact, ...sets,
        });
    }

    if (options.share && !structured) shareProducts(equations, onOf, dcOf, nvars, options, notes);
    if (flipflop === 'SR' && !structured) repairSetReset(equations, onOf, dcOf, nvars, width, options, notes);

    const outputFlipflops = bitsOut.filter((b) => b.registered).length;
    const cost = networkCost(equations.map((e) => e.cover), nvars, width + outputFlipflops, options.share ?? false);
    const variables = [...table.inputNames, ...Array.from({ length: width }, (_, i) => `q${i}`)];
    return {
        machine, assignment, flipflop, variables, inputCount, equations, cost, outputFlipflops, unusedCodes, notes,
    };
}

/**
 * `share`: multiple-output minimization (boolean/multi-output.ts) over every non-constant
 * equation, so that one AND term can serve several equations; kept only when it verifies and is
 * not dearer, counted with shared products.
 */
function shareProducts(equations: Equation[], onOf: Map<string, Cube[]>, dcOf: Map<string, Cube[]>, nvars: number, options: CodesOptions, notes: string[]): void {
    const idx = equations.map((_, i) => i).filter((i) => {
        const e = equations[i]!;
        return e.cover.length > 0 && !e.cover.some((c) => isUniverse(c, nvars)) && onOf.has(e.name);
    });
    if (idx.length < 2) return;
    const functions = idx.map((i) => ({ on: onOf.get(equations[i]!.name)!, dc: dcOf.get(equations[i]!.name)! }));
    let result;
    try {
        result = minimizeMulti(functions, nvars, { budgetMs: options.minimizeBudgetMs });
    } catch {
        return;
    }
    const before = networkCost(equations.map((e) => e.cover), nvars, 0, true);
    const candidate = [...equations];
    for (const [k, i] of idx.entries()) {
        const cover = result.covers[k]!;
        if (!verified(cover, functions[k]!.on, functions[k]!.dc, nvars)) return;
        candidate[i] = { ...equations[i]!, cover, exact: false };
    }
    const after = networkCost(candidate.map((e) => e.cover), nvars, 0, true);
    if (compareCost(after, before) < 0) {
        equations.splice(0, equations.length, ...candidate);
        notes.push(`shared products: ${before.products} → ${after.products} AND/OR terms`);
    }
}

/** The minimizer's cover must contain the ON-set and stay inside ON ∪ DC (a guard against minimizer bugs). */
function verified(cover: readonly Cube[], on: readonly Cube[], dc: readonly Cube[], nvars: number): boolean {
    if (!coverContainsCover(cover, on, nvars)) return false;
    return coverContainsCover([...on, ...dc], cover, nvars);
}

/**
 * S and R are never both 1 (LANGUAGE.md). Don't-care choices can make them overlap on unused codes
 * or excitation don't-cares; then one of them is re-minimized with the other's cover taken out of
 * its don't-cares (ON_S lies in R's OFF-set and vice versa, so the result is disjoint). Both ways
 * are tried and the cheaper kept, which keeps the choice symmetric under complementing a state bit
 * (that swaps S and R). Falls back to the ON-sets, which are disjoint by the excitation table.
 */
function repairSetReset(equations: Equation[], onOf: Map<string, Cube[]>, dcOf: Map<string, Cube[]>, nvars: number, width: number, options: CodesOptions, notes: string[]): void {
    const remin = (name: string, against: readonly Cube[]): Cube[] | undefined => {
        const on = onOf.get(name)!;
        const dc = coverDifference(dcOf.get(name)!, against, nvars);
        const cover = on.length === 0 ? [] : minimize(on, dc, nvars, { budgetMs: options.minimizeBudgetMs }).cover;
        return verified(cover, on, dc, nvars) && !coversIntersect(cover, against, nvars) ? cover : undefined;
    };
    for (let i = 0; i < width; i++) {
        const si = equations.findIndex((e) => e.name === `s${i}`);
        const ri = equations.findIndex((e) => e.name === `r${i}`);
        const s = equations[si]!;
        const r = equations[ri]!;
        if (!coversIntersect(s.cover, r.cover, nvars)) continue;
        const options2: [Cube[], Cube[]][] = [];
        // S minus R (and R minus S) is always valid: it keeps ON_S (which lies outside R) and stays inside S.
        options2.push([removeContained(coverDifference(s.cover, r.cover, nvars)), [...r.cover]]);
        options2.push([[...s.cover], removeContained(coverDifference(r.cover, s.cover, nvars))]);
        if (!options.quick) {
            const newS = remin(s.name, r.cover);
            if (newS) options2.push([newS, [...r.cover]]);
            const newR = remin(r.name, s.cover);
            if (newR) options2.push([[...s.cover], newR]);
        }
        options2.push([onOf.get(s.name)!, onOf.get(r.name)!]);
        const price = (p: [Cube[], Cube[]]) => networkCost(p, nvars, 0);
        options2.sort((a, b) => price(a).gateInputs - price(b).gateInputs || price(a).literals - price(b).literals);
        const [sc, rc] = options2[0]!;
        equations[si] = { ...s, cover: sc, exact: false };
        equations[ri] = { ...r, cover: rc, exact: false };
        notes.push(`s${i}/r${i}: don't-care choices overlapped; re-minimized so that S·R = 0`);
    }
}

/**
 * Synthesizes a machine. `auto` runs the state-assignment search (auto-encoding.ts); every other
 * encoding uses the fixed codes of encoding.ts.
 */
export function synthesizeFixed(machine: Machine, encoding: Exclude<EncodingKind, 'auto'>, flipflop: FlipFlopKind, options: CodesOptions = {}): SynthesisResult | undefined {
    const assignment = fixedAssignment(machine, encoding);
    if (!assignment) return undefined;
    return synthesizeWithAssignment(synthesisContext(machine, assignment.width), assignment, flipflop, options);
}
