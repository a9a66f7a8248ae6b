/**
 * Minimum-cost unate covering by branch and bound: choose columns so that every row has a
 * chosen column, at least total cost.
 *
 * Each node applies the classic reductions to a fixed point — essential columns (a row with a
 * single column), row dominance (a row whose columns include another row's is implied) and
 * column dominance (a column covering a subset of another's rows at no lower cost is never
 * needed) — bounds by a maximal independent set of rows (pairwise without common column: each
 * needs its own column), and branches on the columns of a shortest row.
 */

export interface CoverProblem {
    /** For every row, the columns that cover it. */
    readonly rows: readonly (readonly number[])[];
    readonly columns: number;
    readonly cost: readonly number[];
}

export interface CoverSolution {
    /** Best columns found below the upper bound, or null when none was found. */
    readonly columns: number[] | null;
    readonly cost: number;
    /** True when the search finished: nothing cheaper than `cost` (or the bound) exists. */
    readonly complete: boolean;
}

interface Node {
    rows: number[];
    colActive: Uint8Array;
    chosen: number[];
    cost: number;
}

class OutOfTime extends Error {}

export function solveCover(p: CoverProblem, upperBound: number, deadline: number): CoverSolution {
    const nCols = p.columns;
    const cw = (nCols + 31) >>> 5;
    const rowBits: Uint32Array[] = p.rows.map((cols) => {
        const b = new Uint32Array(cw);
        for (const c of cols) b[c >>> 5]! |= 1 << (c & 31);
        return b;
    });
    const colRows: number[][] = Array.from({ length: nCols }, () => []);
    p.rows.forEach((cols, r) => { for (const c of cols) colRows[c]!.push(r); });
    let best: number[] | null = null;
    let bestCost = upperBound;
    let nodes = 0;
    const eps = 1e-9;

    const activeColsOf = (r: number, colActive: Uint8Array): number[] => {
        const out: number[] = [];
        for (const c of p.rows[r]!) if (colActive[c]) out.push(c);
        return out;
    };

    const choose = (n: Node, c: number): void => {
        n.chosen.push(c);
        n.cost += p.cost[c]!;
        n.colActive[c] = 0;
        const b = Math.floor(c / 32);
        const bit = 1 << (c & 31);
        n.rows = n.rows.filter((r) => (rowBits[r]![b]! & bit) === 0);
    };

    /** Reductions to a fixed point; false when some row can no longer be covered. */
    const reduceNode = (n: Node): boolean => {
        for (;;) {
            let changed = false;
            // Essential columns.
            for (let i = 0; i < n.rows.length; i++) {
                const cols = activeColsOf(n.rows[i]!, n.colActive);
                if (cols.length === 0) return false;
                if (cols.length === 1) { choose(n, cols[0]!); changed = true; i = -1; }
            }
            if (n.rows.length === 0) return true;
            const active = new Uint32Array(cw);
            for (let c = 0; c < nCols; c++) if (n.colActive[c]) active[c >>> 5]! |= 1 << (c & 31);
            // Row dominance: drop rows implied by a row with fewer columns.
            const masked = n.rows.map((r) => {
                const b = new Uint32Array(cw);
                const src = rowBits[r]!;
                let count = 0;
                for (let i = 0; i < cw; i++) { b[i] = src[i]! & active[i]!; count += popcount(b[i]!); }
                return { r, b, count };
            });
            masked.sort((x, y) => x.count - y.count || x.r - y.r);
            const keptRows: typeof masked = [];
            outer: for (const m of masked) {
                for (const k of keptRows) {
                    if (k.count > m.count) break;
                    let sub = true;
                    for (let i = 0; i < cw; i++) if ((k.b[i]! & ~m.b[i]!) !== 0) { sub = false; break; }
                    if (sub) { changed = true; continue outer; }
                }
                keptRows.push(m);
                // keep keptRows sorted by count (masked is sorted, so pushes keep order)
            }
            n.rows = keptRows.map((k) => k.r);
            // Column dominance over the remaining rows.
            const rw = (n.rows.length + 31) >>> 5;
            const colsHere: number[] = [];
            for (let c = 0; c < nCols; c++) if (n.colActive[c]) colsHere.push(c);
            if (colsHere.length * colsHere.length * rw <= 4_000_000) {
                const rowIndex = new Map<number, number>();
                n.rows.forEach((r, i) => rowIndex.set(r, i));
                const cb = new Map<number, { b: Uint32Array; count: number }>();
                for (const c of colsHere) {
                    const b = new Uint32Array(rw);
                    let count = 0;
                    for (const r of colRows[c]!) {
                        const i = rowIndex.get(r);
                        if (i !== undefined) { b[i >>> 5]! |= 1 << (i & 31); count++; }
                    }
                    cb.set(c, { b, count });
                }
                for (const a of colsHere) {
                    const A = cb.get(a)!;
                    if (A.count === 0) { n.colActive[a] = 0; changed = true; continue; }
                    for (const c of colsHere) {
                        if (c === a || !n.colActive[c]) continue;
                        const C = cb.get(c)!;
                        if (C.count < A.count) continue;
                        if (p.cost[c]! > p.cost[a]! + eps) continue;
                        if (C.count === A.count && p.cost[c]! >= p.cost[a]! - eps && c > a) {
                            // Equal rows and cost: keep the lower index only.
                            let same = true;
                            for (let i = 0; i < rw; i++) if (A.b[i] !== C.b[i]) { same = false; break; }
                            if (same) continue;
                        }
                        let sub = true;
                        for (let i = 0; i < rw; i++) if ((A.b[i]! & ~C.b[i]!) !== 0) { sub = false; break; }
                        if (sub) { n.colActive[a] = 0; changed = true; break; }
                    }
                }
            }
            if (!changed) return true;
        }
    };

    /** Lower bound: a maximal set of rows no two of which share a column. */
    const lowerBound = (n: Node): { bound: number; row: number } => {
        const lens = n.rows.map((r) => ({ r, cols: activeColsOf(r, n.colActive) }));
        lens.sort((x, y) => x.cols.length - y.cols.length || x.r - y.r);
        const used = new Uint8Array(nCols);
        let bound = 0;
        for (const { cols } of lens) {
            if (cols.some((c) => used[c])) continue;
            let m = Infinity;
            for (const c of cols) { used[c] = 1; if (p.cost[c]! < m) m = p.cost[c]!; }
            bound += m;
        }
        return { bound, row: lens.length ? lens[0]!.r : -1 };
    };

    const search = (n: Node): void => {
        if ((++nodes & 15) === 0 && Date.now() > deadline) throw new OutOfTime();
        if (!reduceNode(n)) return;
        if (n.rows.length === 0) {
            if (n.cost < bestCost - eps) { bestCost = n.cost; best = [...n.chosen]; }
            return;
        }
        const { bound, row } = lowerBound(n);
        if (n.cost + bound >= bestCost - eps) return;
        const cols = activeColsOf(row, n.colActive);
        const coverage = (c: number) => colRows[c]!.length;
        cols.sort((a, b) => p.cost[a]! - p.cost[b]! || coverage(b) - coverage(a) || a - b);
        const excluded = n.colActive.slice();
        for (const c of cols) {
            const child: Node = { rows: [...n.rows], colActive: excluded.slice(), chosen: [...n.chosen], cost: n.cost };
            choose(child, c);
            search(child);
            excluded[c] = 0;
        }
    };

    const root: Node = { rows: p.rows.map((_, i) => i), colActive: new Uint8Array(nCols).fill(1), chosen: [], cost: 0 };
    try {
        search(root);
        return { columns: best, cost: bestCost, complete: true };
    } catch (e) {
        if (e instanceof OutOfTime) return { columns: best, cost: bestCost, complete: false };
        throw e;
    }
}

function popcount(x: number): number {
    x = x - ((x >>> 1) & 0x55555555);
    x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
    return (((x + (x >>> 4)) & 0x0f0f0f0f) * 0x01010101) >>> 24;
}
