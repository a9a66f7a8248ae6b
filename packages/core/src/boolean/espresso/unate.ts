/**
 * The unate recursive paradigm, tuned for the minimizer: tautology with unate reduction,
 * complement with a size budget, and the supercube of a complement (used by REDUCE).
 *
 * Cubes follow cube.ts (2 bits per variable, 01 = 0, 10 = 1, 11 = free). Functions never
 * mutate their arguments.
 */
import { cpuNow } from '../clock.js';
import { type Cube, ONE, ZERO, universe, wordMask, wordsFor } from '../cube.js';
import { WordBudgetExceeded, complementWord, scccWord, tautWord, tautWordFill } from './word.js';

const LOW = 0x55555555;

/** Low bit of every literal (non-free, non-empty) field of word x, restricted to `mask`. */
export function literalBits(x: number, mask: number): number {
    return (x ^ (x >>> 1)) & LOW & mask;
}

export function popcount32(x: number): number {
    x = x - ((x >>> 1) & 0x55555555);
    x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
    return (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}

/** Per-variable phase counts of a cover. */
export interface PhaseCounts {
    readonly zeros: Int32Array;
    readonly ones: Int32Array;
}

export function phaseCounts(f: readonly Cube[], nvars: number): PhaseCounts {
    const zeros = new Int32Array(nvars);
    const ones = new Int32Array(nvars);
    const words = wordsFor(nvars);
    for (const c of f) {
        for (let w = 0; w < words; w++) {
            const x = c[w]!;
            let lit = literalBits(x, wordMask(nvars, w));
            while (lit !== 0) {
                const b = lit & -lit;
                const pos = 31 - Math.clz32(b);
                const v = w * 16 + (pos >>> 1);
                if (((x >>> pos) & 3) === ZERO) zeros[v]!++;
                else ones[v]!++;
                lit ^= b;
            }
        }
    }
    return { zeros, ones };
}

/** Most binate variable (both phases present, most literals), or -1. */
export function mostBinate(k: PhaseCounts, nvars: number): number {
    let best = -1;
    let bestScore = -1;
    for (let v = 0; v < nvars; v++) {
        const z = k.zeros[v]!;
        const o = k.ones[v]!;
        if (z > 0 && o > 0) {
            // Prefer balanced splits among equally frequent variables.
            const score = (z + o) * 1024 - Math.abs(z - o);
            if (score > bestScore) { bestScore = score; best = v; }
        }
    }
    return best;
}

/** Variable with the most literals, or -1 when every cube is universal. */
export function mostFrequent(k: PhaseCounts, nvars: number): number {
    let best = -1;
    let bestScore = 0;
    for (let v = 0; v < nvars; v++) {
        const s = k.zeros[v]! + k.ones[v]!;
        if (s > bestScore) { bestScore = s; best = v; }
    }
    return best;
}

/** Cofactor with respect to the literal (v = value): cubes with v free or equal, v made free. */
export function literalCofactor(f: readonly Cube[], v: number, value: 0 | 1, nvars: number): Cube[] {
    void nvars;
    const want = value === 1 ? ONE : ZERO;
    const w = v >>> 4;
    const shift = (v & 15) << 1;
    const r: Cube[] = [];
    for (const c of f) {
        const field = (c[w]! >>> shift) & 3;
        if (field === 3) r.push(c);
        else if (field === want) {
            const k = c.slice();
            k[w] = (k[w]! | (3 << shift)) >>> 0;
            r.push(k);
        }
    }
    return r;
}

/** Cofactor of every cube of f with respect to cube p (cubes disjoint from p dropped). */
export function cubeCofactor(f: readonly Cube[], p: Cube, nvars: number, out: Cube[] = []): Cube[] {
    const masks = masksFor(nvars);
    const words = masks.length;
    if (words === 1) {
        // One-word fast path (up to 16 variables).
        const m = masks[0]! & LOW;
        const p0 = p[0]!;
        const lit = literalBits(p0, masks[0]!);
        const litMask = (lit | (lit << 1)) >>> 0;
        for (const c of f) {
            const x = c[0]! & p0;
            if (((x | (x >>> 1)) & m) !== m) continue;
            const y = (c[0]! | litMask) >>> 0;
            if (y === c[0]) { out.push(c); continue; }
            const k = new Uint32Array(1);
            k[0] = y;
            out.push(k);
        }
        return out;
    }
    const litMask = new Uint32Array(words);
    for (let w = 0; w < words; w++) {
        const lit = literalBits(p[w]!, masks[w]!);
        litMask[w] = (lit | (lit << 1)) >>> 0;
    }
    outer: for (const c of f) {
        for (let w = 0; w < words; w++) {
            const x = c[w]! & p[w]!;
            const m = masks[w]! & LOW;
            if (((x | (x >>> 1)) & m) !== m) continue outer;
        }
        // Cubes already free where p has literals are their own cofactor: no copy needed.
        let same = true;
        for (let w = 0; w < words; w++) if (((c[w]! | litMask[w]!) >>> 0) !== c[w]) { same = false; break; }
        if (same) { out.push(c); continue; }
        const k = new Uint32Array(words);
        for (let w = 0; w < words; w++) k[w] = (c[w]! | litMask[w]!) >>> 0;
        out.push(k);
    }
    return out;
}

function isUniverseCube(c: Cube, masks: Uint32Array): boolean {
    for (let w = 0; w < masks.length; w++) if (c[w] !== masks[w]) return false;
    return true;
}

const maskCache = new Map<number, Uint32Array>();

/** wordMask for every word, cached per variable count (callers must not modify it). */
export function masksFor(nvars: number): Uint32Array {
    let m = maskCache.get(nvars);
    if (m) return m;
    const words = wordsFor(nvars);
    m = new Uint32Array(words);
    for (let w = 0; w < words; w++) m[w] = wordMask(nvars, w);
    maskCache.set(nvars, m);
    return m;
}

function cubeLiterals(c: Cube, masks: Uint32Array): number {
    let n = 0;
    for (let w = 0; w < masks.length; w++) n += popcount32(literalBits(c[w]!, masks[w]!));
    return n;
}

/** True when the cover contains every minterm of the space. */
export function isTautology(f: readonly Cube[], nvars: number): boolean {
    const masks = masksFor(nvars);
    if (masks.length === 1) return tautWord(wordValues(f), masks[0]!);
    return taut(f, nvars, masks);
}

function wordValues(f: readonly Cube[]): Uint32Array {
    const vals = new Uint32Array(f.length);
    for (let i = 0; i < f.length; i++) vals[i] = f[i]![0]!;
    return vals;
}

function taut(f: readonly Cube[], nvars: number, masks: Uint32Array): boolean {
    if (f.length === 0) return false;
    // One pass: phase counts per variable, and the volume (the cubes together must hold at
    // least 2^n minterms — a necessary condition).
    const words = masks.length;
    const k: PhaseCounts = { zeros: new Int32Array(nvars), ones: new Int32Array(nvars) };
    let volume = 0;
    for (const c of f) {
        let n = 0;
        for (let w = 0; w < words; w++) {
            const x = c[w]!;
            let lit = literalBits(x, masks[w]!);
            while (lit !== 0) {
                const b = lit & -lit;
                const pos = 31 - Math.clz32(b);
                const v = w * 16 + (pos >>> 1);
                if (((x >>> pos) & 3) === ZERO) k.zeros[v]!++;
                else k.ones[v]!++;
                lit ^= b;
                n++;
            }
        }
        if (n === 0) return true;
        volume += 2 ** -n;
    }
    if (volume < 1 - 1e-9) return false;
    // Unate reduction: for a variable that appears in one phase only, F is a tautology iff the
    // cubes that do not mention it are (F restricted to the other phase).
    const unate = new Uint32Array(words);
    let anyUnate = false;
    for (let v = 0; v < nvars; v++) {
        const z = k.zeros[v]!;
        const o = k.ones[v]!;
        if ((z > 0) !== (o > 0)) {
            unate[v >>> 4]! |= 1 << ((v & 15) << 1);
            anyUnate = true;
        }
    }
    if (anyUnate) {
        const g: Cube[] = [];
        outer: for (const c of f) {
            for (let w = 0; w < words; w++) if ((literalBits(c[w]!, masks[w]!) & unate[w]!) !== 0) continue outer;
            g.push(c);
        }
        if (g.length < f.length) return taut(g, nvars, masks);
    }
    const v = mostBinate(k, nvars);
    if (v < 0) return false;
    // Try the majority phase first: it drops the minority cubes, often leaving a cover unate
    // enough to fail fast (a one-hot cover with one all-zero cube is the typical case).
    const first: 0 | 1 = k.ones[v]! >= k.zeros[v]! ? 1 : 0;
    return taut(literalCofactor(f, v, first, nvars), nvars, masks) && taut(literalCofactor(f, v, first === 1 ? 0 : 1, nvars), nvars, masks);
}

/** True when every minterm of cube c lies in the cover f. */
export function coverHasCube(f: readonly Cube[], c: Cube, nvars: number): boolean {
    const masks = masksFor(nvars);
    if (masks.length === 1) {
        // One word: cofactor straight into plain numbers, no cube objects.
        const mask = masks[0]!;
        const m = mask & LOW;
        const p0 = c[0]!;
        const lit = literalBits(p0, mask);
        const litMask = (lit | (lit << 1)) >>> 0;
        return tautWordFill(f.length, mask, (out, start) => {
            let k = start;
            for (let i = 0; i < f.length; i++) {
                const x0 = f[i]![0]!;
                const x = x0 & p0;
                if (((x | (x >>> 1)) & m) !== m) continue;
                out[k++] = (x0 | litMask) >>> 0;
            }
            return k - start;
        });
    }
    return isTautology(cubeCofactor(f, c, nvars), nvars);
}

/**
 * coverHasCube(f without f[skip], then extra…, c) without building that cover: IRREDUNDANT asks
 * it once per cube, and the copies were most of its time.
 */
export function coverHasCubeExcept(f: readonly Cube[], skip: number, extra: readonly Cube[], c: Cube, nvars: number): boolean {
    const masks = masksFor(nvars);
    if (masks.length !== 1) {
        const others: Cube[] = [];
        for (let j = 0; j < f.length; j++) if (j !== skip) others.push(f[j]!);
        for (const d of extra) others.push(d);
        return isTautology(cubeCofactor(others, c, nvars), nvars);
    }
    const mask = masks[0]!;
    const m = mask & LOW;
    const p0 = c[0]!;
    const lit = literalBits(p0, mask);
    const litMask = (lit | (lit << 1)) >>> 0;
    return tautWordFill(f.length + extra.length, mask, (out, start) => {
        let k = start;
        for (let i = 0; i < f.length; i++) {
            if (i === skip) continue;
            const x0 = f[i]![0]!;
            const x = x0 & p0;
            if (((x | (x >>> 1)) & m) === m) out[k++] = (x0 | litMask) >>> 0;
        }
        for (let i = 0; i < extra.length; i++) {
            const x0 = extra[i]![0]!;
            const x = x0 & p0;
            if (((x | (x >>> 1)) & m) === m) out[k++] = (x0 | litMask) >>> 0;
        }
        return k - start;
    });
}

/**
 * Supercube of the complement of f (the smallest cube containing every minterm not in f),
 * or null when f is a tautology.
 */
export function complementSupercube(f: readonly Cube[], nvars: number): Cube | null {
    const masks = masksFor(nvars);
    if (masks.length === 1) {
        const s = scccWord(wordValues(f), masks[0]!);
        return s === -1 ? null : Uint32Array.of(s);
    }
    return sccc(f, nvars, masks);
}

function sccc(f: readonly Cube[], nvars: number, masks: Uint32Array): Cube | null {
    if (f.length === 0) return universe(nvars);
    for (const c of f) if (isUniverseCube(c, masks)) return null;
    if (f.length === 1) {
        const c = f[0]!;
        if (cubeLiterals(c, masks) !== 1) return universe(nvars);
        // Complement of a single literal is the opposite literal.
        const r = new Uint32Array(masks.length);
        for (let w = 0; w < masks.length; w++) {
            const lit = literalBits(c[w]!, masks[w]!);
            const litMask = (lit | (lit << 1)) >>> 0;
            r[w] = ((masks[w]! & ~litMask) | ((~c[w]! & litMask))) >>> 0;
        }
        return r;
    }
    const k = phaseCounts(f, nvars);
    let v = mostBinate(k, nvars);
    if (v < 0) v = mostFrequent(k, nvars);
    const f0 = literalCofactor(f, v, 0, nvars);
    const f1 = literalCofactor(f, v, 1, nvars);
    const s0 = sccc(f0, nvars, masks);
    if (s0 !== null && isUniverseCube(s0, masks)) {
        // The result is universal unless the other half is a tautology.
        if (!taut(f1, nvars, masks)) return s0;
        const r = s0.slice();
        setField(r, v, ZERO);
        return r;
    }
    const s1 = sccc(f1, nvars, masks);
    if (s0 === null && s1 === null) return null;
    if (s0 === null) { const r = s1!.slice(); setField(r, v, ONE); return r; }
    if (s1 === null) { const r = s0.slice(); setField(r, v, ZERO); return r; }
    const r = new Uint32Array(masks.length);
    for (let w = 0; w < masks.length; w++) r[w] = (s0[w]! | s1[w]!) >>> 0;
    return r;
}

function setField(c: Cube, v: number, value: number): void {
    const w = v >>> 4;
    const shift = (v & 15) << 1;
    c[w] = ((c[w]! & ~(3 << shift)) | (value << shift)) >>> 0;
}

/** Thrown inside the complement recursion when the budget runs out. */
class BudgetExceeded extends Error {}

/**
 * Complement of f as a cover, or null when it would exceed `maxCubes` cubes or the deadline
 * (the complement of a one-hot style cover grows exponentially, so callers need a way out).
 */
export function complementWithin(f: readonly Cube[], nvars: number, maxCubes: number, deadline = Infinity): Cube[] | null {
    const masks = masksFor(nvars);
    if (masks.length === 1) {
        try {
            const r = complementWord(wordValues(f), masks[0]!, { left: maxCubes * 8, maxCubes, deadline, calls: 0, now: cpuNow });
            if (r.length > maxCubes) return null;
            return Array.from(r, (v) => Uint32Array.of(v));
        } catch (e) {
            if (e instanceof WordBudgetExceeded) return null;
            throw e;
        }
    }
    const budget = { left: maxCubes * 8, maxCubes, deadline, calls: 0 };
    try {
        const r = compl(f, nvars, masks, budget);
        return r.length > maxCubes ? null : r;
    } catch (e) {
        if (e instanceof BudgetExceeded) return null;
        throw e;
    }
}

interface ComplementBudget { left: number; readonly maxCubes: number; readonly deadline: number; calls: number }

function compl(f: readonly Cube[], nvars: number, masks: Uint32Array, b: ComplementBudget): Cube[] {
    if ((++b.calls & 255) === 0 && cpuNow() > b.deadline) throw new BudgetExceeded();
    if (f.length === 0) return [universe(nvars)];
    for (const c of f) if (isUniverseCube(c, masks)) return [];
    if (f.length === 1) {
        // De Morgan: one cube per literal, each the opposite literal alone.
        const c = f[0]!;
        const r: Cube[] = [];
        for (let w = 0; w < masks.length; w++) {
            let lit = literalBits(c[w]!, masks[w]!);
            while (lit !== 0) {
                const bit = lit & -lit;
                const pos = 31 - Math.clz32(bit);
                const k = universe(nvars);
                const field = (c[w]! >>> pos) & 3;
                k[w] = ((k[w]! & ~(3 << pos)) | ((field ^ 3) << pos)) >>> 0;
                r.push(k);
                lit ^= bit;
            }
        }
        b.left -= r.length;
        if (b.left < 0) throw new BudgetExceeded();
        return r;
    }
    const k = phaseCounts(f, nvars);
    let v = mostBinate(k, nvars);
    if (v < 0) v = mostFrequent(k, nvars);
    const c0 = compl(literalCofactor(f, v, 0, nvars), nvars, masks, b);
    const c1 = compl(literalCofactor(f, v, 1, nvars), nvars, masks, b);
    const r = mergeHalves(c0, c1, v, masks);
    b.left -= r.length;
    if (b.left < 0 || r.length > b.maxCubes) throw new BudgetExceeded();
    return r;
}

/**
 * x'·c0 + x·c1 with lifting: a cube of one half contained in a cube of the other half needs
 * no literal on x (x'a + xb = a + xb when a ⊆ b).
 */
function mergeHalves(c0: Cube[], c1: Cube[], v: number, masks: Uint32Array): Cube[] {
    const w = v >>> 4;
    const shift = (v & 15) << 1;
    const words = masks.length;
    const containedIn = (a: Cube, list: Cube[]): boolean => {
        outer: for (const b of list) {
            for (let i = 0; i < words; i++) if (((a[i]! & b[i]!) >>> 0) !== a[i]) continue outer;
            return true;
        }
        return false;
    };
    const small = c0.length * c1.length <= 250_000;
    // Only lifted cubes (no literal on x) can contain others: the halves are each free of
    // contained cubes, and a cube with a literal on x cannot contain one without.
    const lifted: Cube[] = [];
    const fixed: Cube[] = [];
    for (const a of c0) {
        if (small && containedIn(a, c1)) { lifted.push(a); continue; }
        const k = a.slice();
        k[w] = ((k[w]! & ~(3 << shift)) | (ZERO << shift)) >>> 0;
        fixed.push(k);
    }
    for (const b of c1) {
        if (small && containedIn(b, c0)) { lifted.push(b); continue; }
        const k = b.slice();
        k[w] = ((k[w]! & ~(3 << shift)) | (ONE << shift)) >>> 0;
        fixed.push(k);
    }
    if (lifted.length === 0) return fixed;
    const kept = singleCubeContainment(lifted, words);
    for (const k of fixed) if (!containedIn(k, kept)) kept.push(k);
    return kept;
}

/** Removes cubes contained in another cube of the list (and duplicates). */
export function singleCubeContainment(f: readonly Cube[], words: number): Cube[] {
    if (f.length < 2) return [...f];
    if (words === 1) return singleWordContainment(f);
    const size = f.map((c) => {
        let n = 0;
        for (let i = 0; i < words; i++) { const x = c[i]!; n += popcount32(x & (x >>> 1) & LOW); }
        return n;
    });
    const order = f.map((_, i) => i).sort((a, b) => size[b]! - size[a]!);
    const kept: Cube[] = [];
    outer: for (const i of order) {
        const c = f[i]!;
        for (const k of kept) {
            let inside = true;
            for (let j = 0; j < words; j++) if (((k[j]! & c[j]!) >>> 0) !== c[j]) { inside = false; break; }
            if (inside) continue outer;
        }
        kept.push(c);
    }
    return kept;
}

/** singleCubeContainment for one-word cubes, comparing plain numbers. */
function singleWordContainment(f: readonly Cube[]): Cube[] {
    const keys = new Float64Array(f.length);
    for (let i = 0; i < f.length; i++) {
        const x = f[i]![0]!;
        // most free variables first; ties by position (stable)
        keys[i] = (32 - popcount32(x & (x >>> 1) & LOW)) * 4194304 + i;
    }
    keys.sort();
    const kept: Cube[] = [];
    const vals = new Uint32Array(f.length);
    let n = 0;
    outer: for (let k = 0; k < keys.length; k++) {
        const c = f[keys[k]! % 4194304]!;
        const v = c[0]!;
        for (let j = 0; j < n; j++) if (((vals[j]! & v) >>> 0) === v) continue outer;
        vals[n++] = v;
        kept.push(c);
    }
    return kept;
}
