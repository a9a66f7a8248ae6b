/**
 * Two-level minimization entry point (issue 3).
 *
 * `minimize` runs the Espresso-style heuristic (espresso/loop.ts) first, then — when the
 * prime count and covering table stay within limits and time is left — the exact method
 * (exact.ts) seeded with the heuristic cover as upper bound; when that search completes, the
 * cover is proven minimal: fewest products, then fewest literals.
 */
import { cpuNow } from './clock.js';
import { type Cube, isEmpty, wordsFor } from './cube.js';
import { cheaper, coverCost, espressoHeuristic } from './espresso/loop.js';
import { singleCubeContainment } from './espresso/unate.js';
import { dontCaresOutside } from './dont-care.js';
import { exactCover, productWeight } from './exact.js';

export { minimizeMulti, type MultiFunction, type MultiResult } from './multi-output.js';

export interface MinimizeOptions {
    /** 'auto': exact when tractable, heuristic beyond. */
    readonly method?: 'auto' | 'exact' | 'heuristic';
    /** Wall-clock budget for one function, in milliseconds (default 2000). */
    readonly budgetMs?: number;
    /** Largest number of primes the exact method accepts in 'auto' (default 4000). */
    readonly maxPrimes?: number;
    /** Largest covering table (rows) the exact method accepts in 'auto' (default 20000). */
    readonly maxRows?: number;
    /** In 'auto', the exact search may take this many times the heuristic's time (default 0.5)… */
    readonly exactFactor?: number;
    /** …but at least this many milliseconds (default 15). */
    readonly exactMinMs?: number;
}

export interface MinimizeResult {
    readonly cover: Cube[];
    /** True when the cover is proven minimal (fewest products, then fewest literals). */
    readonly exact: boolean;
}

const DEFAULT_BUDGET_MS = 2000;

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
    // The heuristic gets most of the budget only when exact work is not wanted.
    const heuristicDeadline = method === 'heuristic' ? deadline : start + Math.max(1, budget * 0.5);
    const h = espressoHeuristic(onCubes, dcCubes, nvars, { deadline: heuristicDeadline });
    const heuristicMs = cpuNow() - start;
    let cover = h.cover;
    if (method === 'heuristic') return { cover, exact: false };
    const hc = coverCost(cover, nvars);
    const weight = productWeight(nvars, hc.products);
    const upper = hc.products * weight + hc.literals;
    const big = method === 'exact';
    const outcome = exactCover(onCubes, h.target.care, nvars, weight, upper, {
        maxPrimes: big ? 1_000_000 : options.maxPrimes ?? 4000,
        maxRows: big ? 10_000_000 : options.maxRows ?? 20000,
        // In 'auto' the exact search gets time in proportion to the heuristic's (it is an
        // improvement step); 'exact' may use the whole budget.
        // When even the OFF-set was too large to compute (one-hot style covers), the covering
        // problem is too: the exact step then only gets its minimum time.
        deadline: big ? deadline : Math.min(deadline, cpuNow() + Math.max(options.exactMinMs ?? 15,
            h.target.off === null ? 0 : (options.exactFactor ?? 0.5) * heuristicMs)),
    });
    if (outcome === null) return { cover, exact: false };
    if (outcome.cover && cheaper(coverCost(outcome.cover, nvars), hc)) cover = outcome.cover;
    return { cover, exact: outcome.proven };
}
