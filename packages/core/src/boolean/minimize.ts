/**
 * Two-level minimization entry point (issue 3).
 *
 * Functions of up to TABLE_VARS (10) variables: every prime from the truth table (primes-table.ts),
 * every ON minterm a row, and the exact covering search (exact.ts, mincov.ts) from its own
 * greedy cover; when it completes, the cover is proven minimal — fewest products, then fewest
 * literals. Wider functions: the Espresso-style heuristic (espresso/loop.ts) first, then — when
 * the prime count, covering table and search work stay within limits — the exact search seeded
 * with the heuristic cover as upper bound.
 */
import { cpuNow } from './clock.js';
import { type Cube, isEmpty, wordMask, wordsFor } from './cube.js';
import { cheaper, coverCost, espressoHeuristic, essentialPrimes } from './espresso/loop.js';
import { singleCubeContainment } from './espresso/unate.js';
import { dontCaresOutside } from './dont-care.js';
import { type ExactLimits, type ExactOutcome, exactCover, exactOverTable } from './exact.js';
import { TABLE_VARS, forEachMinterm, functionTables, primesFromTable } from './primes-table.js';

export { minimizeMulti, type MultiFunction, type MultiResult } from './multi-output.js';

export interface MinimizeOptions {
    /** 'auto': exact when tractable, heuristic beyond. */
    readonly method?: 'auto' | 'exact' | 'heuristic';
    /**
     * Safety budget for one function, in milliseconds of CPU time (default 2000; clock.ts).
     * Results depend on it only when it runs out — the normal bounds are counts.
     */
    readonly budgetMs?: number;
    /** Largest number of primes the exact method accepts in 'auto' (default 4000). */
    readonly maxPrimes?: number;
    /** Largest covering table (rows) the exact method accepts in 'auto' (default 20000). */
    readonly maxRows?: number;
    /**
     * In 'auto', the work the exact covering search may do, in bit-table word operations
     * (default 8 million, about 10–30 ms). A work bound rather than a time bound, so that
     * the same function always gets the same cover (as-built analyses synthesize twice).
     */
    readonly exactWork?: number;
}

export interface MinimizeResult {
    readonly cover: Cube[];
    /** True when the cover is proven minimal (fewest products, then fewest literals). */
    readonly exact: boolean;
}

const DEFAULT_BUDGET_MS = 2000;
/**
 * Work of the exact step beyond SMALL_VARS (about 3–10 ms here): past it the best cover found
 * is returned unproven. Measured trade-off on the reference suite (scripts/bench-minimize.ts):
 * 2 million keeps the time well inside twice the reference's with fewer literals than it; 8
 * million proves two more functions and saves 0.4 % of literals at 1.5 times the total time.
 */
const DEFAULT_EXACT_WORK = 2_000_000;
/** Up to SMALL_VARS variables: enough to prove every such function of the suites minimal (the densest needs about 4 million). */
const SMALL_EXACT_WORK = 64_000_000;
/**
 * Exact-search work allowed per millisecond of budget. The slowest search measured here does
 * about 100,000 work units per millisecond warm, 10–20 times less on its first (cold) calls.
 * The default budget (2000 ms) gives 64 million: no cut.
 */
const WORK_PER_BUDGET_MS = 32_000;
/** The least work and time an exact search gets, however small the budget (see minimize). */
const MIN_EXACT_WORK = 2_000_000;
const MIN_EXACT_MS = 200;
/** Functions of at most this many variables get SMALL_EXACT_WORK. */
const SMALL_VARS = 8;

function defaultExactWork(nvars: number): number {
    return nvars <= SMALL_VARS ? SMALL_EXACT_WORK : DEFAULT_EXACT_WORK;
}

/** Primes from the truth table, every ON minterm a row, then the exact search; null past the limits. */
function exactFromTable(on: readonly Cube[], dc: readonly Cube[], nvars: number, limits: ExactLimits): ExactOutcome | null {
    const { on: onTable, care: careTable } = functionTables(on, dc, nvars);
    const primes = primesFromTable(onTable, careTable, nvars, limits.maxPrimes);
    if (primes === null) return null;
    const lists: number[][] = [];
    const at = new Int32Array(onTable.length).fill(-1);
    primes.forEach((p, j) => {
        forEachMinterm(p, nvars, (m) => {
            if (!onTable[m]) return;
            if (at[m]! < 0) { at[m] = lists.length; lists.push([]); }
            lists[at[m]!]!.push(j);
        });
    });
    // Minterms in the same primes make the same row: keep one.
    const keys = new Set<string>();
    const rows = lists.filter((r) => { const k = r.join(','); if (keys.has(k)) return false; keys.add(k); return true; });
    if (rows.length > limits.maxRows) return null;
    return exactOverTable(primes, rows, nvars, null, limits);
}

/** Minimizes f with ON-set `on` and don't-care set `dc` (both covers over `nvars` variables). */
export function minimize(on: readonly Cube[], dc: readonly Cube[], nvars: number, options: MinimizeOptions = {}): MinimizeResult {
    const start = cpuNow();
    const method = options.method ?? 'auto';
    const budget = options.budgetMs ?? DEFAULT_BUDGET_MS;
    const deadline = start + budget;
    const words = wordsFor(nvars);
    const onCubes = singleCubeContainment(on.filter((c) => !isEmpty(c, nvars)), words);
    const dcCubes = dontCaresOutside(dc.filter((c) => !isEmpty(c, nvars)), onCubes, nvars);
    if (onCubes.length === 0) return { cover: [], exact: true };
    const maxPrimes = method === 'exact' ? 1_000_000 : options.maxPrimes ?? 4000;
    const maxRows = method === 'exact' ? 10_000_000 : options.maxRows ?? 20000;
    const fullWork = defaultExactWork(nvars);
    // A small budget (the keystroke analyses give 10 ms) scales the exact search's work bound
    // down, to no less than MIN_EXACT_WORK, and its clock is at least MIN_EXACT_MS: the work
    // bound, not the clock, must end the search, so that the same function gets the same cover
    // on a fast or a loaded machine, cold or warm — and the same as with the full budget
    // whenever the search finishes (the search path does not depend on where it is stopped).
    // A search the clock cuts anyway is dropped.
    const exactWork = method === 'exact' ? Infinity
        : options.exactWork ?? Math.min(fullWork, Math.max(MIN_EXACT_WORK, budget * WORK_PER_BUDGET_MS));
    // Small functions: primes from the truth table and the exact search first, starting from
    // its own greedy cover.
    let fromTable: Cube[] | null = null;
    const tabled = method !== 'heuristic' && nvars <= TABLE_VARS;
    if (tabled) {
        const tableDeadline = method === 'exact' ? deadline : start + Math.max(MIN_EXACT_MS, budget * 0.5);
        const outcome = exactFromTable(onCubes, dcCubes, nvars, { maxPrimes, maxRows, deadline: tableDeadline, maxWork: exactWork });
        if (outcome !== null && cpuNow() < tableDeadline) {
            if (outcome.proven && outcome.cover !== null) return { cover: outcome.cover, exact: true };
            // Stopped by its full work bound, its best cover has beaten the heuristic's on every
            // suite function measured (scripts/bench-minimize.ts): the heuristic would only add
            // time. Stopped by a scaled-down bound, it may be a rough greedy cover: the
            // heuristic runs too and the cheaper cover wins.
            if (outcome.cover !== null && exactWork >= fullWork) return { cover: outcome.cover, exact: false };
            fromTable = outcome.cover;
        }
        // Stopped by the clock (a safety net): its cover is dropped, so that what the clock
        // allowed never shows in the result; the heuristic's stands alone.
    }
    // The heuristic gets half the budget of its own (after a table search that may have used
    // some) unless exact work is not wanted.
    const heuristicDeadline = method === 'heuristic' ? deadline : cpuNow() + Math.max(1, budget * 0.5);
    const h = espressoHeuristic(onCubes, dcCubes, nvars, { deadline: heuristicDeadline });
    let cover = h.cover;
    if (method === 'heuristic') return { cover, exact: false };
    // Every minimal cover contains every essential prime; a cover made only of essential primes
    // is therefore the one minimal cover (fewest products and fewest literals), and the exact
    // step could only confirm it. Primality is re-checked against the OFF-set rather than assumed.
    // (Every prime cover holds all essential primes, so that can only happen when the heuristic
    // already found the first irredundant cover to be all essential: the check runs only then.)
    if (h.target.off !== null && h.essentialCount === cover.length
        && essentialPrimes(cover, dcCubes, nvars).length === cover.length
        && allPrime(cover, h.target.off, nvars)) return { cover, exact: true };
    if (fromTable !== null && cheaper(coverCost(fromTable, nvars), coverCost(cover, nvars))) cover = fromTable;
    // The table search ran (out of time, or past the prime limit): the cube path would not do better.
    if (tabled && method !== 'exact') return { cover, exact: false };
    const hc = coverCost(cover, nvars);
    const exactDeadline = method === 'exact' ? deadline : Math.max(deadline, start + MIN_EXACT_MS);
    const outcome = exactCover(onCubes, h.target.care, nvars, hc, {
        maxPrimes,
        maxRows,
        // The clock is a safety net; in 'auto' the search is bounded by work (deterministic).
        deadline: exactDeadline,
        // When even the OFF-set was too large to compute (one-hot style covers), the covering
        // problem is too: a tenth of the work then.
        maxWork: exactWork / (h.target.off === null ? 10 : 1),
    });
    if (outcome === null || (method !== 'exact' && cpuNow() >= exactDeadline)) return { cover, exact: false };
    if (outcome.cover && cheaper(coverCost(outcome.cover, nvars), hc)) cover = outcome.cover;
    return { cover, exact: outcome.proven };
}

/** True when no literal of any cube of f can be dropped without meeting the OFF-set `off`. */
function allPrime(f: readonly Cube[], off: readonly Cube[], nvars: number): boolean {
    const words = wordsFor(nvars);
    for (const c of f) {
        for (let v = 0; v < nvars; v++) {
            const w = v >>> 4;
            const shift = (v & 15) * 2;
            if (((c[w]! >>> shift) & 3) === 3) continue;
            // c with v raised meets an OFF cube o iff every variable field of c ∩ o (v free) is non-empty.
            let blocked = false;
            for (const o of off) {
                let meets = true;
                for (let k = 0; k < words && meets; k++) {
                    let x = (c[k]! & o[k]!) >>> 0;
                    if (k === w) x = (x | ((o[k]! >>> shift) & 3) << shift) >>> 0;
                    const m = wordMask(nvars, k) & 0x55555555;
                    if (((x | (x >>> 1)) & m) !== m) meets = false;
                }
                if (meets) { blocked = true; break; }
            }
            if (!blocked) return false;
        }
    }
    return true;
}
