/**
 * All prime implicants of a cover, by the recursive (Shannon) method: the primes of
 * x'·f0 + x·f1 are the maximal cubes among x'·P(f0), x·P(f1) and the pairwise intersections
 * of P(f0) and P(f1) (which include every prime of f0·f1). A unate cover's primes are its
 * cubes after single-cube containment.
 */
import { cpuNow } from './clock.js';
import { type Cube, wordMask, wordsFor } from './cube.js';
import { literalCofactor, mostBinate, phaseCounts, singleCubeContainment } from './espresso/unate.js';

class TooManyPrimes extends Error {}

/** The primes of f, or null when there are more than `limit` (at any level) or time runs out. */
export function allPrimes(f: readonly Cube[], nvars: number, limit: number, deadline = Infinity): Cube[] | null {
    const words = wordsFor(nvars);
    const masks = new Uint32Array(words);
    for (let w = 0; w < words; w++) masks[w] = wordMask(nvars, w);
    try {
        return primesOf(singleCubeContainment(f, words), nvars, masks, { limit, deadline, calls: 0 });
    } catch (e) {
        if (e instanceof TooManyPrimes) return null;
        throw e;
    }
}

interface PrimeBudget { readonly limit: number; readonly deadline: number; calls: number }

function primesOf(f: Cube[], nvars: number, masks: Uint32Array, b: PrimeBudget): Cube[] {
    if ((++b.calls & 63) === 0 && cpuNow() > b.deadline) throw new TooManyPrimes();
    const words = masks.length;
    if (f.length <= 1) return f;
    for (const c of f) {
        let u = true;
        for (let w = 0; w < words; w++) if (c[w] !== masks[w]) { u = false; break; }
        if (u) return [c];
    }
    const k = phaseCounts(f, nvars);
    const v = mostBinate(k, nvars);
    if (v < 0) return f;
    const p0 = primesOf(singleCubeContainment(literalCofactor(f, v, 0, nvars), words), nvars, masks, b);
    const p1 = primesOf(singleCubeContainment(literalCofactor(f, v, 1, nvars), words), nvars, masks, b);
    // The merge costs about |P0|·|P1| intersections, each checked against the primes kept.
    if (p0.length * p1.length * (p0.length + p1.length) > 40_000_000) throw new TooManyPrimes();
    if (cpuNow() > b.deadline) throw new TooManyPrimes();
    const w = v >>> 4;
    const shift = (v & 15) << 1;
    const low = 0x55555555;
    const cand: Cube[] = [];
    if (words === 1) {
        // One-word cubes: candidates as plain numbers, a cube allocated only for those kept
        // (same candidates in the same order as the general path, so the same primes).
        const m = masks[0]! & low;
        const vals: number[] = [];
        for (const a of p0) {
            const a0 = a[0]!;
            for (const c of p1) {
                const x = (a0 & c[0]!) >>> 0;
                if (((x | (x >>> 1)) & m) !== m) continue;
                vals.push(x);
            }
        }
        for (const a of p0) vals.push((a[0]! & ~(2 << shift)) >>> 0);
        for (const c of p1) vals.push((c[0]! & ~(1 << shift)) >>> 0);
        const kept = containmentFreeWord(vals, b);
        if (kept.length > b.limit) throw new TooManyPrimes();
        return kept;
    } else {
        for (const a of p0) for (const c of p1) {
            let ok = true;
            for (let i = 0; i < words; i++) {
                const x = a[i]! & c[i]!;
                const m = masks[i]! & low;
                if (((x | (x >>> 1)) & m) !== m) { ok = false; break; }
            }
            if (!ok) continue;
            const r = new Uint32Array(words);
            for (let i = 0; i < words; i++) r[i] = a[i]! & c[i]!;
            cand.push(r);
        }
    }
    for (const a of p0) { const r = a.slice(); r[w] = (r[w]! & ~(2 << shift)) >>> 0; cand.push(r); }
    for (const c of p1) { const r = c.slice(); r[w] = (r[w]! & ~(1 << shift)) >>> 0; cand.push(r); }
    const r = containmentFree(cand, words, b);
    if (r.length > b.limit) throw new TooManyPrimes();
    return r;
}

/** containmentFree for one-word cubes given as numbers: the kept ones, in the same order, as cubes. */
function containmentFreeWord(vals: readonly number[], b: PrimeBudget): Cube[] {
    const low = 0x55555555;
    const size = new Float64Array(vals.length);
    for (let i = 0; i < vals.length; i++) {
        const v = vals[i]!;
        let x = v & (v >>> 1) & low;
        let n = 0;
        while (x) { x &= x - 1; n++; }
        size[i] = (1000 - n) * 4194304 + i; // most free variables first
    }
    size.sort();
    const keptVals = new Uint32Array(Math.min(vals.length, b.limit + 1));
    const kept: Cube[] = [];
    let nk = 0;
    for (let k = 0; k < size.length; k++) {
        if ((k & 1023) === 0 && cpuNow() > b.deadline) throw new TooManyPrimes();
        const v = vals[size[k]! % 4194304]!;
        let inside = false;
        for (let j = 0; j < nk; j++) if (((keptVals[j]! & v) >>> 0) === v) { inside = true; break; }
        if (inside) continue;
        if (nk >= keptVals.length) throw new TooManyPrimes();
        keptVals[nk++] = v;
        kept.push(Uint32Array.of(v));
    }
    return kept;
}

/** singleCubeContainment with deadline and size checks (the merge can be large). */
function containmentFree(f: Cube[], words: number, b: PrimeBudget): Cube[] {
    const low = 0x55555555;
    const size = new Float64Array(f.length);
    for (let i = 0; i < f.length; i++) {
        const c = f[i]!;
        let n = 0;
        for (let w = 0; w < words; w++) {
            let x = c[w]! & (c[w]! >>> 1) & low;
            while (x) { x &= x - 1; n++; }
        }
        size[i] = (1000 - n) * 4194304 + i; // most free variables first
    }
    size.sort();
    if (words === 1) {
        // One-word cubes: compare plain numbers.
        const keptVals = new Uint32Array(Math.min(f.length, b.limit + 1));
        const kept1: Cube[] = [];
        let nk = 0;
        for (let k = 0; k < size.length; k++) {
            if ((k & 1023) === 0 && cpuNow() > b.deadline) throw new TooManyPrimes();
            const c = f[size[k]! % 4194304]!;
            const v = c[0]!;
            let inside = false;
            for (let j = 0; j < nk; j++) if (((keptVals[j]! & v) >>> 0) === v) { inside = true; break; }
            if (inside) continue;
            if (nk >= keptVals.length) throw new TooManyPrimes();
            keptVals[nk++] = v;
            kept1.push(c);
        }
        return kept1;
    }
    const kept: Cube[] = [];
    for (let k = 0; k < size.length; k++) {
        if ((k & 255) === 0 && cpuNow() > b.deadline) throw new TooManyPrimes();
        const c = f[size[k]! % 4194304]!;
        let inside = false;
        for (const q of kept) {
            let sub = true;
            for (let w = 0; w < words; w++) if (((q[w]! & c[w]!) >>> 0) !== c[w]) { sub = false; break; }
            if (sub) { inside = true; break; }
        }
        if (!inside) {
            kept.push(c);
            if (kept.length > b.limit) throw new TooManyPrimes();
        }
    }
    return kept;
}
