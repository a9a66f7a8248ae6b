/**
 * Exact two-level minimization: every prime implicant of ON ∪ DC, then a minimum-cost cover
 * of the ON-set by those primes (fewest products, then fewest literals).
 *
 * The rows of the covering table are pieces of the ON-set, each split until it lies entirely
 * inside or entirely outside every prime — then "row covered" means "one prime contains it",
 * without enumerating minterms, so the method also works on wide functions with few primes.
 */
import { type Cube, wordMask, wordsFor } from './cube.js';
import { cubeLiteralCount } from './espresso/expand.js';
import { singleCubeContainment } from './espresso/unate.js';
import { solveCover } from './mincov.js';
import { allPrimes } from './primes.js';

export interface ExactLimits {
    readonly maxPrimes: number;
    readonly maxRows: number;
    readonly deadline: number;
}

export interface ExactOutcome {
    /** A cover cheaper than the upper bound, or null when none exists / none was found. */
    readonly cover: Cube[] | null;
    /** True when the search finished (the result, or the upper bound's cover, is minimal). */
    readonly proven: boolean;
}

/** Weight of one product: more than the literals of any cover, so products count first. */
export function productWeight(nvars: number, maxProducts: number): number {
    return (nvars + 1) * (maxProducts + 1);
}

/**
 * Searches for a cover of `on` by primes of `care` cheaper than `upper` (a cost in the same
 * units as `weight` per product + literals), or returns tractable = false via null.
 */
export function exactCover(
    on: readonly Cube[], care: readonly Cube[], nvars: number, weight: number, upper: number, limits: ExactLimits,
): ExactOutcome | null {
    const words = wordsFor(nvars);
    const allP = allPrimes(care, nvars, limits.maxPrimes, limits.deadline);
    if (allP === null) return null;
    const onSet = singleCubeContainment(on, words);
    const primes = allP.filter((p) => onSet.some((c) => meets(p, c, nvars)));
    const rows = refineRows(onSet, primes, nvars, limits.maxRows, limits.deadline);
    if (rows === null) return null;
    const table = new Map<string, number[]>();
    for (const r of rows) {
        const cols: number[] = [];
        for (let j = 0; j < primes.length; j++) if (inside(r, primes[j]!, words)) cols.push(j);
        if (cols.length === 0) throw new Error('exact: a piece of the ON-set lies in no prime');
        table.set(cols.join(','), cols);
    }
    const cost = primes.map((p) => weight + cubeLiteralCount(p, nvars));
    const sol = solveCover({ rows: [...table.values()], columns: primes.length, cost }, upper, limits.deadline);
    return { cover: sol.columns ? sol.columns.map((j) => primes[j]!) : null, proven: sol.complete };
}

function inside(small: Cube, big: Cube, words: number): boolean {
    for (let w = 0; w < words; w++) if (((big[w]! & small[w]!) >>> 0) !== small[w]) return false;
    return true;
}

function meets(a: Cube, b: Cube, nvars: number): boolean {
    for (let w = 0; w < a.length; w++) {
        const x = a[w]! & b[w]!;
        const m = wordMask(nvars, w) & 0x55555555;
        if (((x | (x >>> 1)) & m) !== m) return false;
    }
    return true;
}

/** Splits the ON cubes until each piece is inside or outside every prime; null past maxRows. */
function refineRows(on: readonly Cube[], primes: readonly Cube[], nvars: number, maxRows: number, deadline: number): Cube[] | null {
    const words = wordsFor(nvars);
    let rows: Cube[] = [...on];
    for (let pi = 0; pi < primes.length; pi++) {
        const p = primes[pi]!;
        if ((pi & 15) === 0 && Date.now() > deadline) return null;
        const next: Cube[] = [];
        for (const r of rows) {
            if (inside(r, p, words) || !meets(r, p, nvars)) { next.push(r); continue; }
            // r − p as disjoint pieces, one per literal of p that r leaves free, then r ∩ p.
            let prefix = r.slice();
            for (let w = 0; w < words; w++) {
                const pl = (p[w]! ^ (p[w]! >>> 1)) & wordMask(nvars, w) & 0x55555555;
                const rFree = r[w]! & (r[w]! >>> 1) & 0x55555555;
                let y = pl & rFree;
                while (y !== 0) {
                    const b = y & -y;
                    y ^= b;
                    const fieldMask = (b | (b << 1)) >>> 0;
                    const pv = p[w]! & fieldMask;
                    const piece = prefix.slice();
                    piece[w] = ((piece[w]! & ~fieldMask) | (~pv & fieldMask)) >>> 0;
                    next.push(piece);
                    prefix = prefix.slice();
                    prefix[w] = ((prefix[w]! & ~fieldMask) | pv) >>> 0;
                }
            }
            next.push(prefix);
        }
        if (next.length > maxRows) return null;
        rows = next;
    }
    return rows;
}
