/**
 * One-word versions (up to 16 variables) of tautology and of the supercube of a complement:
 * a cube is a plain 32-bit number here, so the recursion allocates only small typed arrays.
 * Same algorithms as unate.ts (unate reduction, majority phase first).
 */
const LOW = 0x55555555;

function popcount(x: number): number {
    x = x - ((x >>> 1) & 0x55555555);
    x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
    return (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}

/** Low bit of the field of the most binate variable among `binate`, and whether 1 is the majority phase. */
function splitVariable(vals: Uint32Array, len: number, candidates: number, lm: number): { bit: number; oneFirst: boolean } {
    let bestBit = 0;
    let bestScore = -1;
    let bestOneFirst = true;
    let y = candidates;
    while (y !== 0) {
        const b = y & -y;
        y ^= b;
        const pos = 31 - Math.clz32(b);
        let z = 0;
        let o = 0;
        for (let i = 0; i < len; i++) {
            const f = (vals[i]! >>> pos) & 3;
            if (f === 1) z++;
            else if (f === 2) o++;
        }
        const score = (z + o) * 1024 - Math.abs(z - o);
        if (score > bestScore) { bestScore = score; bestBit = b; bestOneFirst = o >= z; }
    }
    void lm;
    return { bit: bestBit, oneFirst: bestOneFirst };
}

/** Cubes of the literal cofactor (v = value) where `bit` is the low bit of v's field. */
function cofactorWord(vals: Uint32Array, len: number, bit: number, value: 0 | 1): Uint32Array {
    const out = new Uint32Array(len);
    const pos = 31 - Math.clz32(bit);
    const want = value === 1 ? 2 : 1;
    const free = (3 << pos) >>> 0;
    let k = 0;
    for (let i = 0; i < len; i++) {
        const x = vals[i]!;
        const f = (x >>> pos) & 3;
        if (f === 3) out[k++] = x;
        else if (f === want) out[k++] = (x | free) >>> 0;
    }
    return out.subarray(0, k);
}

/**
 * Scratch stack for the tautology recursion: each call owns the region [start, start + len)
 * and pushes its cofactors above it, so the recursion allocates nothing (it ran hot enough in
 * EXPAND / IRREDUNDANT / REDUCE for its small arrays to keep the garbage collector busy).
 * Grows by copying; callers re-read `arena` after every recursive call.
 */
let arena = new Uint32Array(1 << 14);
let top = 0;

function reserve(n: number): void {
    if (top + n <= arena.length) return;
    const a = new Uint32Array(Math.max(arena.length * 2, top + n));
    a.set(arena.subarray(0, top));
    arena = a;
}

export function tautWord(vals: Uint32Array, mask: number): boolean {
    const base = top;
    reserve(vals.length);
    arena.set(vals, base);
    top = base + vals.length;
    try {
        return tautAt(base, vals.length, mask);
    } finally {
        top = base;
    }
}

/**
 * Tautology of the one-word cover `values(i)` for i < len, pushed onto the scratch stack by
 * the caller's loop (`fill` returns how many it wrote at `arena[start…]`): coverHasCube's
 * cofactor goes straight there, without an intermediate array.
 */
export function tautWordFill(capacity: number, mask: number, fill: (out: Uint32Array, start: number) => number): boolean {
    return onScratch(capacity, fill, (start, len) => tautAt(start, len, mask));
}

/** Lets `fill` write a cover onto the scratch stack, runs `solve` on it, and pops it again. */
function onScratch<T>(capacity: number, fill: (out: Uint32Array, start: number) => number, solve: (start: number, len: number) => T): T {
    const base = top;
    reserve(capacity);
    const len = fill(arena, base);
    top = base + len;
    try {
        return solve(base, len);
    } finally {
        top = base;
    }
}

/** Same algorithm as the array version had: unate reduction, then the most binate variable, majority phase first. */
function tautAt(start: number, len: number, mask: number): boolean {
    if (len === 0) return false;
    const lm = mask & LOW;
    let a = arena;
    let anyZero = 0;
    let anyOne = 0;
    let volume = 0;
    for (let i = start; i < start + len; i++) {
        const x = a[i]!;
        if (x === mask) return true;
        const z = x & ~(x >>> 1) & lm;
        const o = (x >>> 1) & ~x & lm;
        anyZero |= z;
        anyOne |= o;
        volume += 2 ** -popcount(z | o);
    }
    if (volume < 1 - 1e-9) return false;
    const unate = (anyZero ^ anyOne) & lm;
    if (unate !== 0) {
        // Compact in place: this region belongs to this call.
        let k = start;
        for (let i = start; i < start + len; i++) {
            const x = a[i]!;
            if ((((x ^ (x >>> 1)) & unate)) === 0) a[k++] = x;
        }
        if (k - start < len) return tautAt(start, k - start, mask);
    }
    const binate = anyZero & anyOne;
    if (binate === 0) return false;
    // The most binate variable (as splitVariable).
    let bit = 0;
    let bestScore = -1;
    let oneFirst = true;
    let y = binate;
    while (y !== 0) {
        const b = y & -y;
        y ^= b;
        const pos = 31 - Math.clz32(b);
        let z = 0;
        let o = 0;
        for (let i = start; i < start + len; i++) {
            const f = (a[i]! >>> pos) & 3;
            if (f === 1) z++;
            else if (f === 2) o++;
        }
        const score = (z + o) * 1024 - Math.abs(z - o);
        if (score > bestScore) { bestScore = score; bit = b; oneFirst = o >= z; }
    }
    const pos = 31 - Math.clz32(bit);
    const free = (3 << pos) >>> 0;
    for (let pass = 0; pass < 2; pass++) {
        const want = (pass === 0) === oneFirst ? 2 : 1;
        const base = top;
        reserve(len);
        a = arena;
        let k = base;
        for (let i = start; i < start + len; i++) {
            const x = a[i]!;
            const f = (x >>> pos) & 3;
            if (f === 3) a[k++] = x;
            else if (f === want) a[k++] = (x | free) >>> 0;
        }
        top = k;
        const ok = tautAt(base, k - base, mask);
        top = base;
        a = arena;
        if (!ok) return false;
    }
    return true;
}

/** Supercube of the complement of the cover, or -1 when the cover is a tautology. */
export function scccWord(vals: Uint32Array, mask: number): number {
    const len = vals.length;
    if (len === 0) return mask >>> 0;
    const lm = mask & LOW;
    for (let i = 0; i < len; i++) if (vals[i] === mask) return -1;
    if (len === 1) {
        const x = vals[0]!;
        const lit = (x ^ (x >>> 1)) & lm;
        if (popcount(lit) !== 1) return mask >>> 0;
        const pos = 31 - Math.clz32(lit);
        const f = (x >>> pos) & 3;
        return ((mask & ~(3 << pos)) | ((f ^ 3) << pos)) >>> 0;
    }
    let anyZero = 0;
    let anyOne = 0;
    for (let i = 0; i < len; i++) {
        const x = vals[i]!;
        anyZero |= x & ~(x >>> 1) & lm;
        anyOne |= (x >>> 1) & ~x & lm;
    }
    const binate = anyZero & anyOne;
    const { bit } = splitVariable(vals, len, binate !== 0 ? binate : (anyZero | anyOne), lm);
    const pos = 31 - Math.clz32(bit);
    const free = (3 << pos) >>> 0;
    const f0 = cofactorWord(vals, len, bit, 0);
    const f1 = cofactorWord(vals, len, bit, 1);
    const s0 = scccWord(f0, mask);
    if (s0 === (mask >>> 0)) {
        if (!tautWord(f1, mask)) return s0;
        return ((s0 & ~free) | (1 << pos)) >>> 0;
    }
    const s1 = scccWord(f1, mask);
    if (s0 === -1 && s1 === -1) return -1;
    if (s0 === -1) return ((s1 & ~free) | (2 << pos)) >>> 0;
    if (s1 === -1) return ((s0 & ~free) | (1 << pos)) >>> 0;
    return (s0 | s1) >>> 0;
}

/**
 * scccWord of the one-word cover written by `fill` at `out[start…]` (returning its length), on
 * the scratch stack: REDUCE asks it once per cube. Same recursion as scccWord.
 */
export function scccWordFill(capacity: number, mask: number, fill: (out: Uint32Array, start: number) => number): number {
    return onScratch(capacity, fill, (start, len) => scccAt(start, len, mask));
}

function scccAt(start: number, len: number, mask: number): number {
    if (len === 0) return mask >>> 0;
    const lm = mask & LOW;
    let a = arena;
    for (let i = start; i < start + len; i++) if (a[i] === mask) return -1;
    if (len === 1) {
        const x = a[start]!;
        const lit = (x ^ (x >>> 1)) & lm;
        if (popcount(lit) !== 1) return mask >>> 0;
        const pos = 31 - Math.clz32(lit);
        const f = (x >>> pos) & 3;
        return ((mask & ~(3 << pos)) | ((f ^ 3) << pos)) >>> 0;
    }
    let anyZero = 0;
    let anyOne = 0;
    for (let i = start; i < start + len; i++) {
        const x = a[i]!;
        anyZero |= x & ~(x >>> 1) & lm;
        anyOne |= (x >>> 1) & ~x & lm;
    }
    const binate = anyZero & anyOne;
    const { bit } = splitVariable(a.subarray(start, start + len), len, binate !== 0 ? binate : (anyZero | anyOne), lm);
    const pos = 31 - Math.clz32(bit);
    const free = (3 << pos) >>> 0;
    // Both cofactors above this region: f0 at [b0, b1), f1 at [b1, end).
    const b0 = top;
    reserve(2 * len);
    a = arena;
    let k = b0;
    for (let i = start; i < start + len; i++) {
        const x = a[i]!;
        const f = (x >>> pos) & 3;
        if (f === 3) a[k++] = x;
        else if (f === 1) a[k++] = (x | free) >>> 0;
    }
    const b1 = k;
    for (let i = start; i < start + len; i++) {
        const x = a[i]!;
        const f = (x >>> pos) & 3;
        if (f === 3) a[k++] = x;
        else if (f === 2) a[k++] = (x | free) >>> 0;
    }
    const end = k;
    top = end;
    try {
        const s0 = scccAt(b0, b1 - b0, mask);
        if (s0 === (mask >>> 0)) {
            top = end;
            if (!tautAt(b1, end - b1, mask)) return s0;
            return ((s0 & ~free) | (1 << pos)) >>> 0;
        }
        top = end;
        const s1 = scccAt(b1, end - b1, mask);
        if (s0 === -1 && s1 === -1) return -1;
        if (s0 === -1) return ((s1 & ~free) | (2 << pos)) >>> 0;
        if (s1 === -1) return ((s0 & ~free) | (1 << pos)) >>> 0;
        return (s0 | s1) >>> 0;
    } finally {
        top = b0;
    }
}

/** Thrown when the one-word complement exceeds its budget. */
export class WordBudgetExceeded extends Error {}

export interface WordBudget { left: number; readonly maxCubes: number; readonly deadline: number; calls: number; readonly now: () => number }

/** Complement of a one-word cover (same recursion and lifting merge as unate.ts). */
export function complementWord(vals: Uint32Array, mask: number, b: WordBudget): Uint32Array {
    if ((++b.calls & 255) === 0 && b.now() > b.deadline) throw new WordBudgetExceeded();
    const len = vals.length;
    const lm = mask & LOW;
    if (len === 0) return Uint32Array.of(mask >>> 0);
    for (let i = 0; i < len; i++) if (vals[i] === mask) return new Uint32Array(0);
    if (len === 1) {
        const x = vals[0]!;
        let lit = (x ^ (x >>> 1)) & lm;
        const out = new Uint32Array(popcount(lit));
        let k = 0;
        while (lit !== 0) {
            const bit = lit & -lit;
            const pos = 31 - Math.clz32(bit);
            const f = (x >>> pos) & 3;
            out[k++] = ((mask & ~(3 << pos)) | ((f ^ 3) << pos)) >>> 0;
            lit ^= bit;
        }
        b.left -= k;
        if (b.left < 0) throw new WordBudgetExceeded();
        return out;
    }
    let anyZero = 0;
    let anyOne = 0;
    for (let i = 0; i < len; i++) {
        const x = vals[i]!;
        anyZero |= x & ~(x >>> 1) & lm;
        anyOne |= (x >>> 1) & ~x & lm;
    }
    const binate = anyZero & anyOne;
    const { bit } = splitVariable(vals, len, binate !== 0 ? binate : (anyZero | anyOne), lm);
    const pos = 31 - Math.clz32(bit);
    const c0 = complementWord(cofactorWord(vals, len, bit, 0), mask, b);
    const c1 = complementWord(cofactorWord(vals, len, bit, 1), mask, b);
    const r = mergeWord(c0, c1, pos);
    b.left -= r.length;
    if (b.left < 0 || r.length > b.maxCubes) throw new WordBudgetExceeded();
    return r;
}

function within(v: number, list: Uint32Array): boolean {
    for (let i = 0; i < list.length; i++) if (((list[i]! & v) >>> 0) === v) return true;
    return false;
}

/** x'·c0 + x·c1 with lifting (a cube of one half inside a cube of the other needs no x literal). */
function mergeWord(c0: Uint32Array, c1: Uint32Array, pos: number): Uint32Array {
    const small = c0.length * c1.length <= 250_000;
    const lifted: number[] = [];
    const fixed: number[] = [];
    const clear = ~(3 << pos);
    for (let i = 0; i < c0.length; i++) {
        const a = c0[i]!;
        if (small && within(a, c1)) lifted.push(a);
        else fixed.push(((a & clear) | (1 << pos)) >>> 0);
    }
    for (let i = 0; i < c1.length; i++) {
        const a = c1[i]!;
        if (small && within(a, c0)) lifted.push(a);
        else fixed.push(((a & clear) | (2 << pos)) >>> 0);
    }
    if (lifted.length === 0) return Uint32Array.from(fixed);
    // Lifted cubes may contain each other and fixed ones; fixed ones contain no lifted one.
    lifted.sort((x, y) => popcount(y & (y >>> 1) & LOW) - popcount(x & (x >>> 1) & LOW));
    const kept: number[] = [];
    for (const v of lifted) {
        let inside = false;
        for (const k of kept) if (((k & v) >>> 0) === v) { inside = true; break; }
        if (!inside) kept.push(v);
    }
    const keptArr = Uint32Array.from(kept);
    for (const v of fixed) if (!within(v, keptArr)) kept.push(v);
    return Uint32Array.from(kept);
}
