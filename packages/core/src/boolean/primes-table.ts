/**
 * Prime implicants of a small function from its truth table, by dynamic programming over all
 * 3^n cubes: a cube with a free variable is an implicant exactly when both of its halves are,
 * and an implicant is prime when no cube one literal larger is an implicant.
 *
 * The cost depends on n only (3^n steps), not on how the function is given, so for up to about
 * ten variables it beats the recursive method on dense functions (hundreds of ON minterms),
 * whose cofactor merges grow with the prime count.
 */
import { type Cube, wordMask } from './cube.js';

/** Functions of more variables than this are not tabulated (3^12 cubes is 531,441 bytes). */
export const TABLE_MAX_VARS = 12;
/** Up to this many variables the minimizer takes primes from the table (3^10 = 59,049 cubes). */
export const TABLE_VARS = 10;

/** The truth table of a cover over n ≤ 16 variables: byte m is 1 when minterm m lies in it. */
export function truthTableOf(f: readonly Cube[], nvars: number): Uint8Array {
    const t = new Uint8Array(1 << nvars);
    for (const c of f) forEachMinterm(c, nvars, (m) => { t[m] = 1; });
    return t;
}

/** The ON table of `on` and the ON ∪ DC table of `on` with `dc`, for primesFromTable. */
export function functionTables(on: readonly Cube[], dc: readonly Cube[], nvars: number): { on: Uint8Array; care: Uint8Array } {
    const onTable = truthTableOf(on, nvars);
    const care = truthTableOf(dc, nvars);
    for (let m = 0; m < onTable.length; m++) care[m]! |= onTable[m]!;
    return { on: onTable, care };
}

/** Calls `visit` with every minterm (bit v = variable v) of a one-word cube. */
export function forEachMinterm(c: Cube, nvars: number, visit: (m: number) => void): void {
    let base = 0;
    const free: number[] = [];
    for (let v = 0; v < nvars; v++) {
        const x = (c[0]! >>> (2 * v)) & 3;
        if (x === 0) return;
        if (x === 3) free.push(v);
        else if (x === 2) base |= 1 << v;
    }
    // Gray-code walk over the free variables: one bit flips per step.
    let m = base;
    visit(m);
    for (let k = 1; k < 1 << free.length; k++) {
        m ^= 1 << free[31 - Math.clz32(k & -k)]!;
        visit(m);
    }
}

/**
 * The primes of the function with ON table `on` and ON ∪ DC table `care` (truthTableOf) that
 * meet the ON-set, or null when there are more than `limit`.
 */
export function primesFromTable(on: Uint8Array, care: Uint8Array, nvars: number, limit: number): Cube[] | null {
    if (nvars > TABLE_MAX_VARS) throw new Error(`primesFromTable: ${nvars} variables is beyond ${TABLE_MAX_VARS}`);
    const pow3 = new Int32Array(nvars + 1);
    pow3[0] = 1;
    for (let v = 1; v <= nvars; v++) pow3[v] = pow3[v - 1]! * 3;
    const size = pow3[nvars]!;
    // Bit 0: the cube is an implicant of ON ∪ DC; bit 1: it contains an ON minterm.
    const flags = new Uint8Array(size);
    const digits = new Uint8Array(nvars + 1);
    let bits = 0;
    for (let c = 0; c < size; c++) {
        let v = 0;
        while (v < nvars && digits[v] !== 2) v++;
        if (v === nvars) flags[c] = care[bits]! | (on[bits]! << 1);
        else {
            const a = flags[c - 2 * pow3[v]!]!;
            const b = flags[c - pow3[v]!]!;
            flags[c] = (a & b & 1) | ((a | b) & 2);
        }
        // Next cube: digits count in base 3, digit 1 sets the variable's bit, 2 frees it.
        let k = 0;
        while (k < nvars && digits[k] === 2) { digits[k] = 0; k++; }
        if (k < nvars) {
            digits[k]!++;
            if (digits[k] === 1) bits |= 1 << k;
            else bits &= ~(1 << k);
        }
    }
    const primes: Cube[] = [];
    digits.fill(0);
    let word = 0;
    for (let v = 0; v < nvars; v++) word |= 1 << (2 * v);
    const mask = wordMask(nvars, 0);
    for (let c = 0; c < size; c++) {
        if (flags[c] === 3) {
            let prime = true;
            for (let v = 0; v < nvars && prime; v++) {
                const d = digits[v]!;
                if (d !== 2 && (flags[c + (2 - d) * pow3[v]!]! & 1) !== 0) prime = false;
            }
            if (prime) {
                if (primes.length >= limit) return null;
                primes.push(Uint32Array.of((word & mask) >>> 0));
            }
        }
        let k = 0;
        while (k < nvars && digits[k] === 2) { digits[k] = 0; word -= 2 << (2 * k); k++; }
        if (k < nvars) { digits[k]!++; word += 1 << (2 * k); }
    }
    return primes;
}
