/**
 * Exact two-level minimization: every prime implicant of ON ∪ DC, then a minimum-cost cover
 * of the ON-set by those primes (fewest products, then fewest literals).
 *
 * The rows of the covering table are pieces of the ON-set that lie entirely inside or entirely
 * outside every prime — then "row covered" means "one prime contains it". They are generated
 * lazily (see exactCover), so wide functions with few primes never enumerate minterms.
 */
import { cpuNow } from './clock.js';
import { type Cube, ONE, ZERO, contains, intersects, isUniverse, setVarInPlace, universe, wordMask, wordsFor } from './cube.js';
import { cubeLiteralCount } from './espresso/expand.js';
import { cubeCofactor, literalCofactor, mostBinate, mostFrequent, phaseCounts, singleCubeContainment } from './espresso/unate.js';
import { type CoverCost } from './espresso/loop.js';
import { solveCover } from './mincov.js';
import { allPrimes } from './primes.js';

export interface ExactLimits {
    readonly maxPrimes: number;
    readonly maxRows: number;
    readonly deadline: number;
    /** Deterministic bound on the covering search (see solveCover); Infinity for none. */
    readonly maxWork?: number;
}

export interface ExactOutcome {
    /** A cover cheaper than the upper bound, or null when none exists / none was found. */
    readonly cover: Cube[] | null;
    /** True when the search finished (the result, or the upper bound's cover, is minimal). */
    readonly proven: boolean;
}

/**
 * Searches for a cover of `on` by primes of `care` cheaper than `upper` (fewer products, or as
 * many with fewer literals), or returns null when the primes or the table exceed the limits.
 * The rows of the covering table are grown lazily from the ON cubes (see exactOverRows).
 */
export function exactCover(on: readonly Cube[], care: readonly Cube[], nvars: number, upper: CoverCost, limits: ExactLimits): ExactOutcome | null {
    const words = wordsFor(nvars);
    const allP = allPrimes(care, nvars, limits.maxPrimes, limits.deadline);
    if (allP === null) return null;
    const onSet = singleCubeContainment(on, words);
    const primes = allP.filter((p) => onSet.some((c) => intersects(p, c, nvars)));
    // Rows are added lazily: a relaxed table (fewer rows) has an optimum no dearer than the
    // real one, so when its optimum covers the whole ON-set it is optimal; otherwise an ON
    // minterm the optimum misses becomes a new row and the table is solved again.
    const rows: number[][] = [];
    const keys = new Set<string>();
    const addRow = (piece: Cube): void => {
        const cols: number[] = [];
        for (let j = 0; j < primes.length; j++) if (contains(primes[j]!, piece)) cols.push(j);
        if (cols.length === 0) throw new Error('exact: a piece of the ON-set lies in no prime');
        const key = cols.join(',');
        if (!keys.has(key)) { keys.add(key); rows.push(cols); }
    };
    for (const c of onSet) addRow(atomic(c, primes, nvars) ? c : firstMinterm(c, nvars));
    /** Adds a row for every ON cube the columns leave partly bare; returns how many. */
    const addMissing = (columns: readonly number[]): number => {
        const chosen = columns.map((j) => primes[j]!);
        let missing = 0;
        for (const c of onSet) {
            const hole = holeIn(cubeCofactor(chosen, c, nvars), nvars);
            if (hole === null) continue;
            const m = new Uint32Array(words);
            for (let w = 0; w < words; w++) m[w] = c[w]! & hole[w]!;
            addRow(firstMinterm(m, nvars));
            missing++;
        }
        return missing;
    };
    return exactOverRows(primes, rows, nvars, upper, limits, addMissing);
}

/**
 * The exact step over a complete covering table: `primes` (each meeting the ON-set) as
 * columns and `rows` listing, per ON minterm, the primes containing it. With `upper` null the
 * search starts from its own greedy cover.
 */
export function exactOverTable(primes: readonly Cube[], rows: number[][], nvars: number, upper: CoverCost | null, limits: ExactLimits): ExactOutcome | null {
    return exactOverRows(primes, rows, nvars, upper, limits, () => 0);
}

function exactOverRows(
    primes: readonly Cube[], rows: number[][], nvars: number, upper: CoverCost | null, limits: ExactLimits,
    grow: (columns: readonly number[]) => number,
): ExactOutcome | null {
    const literals = primes.map((p) => cubeLiteralCount(p, nvars));
    const out = lexicographicCover(literals, rows, upper, limits, grow);
    if (out === null) return null;
    return { cover: out.columns?.map((j) => primes[j]!) ?? null, proven: out.proven };
}

/**
 * A cover of `rows` by columns (column j has `literals[j]` literals) with fewer columns than
 * `upper`, or as many and fewer literals; `columns` null when none was found, `proven` when
 * nothing cheaper exists. Null when the table outgrows `limits.maxRows`.
 *
 * Lexicographic, in two searches: the fewest columns (unit costs, where column dominance and
 * integer rounding of the bound are strongest), then the fewest literals among covers of that
 * many columns (a column-count limit). One weighted search (a column outweighing every
 * literal) would rank the same covers, but its bound says little about literals.
 * `grow` adds the rows a solution leaves bare and returns how many (0: nothing is bare), for
 * tables whose rows are generated lazily.
 */
export function lexicographicCover(
    literals: readonly number[], rows: number[][], upper: CoverCost | null, limits: ExactLimits,
    grow: (columns: readonly number[]) => number = () => 0,
): { columns: number[] | null; proven: boolean } | null {
    const unit = literals.map(() => 1);
    // One work budget for every round of both searches.
    let workLeft = limits.maxWork ?? Infinity;
    /** Solves the table (growing it) until the optimum leaves nothing bare; null when out of limits. */
    const solve = (cost: readonly number[], bound: number, maxColumns?: number): { columns: number[] | null; complete: boolean } | null => {
        for (;;) {
            if (rows.length > limits.maxRows) return null;
            const sol = solveCover({ rows, columns: literals.length, cost, maxColumns }, bound, limits.deadline, workLeft);
            workLeft -= sol.work;
            if (sol.columns === null) return { columns: null, complete: sol.complete };
            if (grow(sol.columns) === 0) return { columns: sol.columns, complete: sol.complete };
            if (!sol.complete || cpuNow() > limits.deadline) return { columns: null, complete: false };
        }
    };
    const first = solve(unit, upper?.products ?? Infinity);
    if (first === null) return null;
    if (first.columns === null && upper === null) return { columns: null, proven: false };
    // Without a cover of fewer columns, the upper bound's column count is the fewest (when the
    // search completed) and its literal count the one to beat.
    const count = first.columns?.length ?? upper!.products;
    const literalBound = first.columns ? first.columns.reduce((s, j) => s + literals[j]!, 0) : upper!.literals;
    const second = workLeft > 0 ? solve(literals, literalBound, count) : { columns: null, complete: false };
    if (second === null) return { columns: first.columns, proven: false };
    return { columns: second.columns ?? first.columns, proven: first.complete && second.complete };
}

/** True when c lies inside or outside every prime (so "covered" means "inside one prime"). */
function atomic(c: Cube, primes: readonly Cube[], nvars: number): boolean {
    for (const p of primes) if (!contains(p, c) && intersects(c, p, nvars)) return false;
    return true;
}

/** The minterm of c whose free variables are 0. */
export function firstMinterm(c: Cube, nvars: number): Cube {
    const r = c.slice();
    for (let w = 0; w < r.length; w++) {
        const free = r[w]! & (r[w]! >>> 1) & 0x55555555 & wordMask(nvars, w);
        // free field 11 → 01 (the variable is 0)
        r[w] = (r[w]! & ~(free << 1)) >>> 0;
    }
    return r;
}

/** A cube containing no minterm of f (within the space), or null when f is a tautology. */
export function holeIn(f: readonly Cube[], nvars: number): Cube | null {
    if (f.length === 0) return universe(nvars);
    for (const c of f) if (isUniverse(c, nvars)) return null;
    const k = phaseCounts(f, nvars);
    let v = mostBinate(k, nvars);
    if (v < 0) v = mostFrequent(k, nvars);
    for (const value of [0, 1] as const) {
        const h = holeIn(literalCofactor(f, v, value, nvars), nvars);
        if (h !== null) { setVarInPlace(h, v, value === 1 ? ONE : ZERO); return h; }
    }
    return null;
}

