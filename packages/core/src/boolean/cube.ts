/**
 * Cubes in positional notation: two bits per variable, packed 16 variables to a 32-bit word.
 *
 *   01 — the variable is 0 (complemented literal)
 *   10 — the variable is 1 (positive literal)
 *   11 — the variable is free (no literal)
 *   00 — empty: the cube contains no minterm
 *
 * With this encoding intersection is a bitwise AND and containment a masked compare, which is
 * why every analysis and the minimizer work on it.
 */

export type Cube = Uint32Array;

/** The value of one variable in a cube. */
export const ZERO = 1;
export const ONE = 2;
export const FREE = 3;
export const EMPTY = 0;
export type VarValue = typeof ZERO | typeof ONE | typeof FREE | typeof EMPTY;

const VARS_PER_WORD = 16;

export function wordsFor(nvars: number): number {
    return Math.max(1, Math.ceil(nvars / VARS_PER_WORD));
}

/** Mask of the bits in use in word `w` of a cube over `nvars` variables. */
export function wordMask(nvars: number, w: number): number {
    const used = Math.min(VARS_PER_WORD, nvars - w * VARS_PER_WORD);
    if (used <= 0) return 0;
    return used === VARS_PER_WORD ? 0xffffffff >>> 0 : ((1 << (used * 2)) - 1) >>> 0;
}

/** The universal cube (every variable free). */
export function universe(nvars: number): Cube {
    const words = wordsFor(nvars);
    const c = new Uint32Array(words);
    for (let w = 0; w < words; w++) c[w] = wordMask(nvars, w);
    return c;
}

export function getVar(c: Cube, v: number): VarValue {
    return ((c[v >>> 4]! >>> ((v & 15) << 1)) & 3) as VarValue;
}

/** Returns a copy of `c` with variable `v` set to `value`. */
export function withVar(c: Cube, v: number, value: VarValue): Cube {
    const r = c.slice();
    setVarInPlace(r, v, value);
    return r;
}

export function setVarInPlace(c: Cube, v: number, value: VarValue): void {
    const w = v >>> 4;
    const shift = (v & 15) << 1;
    c[w] = ((c[w]! & ~(3 << shift)) | (value << shift)) >>> 0;
}

/** A cube fixing the listed variables: `literals` maps variable → 0 or 1. */
export function cubeOf(nvars: number, literals: Iterable<readonly [number, 0 | 1]>): Cube {
    const c = universe(nvars);
    for (const [v, bit] of literals) setVarInPlace(c, v, bit === 1 ? ONE : ZERO);
    return c;
}

/** The minterm cube of a complete assignment (bit v of `bits` is variable v). */
export function mintermCube(nvars: number, bits: (v: number) => 0 | 1): Cube {
    const c = universe(nvars);
    for (let v = 0; v < nvars; v++) setVarInPlace(c, v, bits(v) === 1 ? ONE : ZERO);
    return c;
}

/** True when some variable field is 00. `nvars` bounds the scan. */
export function isEmpty(c: Cube, nvars: number): boolean {
    for (let w = 0; w < c.length; w++) {
        const x = c[w]!;
        const mask = wordMask(nvars, w);
        // A field is empty when both of its bits are 0: look for such a field.
        const lo = x & 0x55555555;
        const hi = (x >>> 1) & 0x55555555;
        if (((lo | hi) & (mask & 0x55555555)) !== (mask & 0x55555555)) return true;
    }
    return false;
}

/** a ∩ b, or null when empty. */
export function intersect(a: Cube, b: Cube, nvars: number): Cube | null {
    const r = new Uint32Array(a.length);
    for (let w = 0; w < a.length; w++) r[w] = a[w]! & b[w]!;
    return isEmpty(r, nvars) ? null : r;
}

export function intersects(a: Cube, b: Cube, nvars: number): boolean {
    for (let w = 0; w < a.length; w++) {
        const x = a[w]! & b[w]!;
        const mask = wordMask(nvars, w) & 0x55555555;
        if (((x | (x >>> 1)) & mask) !== mask) return false;
    }
    return true;
}

/** Number of variables in which a and b conflict (their intersection is empty there). */
export function distance(a: Cube, b: Cube, nvars: number): number {
    let d = 0;
    for (let w = 0; w < a.length; w++) {
        const x = a[w]! & b[w]!;
        const mask = wordMask(nvars, w) & 0x55555555;
        d += popcount(~(x | (x >>> 1)) & mask);
    }
    return d;
}

/** a ⊇ b. */
export function contains(a: Cube, b: Cube): boolean {
    for (let w = 0; w < a.length; w++) if (((a[w]! & b[w]!) >>> 0) !== b[w]!) return false;
    return true;
}

export function equals(a: Cube, b: Cube): boolean {
    for (let w = 0; w < a.length; w++) if (a[w] !== b[w]) return false;
    return true;
}

/** Smallest cube containing a and b. */
export function supercube(a: Cube, b: Cube): Cube {
    const r = new Uint32Array(a.length);
    for (let w = 0; w < a.length; w++) r[w] = a[w]! | b[w]!;
    return r;
}

export function isUniverse(c: Cube, nvars: number): boolean {
    for (let w = 0; w < c.length; w++) if (c[w] !== wordMask(nvars, w)) return false;
    return true;
}

/** Number of literals (variables that are not free). */
export function literalCount(c: Cube, nvars: number): number {
    let n = 0;
    for (let w = 0; w < c.length; w++) {
        const x = c[w]!;
        const mask = wordMask(nvars, w) & 0x55555555;
        // free fields have both bits set; a literal has exactly one.
        n += popcount((x ^ (x >>> 1)) & mask);
    }
    return n;
}

/** Cofactor of c with respect to p (c|p), or null when c and p do not intersect. */
export function cofactor(c: Cube, p: Cube, nvars: number): Cube | null {
    if (!intersects(c, p, nvars)) return null;
    const r = new Uint32Array(c.length);
    // Where p has a literal, the result is free; elsewhere it is c.
    for (let w = 0; w < c.length; w++) {
        const pw = p[w]!;
        const lit = (pw ^ (pw >>> 1)) & 0x55555555; // low bit of every literal field of p
        const litMask = (lit | (lit << 1)) >>> 0;
        r[w] = ((c[w]! & ~litMask) | (litMask & wordMask(nvars, w))) >>> 0;
    }
    return r;
}

/** Number of minterms in a non-empty cube, as a float (exact up to 2^53). */
export function mintermCount(c: Cube, nvars: number): number {
    return 2 ** (nvars - literalCount(c, nvars));
}

/** One minterm of a non-empty cube: free variables take 0. Bit v of the result is variable v. */
export function someMinterm(c: Cube, nvars: number): (0 | 1)[] {
    const bits: (0 | 1)[] = [];
    for (let v = 0; v < nvars; v++) bits.push(getVar(c, v) === ONE ? 1 : 0);
    return bits;
}

/** True when the minterm (bit v = variable v) lies in the cube. */
export function containsMinterm(c: Cube, bits: readonly (0 | 1)[]): boolean {
    for (let v = 0; v < bits.length; v++) {
        const f = getVar(c, v);
        if (f === FREE) continue;
        if ((f === ONE) !== (bits[v] === 1)) return false;
    }
    return true;
}

/** Text form, variable 0 first: `0`, `1`, `-` per variable (Espresso PLA order). */
export function cubeToString(c: Cube, nvars: number): string {
    let s = '';
    for (let v = 0; v < nvars; v++) {
        const f = getVar(c, v);
        s += f === ZERO ? '0' : f === ONE ? '1' : f === FREE ? '-' : '∅';
    }
    return s;
}

/** Inverse of cubeToString. */
export function cubeFromString(s: string): Cube {
    const c = universe(s.length);
    for (let v = 0; v < s.length; v++) {
        const ch = s[v];
        if (ch === '0') setVarInPlace(c, v, ZERO);
        else if (ch === '1') setVarInPlace(c, v, ONE);
        else if (ch !== '-') throw new Error(`cube: bad character '${ch}'`);
    }
    return c;
}

export function popcount(x: number): number {
    x = x - ((x >>> 1) & 0x55555555);
    x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
    return (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}
