/**
 * Lower bounds and cheap covers for one node of the covering search, from the Lagrangian
 * relaxation of the covering constraints (subgradient optimization of the row multipliers).
 *
 * For multipliers u ≥ 0, L(u) = Σ u_i + Σ_j min(0, s_j) with reduced costs s_j = c_j − Σ_{i∈j} u_i
 * is below every cover's cost. The bound approaches the linear-programming bound, far above the
 * independent-set bound on the dense tables of two-level minimization, and the reduced costs
 * tell which columns cannot be in (or must be in) a cover cheaper than the incumbent.
 */

/** A table in compressed form: rows of every column and columns of every row, local indices. */
export interface CoverView {
    readonly rowCount: number;
    readonly colCount: number;
    readonly colStart: Int32Array;
    readonly colRow: Int32Array;
    readonly rowStart: Int32Array;
    readonly rowCol: Int32Array;
    readonly cost: Float64Array;
}

export interface LagrangianOutcome {
    /** The best L(u) seen. */
    readonly bound: number;
    /** The multipliers that gave it (in `u`, updated in place) and the reduced costs there. */
    readonly reduced: Float64Array;
    /** Local columns of a cover proven optimal for this table (complementary slackness), or null. */
    readonly optimal: number[] | null;
    /** Work spent, in entry visits. */
    readonly work: number;
}

/**
 * Subgradient optimization from the multipliers in `u` (updated in place to the best found).
 * `target` is a cost some cover reaches (the step size aims at it); the loop stops early once
 * the bound reaches `enough` (the node is pruned then) or stops improving.
 */
export function lagrangianBound(
    v: CoverView, u: Float64Array, iterations: number, target: number, enough: number, slots = Infinity, mu: { value: number } = { value: 0 },
    startStep = 2,
): LagrangianOutcome {
    const { rowCount: nr, colCount: nc, colStart, colRow, cost } = v;
    // With at most `slots` more columns allowed, that constraint is relaxed too, with multiplier
    // mu ≥ 0: every column costs mu more and the bound gives back mu·slots.
    const limited = Number.isFinite(slots);
    let m = limited ? mu.value : 0;
    let bestMu = m;
    const s = new Float64Array(nc);
    const bestS = new Float64Array(nc);
    const bestU = new Float64Array(nr);
    const g = new Float64Array(nr);
    let best = -Infinity;
    let lambda = startStep;
    let stall = 0;
    let work = 0;
    let optimal: number[] | null = null;
    for (let it = 0; it < iterations; it++) {
        let sumU = 0;
        for (let i = 0; i < nr; i++) sumU += u[i]!;
        let lag = sumU - m * (limited ? slots : 0);
        let negatives = 0;
        for (let j = 0; j < nc; j++) {
            let r = cost[j]! + m;
            for (let k = colStart[j]!; k < colStart[j + 1]!; k++) r -= u[colRow[k]!]!;
            s[j] = r;
            if (r < 0) { lag += r; negatives++; }
        }
        work += 2 * colStart[nc]! + nr + nc;
        if (it === 0 || lag > best + 1e-9 * Math.max(1, Math.abs(best))) {
            best = lag;
            bestU.set(u);
            bestS.set(s);
            bestMu = m;
            stall = 0;
        } else if (++stall >= 4) {
            lambda /= 2;
            stall = 0;
        }
        if (best >= enough || lambda < 1e-4) break;
        // Subgradient: 1 − (columns with negative reduced cost covering the row), projected so
        // that multipliers at zero are not pushed below it.
        g.fill(1);
        for (let j = 0; j < nc; j++) {
            if (s[j]! >= 0) continue;
            for (let k = colStart[j]!; k < colStart[j + 1]!; k++) g[colRow[k]!]!--;
        }
        let norm = 0;
        let feasible = true;
        for (let i = 0; i < nr; i++) {
            const k = g[i]!;
            if (k > 0) feasible = false;
            else if (k < 0 && u[i]! <= 0) g[i] = 0;
            norm += g[i]! * g[i]!;
        }
        let gMu = limited ? negatives - slots : 0;
        if (gMu < 0 && m <= 0) gMu = 0;
        if (negatives > slots) feasible = false;
        norm += gMu * gMu;
        if (norm === 0) {
            // Every row covered, every over-covered row priced at zero: the columns of negative
            // reduced cost form a cover costing exactly L(u), hence a minimum one.
            if (feasible && lag >= best - 1e-9 * Math.max(1, Math.abs(best))) {
                optimal = [];
                for (let j = 0; j < nc; j++) if (s[j]! < 0) optimal.push(j);
                best = Math.max(best, lag);
                bestU.set(u);
                bestS.set(s);
                bestMu = m;
            }
            break;
        }
        const gap = Math.max(target - lag, 1e-6 * Math.max(1, Math.abs(target)));
        const step = (lambda * gap) / norm;
        for (let i = 0; i < nr; i++) {
            const x = u[i]! + step * g[i]!;
            u[i] = x > 0 ? x : 0;
        }
        if (limited) m = Math.max(0, m + step * gMu);
    }
    u.set(bestU);
    mu.value = bestMu;
    return { bound: best, reduced: bestS, optimal, work };
}

/**
 * A cover of the table guided by reduced costs: the columns of negative reduced cost, then for
 * each row still bare its column of least cost per newly covered row, then redundant columns
 * dropped, dearest first. Returns local columns and their cost.
 */
export function greedyCover(v: CoverView, reduced: Float64Array): { readonly columns: number[]; readonly cost: number; readonly work: number } {
    const { rowCount: nr, colCount: nc, colStart, colRow, rowStart, rowCol, cost } = v;
    const hits = new Int32Array(nr);
    const taken = new Uint8Array(nc);
    let work = colStart[nc]!;
    const take = (j: number): void => {
        taken[j] = 1;
        for (let k = colStart[j]!; k < colStart[j + 1]!; k++) hits[colRow[k]!]!++;
    };
    for (let j = 0; j < nc; j++) if (reduced[j]! < 0) take(j);
    for (let i = 0; i < nr; i++) {
        if (hits[i]! > 0) continue;
        let pick = -1;
        let pickScore = Infinity;
        for (let q = rowStart[i]!; q < rowStart[i + 1]!; q++) {
            const j = rowCol[q]!;
            let fresh = 0;
            for (let k = colStart[j]!; k < colStart[j + 1]!; k++) if (hits[colRow[k]!] === 0) fresh++;
            work += colStart[j + 1]! - colStart[j]!;
            const score = (cost[j]! + Math.max(reduced[j]!, 0)) / fresh;
            if (score < pickScore) { pickScore = score; pick = j; }
        }
        take(pick);
    }
    const order: number[] = [];
    for (let j = 0; j < nc; j++) if (taken[j]) order.push(j);
    order.sort((a, b) => cost[b]! - cost[a]! || a - b);
    let total = 0;
    const columns: number[] = [];
    for (const j of order) {
        let needed = false;
        for (let k = colStart[j]!; k < colStart[j + 1]!; k++) if (hits[colRow[k]!] === 1) { needed = true; break; }
        if (!needed) {
            for (let k = colStart[j]!; k < colStart[j + 1]!; k++) hits[colRow[k]!]!--;
            continue;
        }
        columns.push(j);
        total += cost[j]!;
    }
    return { columns, cost: total, work };
}

/**
 * The least cost at or above `bound` that some set of columns with costs in [cmin, cmax] can
 * have, for integer costs: k columns cost at least k·cmin, and k ≥ ⌈bound / cmax⌉. When every
 * cost is one product weight plus a few literals, this rounds a bound of 28.3 products to 29.
 */
export function roundUpBound(bound: number, cmin: number, cmax: number): number {
    if (bound <= 0) return Math.max(0, bound);
    const b = Math.ceil(bound - 1e-6 * Math.max(1, bound));
    if (cmax <= 0) return b;
    const k = Math.ceil(b / cmax - 1e-9);
    return Math.max(b, k * cmin);
}
