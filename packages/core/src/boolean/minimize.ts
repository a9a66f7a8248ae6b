/**
 * Two-level minimization entry point. OWNED BY the minimizer work (issue 3): exact for
 * tractable functions, Espresso-style expand/irredundant/reduce beyond.
 *
 * PLACEHOLDER until the minimizer lands: returns the ON-set without contained cubes, which is
 * a correct (unminimized) cover so that downstream code and its tests can be built.
 */
import type { Cube } from './cube.js';
import { removeContained } from './cover.js';

export interface MinimizeOptions {
    /** 'auto': exact when tractable, heuristic beyond. */
    readonly method?: 'auto' | 'exact' | 'heuristic';
    /** Wall-clock budget for one function, in milliseconds. */
    readonly budgetMs?: number;
}

export interface MinimizeResult {
    readonly cover: Cube[];
    /** True when the cover is proven minimal (fewest products, then fewest literals). */
    readonly exact: boolean;
}

/** Minimizes f with ON-set `on` and don't-care set `dc` (both covers over `nvars` variables). */
export function minimize(on: readonly Cube[], dc: readonly Cube[], nvars: number, options: MinimizeOptions = {}): MinimizeResult {
    void dc; void nvars; void options;
    return { cover: removeContained(on), exact: false };
}
