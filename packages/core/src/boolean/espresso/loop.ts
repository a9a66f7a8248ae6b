/**
 * The heuristic minimizer: EXPAND, IRREDUNDANT, then REDUCE / EXPAND / IRREDUNDANT until the
 * cost stops falling, then LAST_GASP (reduce every cube on its own, expand the reduced cubes
 * looking for a prime that covers two of them) and round again while that helps.
 *
 * Cost is (products, literals), compared in that order.
 */
import { cpuNow } from '../clock.js';
import { type Cube, wordsFor } from '../cube.js';
import { type ExpandTarget, cubeLiteralCount, expand } from './expand.js';
import { irredundant } from './irredundant.js';
import { reduce, reduceCube } from './reduce.js';
import { complementWithin, coverHasCube, masksFor, popcount32, singleCubeContainment } from './unate.js';

export interface CoverCost { readonly products: number; readonly literals: number }

export function coverCost(f: readonly Cube[], nvars: number): CoverCost {
    let literals = 0;
    for (const c of f) literals += cubeLiteralCount(c, nvars);
    return { products: f.length, literals };
}

export function cheaper(a: CoverCost, b: CoverCost): boolean {
    return a.products < b.products || (a.products === b.products && a.literals < b.literals);
}

export interface HeuristicOptions {
    readonly deadline: number;
    /** Largest OFF-set worth computing; beyond it EXPAND checks containment instead. */
    readonly maxOffCubes?: number;
}

export interface HeuristicResult {
    readonly cover: Cube[];
    /** ON ∪ DC and, when it was affordable, the OFF-set (reused by the exact step). */
    readonly target: ExpandTarget;
    /** How many cubes of the first prime cover were essential primes (0 when the loop did not run). */
    readonly essentialCount?: number;
}

export function espressoHeuristic(on: readonly Cube[], dc: readonly Cube[], nvars: number, options: HeuristicOptions): HeuristicResult {
    const words = wordsFor(nvars);
    let f = singleCubeContainment(on, words);
    const care = singleCubeContainment([...f, ...dc], words);
    const maxOff = options.maxOffCubes ?? Math.max(2000, 20 * care.length);
    // The cube-count budget decides (deterministic); the time cap is a safety net.
    const off = complementWithin(care, nvars, maxOff, Math.min(options.deadline, cpuNow() + 1000));
    const target: ExpandTarget = { off, care };
    if (f.length === 0) return { cover: [], target };
    // Only the containment path (no affordable OFF-set: wide functions) can run long enough to need
    // the deadline inside one pass; with an OFF-set the first pass always completes, which keeps
    // small functions' covers independent of how loaded the machine is.
    const interruptible = off === null;
    const passDeadline = interruptible ? options.deadline : Infinity;
    f = expand(f, nvars, target, passDeadline);
    if (cpuNow() >= passDeadline) return { cover: f, target, essentialCount: 0 };
    f = irredundant(f, dc, nvars);
    if (cpuNow() >= passDeadline) return { cover: f, target, essentialCount: 0 };
    // Essential primes are in every minimal cover: set them aside as don't-cares for the loop,
    // which then works on fewer cubes.
    const essentials = essentialPrimes(f, dc, nvars);
    if (essentials.length > 0) {
        const rest = f.filter((c) => !essentials.includes(c));
        const inner = improve(rest, [...dc, ...essentials], nvars, target, options.deadline);
        return { cover: [...essentials, ...inner], target, essentialCount: essentials.length };
    }
    return { cover: improve(f, dc, nvars, target, options.deadline), target, essentialCount: 0 };
}

/** The REDUCE / EXPAND / IRREDUNDANT loop with LAST_GASP on a cover of primes. */
function improve(f: Cube[], dc: readonly Cube[], nvars: number, target: ExpandTarget, deadline: number): Cube[] {
    const options = { deadline };
    let cost = coverCost(f, nvars);
    for (;;) {
        while (cpuNow() < options.deadline) {
            const g = irredundant(expand(reduce(f, dc, nvars), nvars, target, target.off === null ? options.deadline : Infinity), dc, nvars);
            const gc = coverCost(g, nvars);
            if (!cheaper(gc, cost)) break;
            f = g;
            cost = gc;
        }
        if (cpuNow() >= options.deadline) break;
        const g = lastGasp(f, dc, nvars, target);
        const gc = coverCost(g, nvars);
        if (!cheaper(gc, cost)) break;
        f = g;
        cost = gc;
    }
    return f;
}

/**
 * The essential primes of a prime cover f (with don't-cares dc): p is essential exactly when
 * the consensus of p with the other cubes of f ∪ dc does not cover p.
 */
export function essentialPrimes(f: readonly Cube[], dc: readonly Cube[], nvars: number): Cube[] {
    const words = wordsFor(nvars);
    const all = [...f, ...dc];
    const masks = masksFor(nvars);
    const out: Cube[] = [];
    const h: Cube[] = [];
    for (let i = 0; i < f.length; i++) {
        const p = f[i]!;
        h.length = 0;
        for (let j = 0; j < all.length; j++) {
            if (j === i) continue;
            const q = all[j]!;
            let conflicts = 0;
            let cw = 0;
            let cbits = 0;
            for (let w = 0; w < words && conflicts < 2; w++) {
                const x = (p[w]! & q[w]!) >>> 0;
                const empty = ~(x | (x >>> 1)) & 0x55555555 & masks[w]!;
                if (empty !== 0) {
                    conflicts += popcount32(empty);
                    cw = w;
                    cbits = empty;
                }
            }
            if (conflicts > 1) continue;
            const r = new Uint32Array(words);
            for (let w = 0; w < words; w++) r[w] = p[w]! & q[w]!;
            if (conflicts === 1) r[cw] = (r[cw]! | cbits | (cbits << 1)) >>> 0;
            h.push(r);
        }
        if (!coverHasCube(h, p, nvars)) out.push(p);
    }
    return out;
}

/**
 * Reduce each cube against all the others independently (not in sequence), expand the
 * reduced cubes among themselves, and keep any new prime that covers at least two of them.
 */
export function lastGasp(f: readonly Cube[], dc: readonly Cube[], nvars: number, target: ExpandTarget): Cube[] {
    const reduced: Cube[] = [];
    for (let i = 0; i < f.length; i++) {
        const r = reduceCube(f, i, dc, nvars);
        if (r === null) continue;
        let same = true;
        for (let w = 0; w < r.length; w++) if (r[w] !== f[i]![w]) { same = false; break; }
        if (!same) reduced.push(r);
    }
    if (reduced.length < 2) return [...f];
    const primes = expand(reduced, nvars, target);
    const words = wordsFor(nvars);
    const useful = primes.filter((p) => {
        let n = 0;
        for (const r of reduced) {
            let inside = true;
            for (let w = 0; w < words; w++) if (((p[w]! & r[w]!) >>> 0) !== r[w]) { inside = false; break; }
            if (inside && ++n >= 2) return true;
        }
        return false;
    });
    if (useful.length === 0) return [...f];
    return irredundant(singleCubeContainment([...f, ...useful], words), dc, nvars);
}
