/**
 * Covers (sums of cubes) and the unate recursive paradigm: tautology, complement, containment.
 *
 * A cover is a plain array of cubes over `nvars` variables; functions never mutate their
 * arguments. Recursion splits on the most binate variable, and unate leaves are solved
 * directly, as in the Espresso family of algorithms.
 */
import {
    type Cube, FREE, ONE, ZERO, cofactor, contains, getVar, intersect, isUniverse, literalCount,
    universe, withVar, wordMask, intersects,
} from './cube.js';

export type Cover = readonly Cube[];

/** Cofactor of every cube with respect to p, dropping those disjoint from p. */
export function coverCofactor(f: Cover, p: Cube, nvars: number): Cube[] {
    const r: Cube[] = [];
    for (const c of f) {
        const k = cofactor(c, p, nvars);
        if (k) r.push(k);
    }
    return r;
}

/** Cofactor with respect to the literal (v = value). */
function literalCofactor(f: Cover, v: number, value: 0 | 1, nvars: number): Cube[] {
    const want = value === 1 ? ONE : ZERO;
    const r: Cube[] = [];
    for (const c of f) {
        const field = getVar(c, v);
        if (field === FREE) r.push(c);
        else if (field === want) r.push(withVar(c, v, FREE));
    }
    return r;
}

interface ColumnCounts {
    readonly zeros: Int32Array;
    readonly ones: Int32Array;
}

function columnCounts(f: Cover, nvars: number): ColumnCounts {
    const zeros = new Int32Array(nvars);
    const ones = new Int32Array(nvars);
    for (const c of f) {
        for (let w = 0; w < c.length; w++) {
            const x = c[w]!;
            const mask = wordMask(nvars, w);
            if (x === mask) continue;
            for (let k = 0; k < 16; k++) {
                const field = (x >>> (k << 1)) & 3;
                if (field === ZERO) zeros[w * 16 + k]!++;
                else if (field === ONE) ones[w * 16 + k]!++;
            }
        }
    }
    return { zeros, ones };
}

/** The most binate variable (appears in both phases most often), or -1 when the cover is unate. */
function mostBinate(counts: ColumnCounts, nvars: number): number {
    let best = -1;
    let bestScore = -1;
    for (let v = 0; v < nvars; v++) {
        const z = counts.zeros[v]!;
        const o = counts.ones[v]!;
        if (z > 0 && o > 0) {
            const score = z + o;
            if (score > bestScore) { bestScore = score; best = v; }
        }
    }
    return best;
}

/** The variable that appears most often in any phase, or -1 when every cube is universal. */
function mostFrequent(counts: ColumnCounts, nvars: number): number {
    let best = -1;
    let bestScore = 0;
    for (let v = 0; v < nvars; v++) {
        const score = counts.zeros[v]! + counts.ones[v]!;
        if (score > bestScore) { bestScore = score; best = v; }
    }
    return best;
}

/** True when the cover contains every minterm. */
export function tautology(f: Cover, nvars: number): boolean {
    if (f.length === 0) return false;
    for (const c of f) if (isUniverse(c, nvars)) return true;
    const counts = columnCounts(f, nvars);
    // A unate cover is a tautology only if it has the universal cube (checked above).
    const v = mostBinate(counts, nvars);
    if (v < 0) return false;
    // Quick necessary condition: the minterm count must reach 2^n (skipped: cubes overlap).
    return tautology(literalCofactor(f, v, 0, nvars), nvars) && tautology(literalCofactor(f, v, 1, nvars), nvars);
}

/** True when every minterm of cube c lies in the cover. */
export function coverContainsCube(f: Cover, c: Cube, nvars: number): boolean {
    return tautology(coverCofactor(f, c, nvars), nvars);
}

/** True when every minterm of g lies in f. */
export function coverContainsCover(f: Cover, g: Cover, nvars: number): boolean {
    return g.every((c) => coverContainsCube(f, c, nvars));
}

export function coverEquivalent(f: Cover, g: Cover, nvars: number): boolean {
    return coverContainsCover(f, g, nvars) && coverContainsCover(g, f, nvars);
}

/** Removes cubes contained in another single cube of the cover (single-cube containment). */
export function removeContained(f: Cover): Cube[] {
    const sorted = [...f].sort((a, b) => freeCount(b) - freeCount(a));
    const kept: Cube[] = [];
    outer: for (const c of sorted) {
        for (const k of kept) if (contains(k, c)) continue outer;
        kept.push(c);
    }
    return kept;
}

function freeCount(c: Cube): number {
    let n = 0;
    for (let w = 0; w < c.length; w++) {
        const x = c[w]!;
        n += popcountPairs(x & (x >>> 1) & 0x55555555);
    }
    return n;
}

function popcountPairs(x: number): number {
    let n = 0;
    while (x) { x &= x - 1; n++; }
    return n;
}

/** The complement of a cover, as a cover (not necessarily minimal, but free of contained cubes). */
export function complement(f: Cover, nvars: number): Cube[] {
    if (f.length === 0) return [universe(nvars)];
    for (const c of f) if (isUniverse(c, nvars)) return [];
    if (f.length === 1) return complementCube(f[0]!, nvars);
    const counts = columnCounts(f, nvars);
    let v = mostBinate(counts, nvars);
    if (v < 0) v = mostFrequent(counts, nvars);
    const c0 = complement(literalCofactor(f, v, 0, nvars), nvars);
    const c1 = complement(literalCofactor(f, v, 1, nvars), nvars);
    return mergeWithLiteral(c0, c1, v);
}

/**
 * x'·c0 + x·c1, merging cubes that appear in both halves (they need no literal on x),
 * which keeps complements from growing needlessly.
 */
function mergeWithLiteral(c0: Cube[], c1: Cube[], v: number): Cube[] {
    const key = (c: Cube) => Array.from(c).join(',');
    const in1 = new Map<string, number>();
    c1.forEach((c, i) => in1.set(key(c), i));
    const used1 = new Uint8Array(c1.length);
    const r: Cube[] = [];
    for (const c of c0) {
        const j = in1.get(key(c));
        if (j !== undefined && !used1[j]) {
            used1[j] = 1;
            r.push(c);
        } else {
            r.push(withVar(c, v, ZERO));
        }
    }
    c1.forEach((c, i) => { if (!used1[i]) r.push(withVar(c, v, ONE)); });
    return removeContained(r);
}

/** Complement of one cube as disjoint cubes (De Morgan, made disjoint by prefixing). */
export function complementCube(c: Cube, nvars: number): Cube[] {
    const r: Cube[] = [];
    let prefix = universe(nvars);
    for (let v = 0; v < nvars; v++) {
        const field = getVar(c, v);
        if (field === FREE) continue;
        const opposite = field === ONE ? ZERO : ONE;
        r.push(withVar(prefix, v, opposite));
        prefix = withVar(prefix, v, field);
    }
    return r;
}

/** f ∩ g as a cover. */
export function coverIntersect(f: Cover, g: Cover, nvars: number): Cube[] {
    const r: Cube[] = [];
    for (const a of f) for (const b of g) {
        const c = intersect(a, b, nvars);
        if (c) r.push(c);
    }
    return removeContained(r);
}

/** f ∩ c for one cube c. */
export function coverIntersectCube(f: Cover, c: Cube, nvars: number): Cube[] {
    const r: Cube[] = [];
    for (const a of f) {
        const x = intersect(a, c, nvars);
        if (x) r.push(x);
    }
    return r;
}

export function coverUnion(f: Cover, g: Cover): Cube[] {
    return removeContained([...f, ...g]);
}

/** f minus g. */
export function coverDifference(f: Cover, g: Cover, nvars: number): Cube[] {
    if (g.length === 0) return [...f];
    return coverIntersect(f, complement(g, nvars), nvars);
}

/** True when some minterm lies in both covers. */
export function coversIntersect(f: Cover, g: Cover, nvars: number): boolean {
    for (const a of f) for (const b of g) if (intersects(a, b, nvars)) return true;
    return false;
}

/** Total literal count of a cover. */
export function coverLiterals(f: Cover, nvars: number): number {
    let n = 0;
    for (const c of f) n += literalCount(c, nvars);
    return n;
}

/** Evaluates the cover on a complete assignment (bit v = variable v). */
export function evaluate(f: Cover, bits: readonly (0 | 1)[]): boolean {
    outer: for (const c of f) {
        for (let v = 0; v < bits.length; v++) {
            const field = getVar(c, v);
            if (field === FREE) continue;
            if ((field === ONE) !== (bits[v] === 1)) continue outer;
        }
        return true;
    }
    return false;
}
