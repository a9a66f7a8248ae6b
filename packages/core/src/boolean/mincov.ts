/**
 * Minimum-cost unate covering by branch and bound: choose columns so that every row has a
 * chosen column, at least total cost.
 *
 * Each node rebuilds a dense bit table of what is left and applies the classic reductions to
 * a fixed point — essential columns (a row with a single column), row dominance (a row whose
 * columns include another row's is implied) and column dominance (a column covering a subset of
 * another's rows at no lower cost is never needed) — bounds the node by Lagrangian relaxation
 * (mincov-lagrangian.ts), fixes columns by their reduced costs, and branches on the columns of a
 * shortest row, excluding earlier siblings' columns. An optional limit on the number of columns
 * serves the second, literal-counting pass of exact minimization (exact.ts).
 */
import { cpuNow } from './clock.js';
import { type CoverView, greedyCover, lagrangianBound, roundUpBound } from './mincov-lagrangian.js';

export interface CoverProblem {
    /** For every row, the columns that cover it. */
    readonly rows: readonly (readonly number[])[];
    readonly columns: number;
    readonly cost: readonly number[];
    /** At most this many columns (default: no limit). */
    readonly maxColumns?: number;
}

export interface CoverSolution {
    /** Best columns found below the upper bound, or null when none was found. */
    readonly columns: number[] | null;
    readonly cost: number;
    /** True when the search finished: nothing cheaper than `cost` (or the bound) exists. */
    readonly complete: boolean;
    /** Work spent (same units as maxWork). */
    readonly work: number;
}

class OutOfTime extends Error {}

const EPS = 1e-9;
/** Nodes at most this deep try a Lagrangian greedy cover. */
const GREEDY_DEPTH = 3;

/** A node's table: rows and columns renumbered densely, both directions as bitsets. */
interface Table {
    rows: number[];      // global row ids
    cols: number[];      // global column ids
    cw: number;          // words per row bitset
    rw: number;          // words per column bitset
    rowBits: Uint32Array; // row i over local columns at [i * cw, (i + 1) * cw) — one array, not one per row
    colBits: Uint32Array; // column j over local rows at [j * rw, (j + 1) * rw)
    rowCount: Int32Array;
    colCount: Int32Array;
}


/**
 * `maxWork` bounds the search deterministically (in bit-table word operations, counted per
 * reduction pass); `deadline` (CPU ms, clock.ts) is a safety net only.
 */
export function solveCover(p: CoverProblem, upperBound: number, deadline: number, maxWork = Infinity): CoverSolution {
    const nCols = p.columns;
    const colRows: number[][] = Array.from({ length: nCols }, () => []);
    p.rows.forEach((cols, r) => { for (const c of cols) colRows[c]!.push(r); });
    const localCol = new Int32Array(nCols).fill(-1);
    const localRow = new Int32Array(p.rows.length).fill(-1);
    let best: number[] | null = null;
    let bestCost = upperBound;
    let work = 0;

    // Table storage, one set per search depth: a node's table lives while its children are
    // searched (one depth down), and the passes of one node overwrite their own. Reusing it
    // instead of allocating per pass keeps the collector out of the search.
    const pools: { rowBits: Uint32Array; colBits: Uint32Array; rowCount: Int32Array; colCount: Int32Array }[] = [];
    const grow = <T extends Uint32Array | Int32Array>(a: T, n: number, make: (n: number) => T): T => {
        if (a.length >= n) { a.fill(0, 0, n); return a; }
        return make(n);
    };
    // Pass-scoped scratch (reduceTable does not recurse), sized for the root table.
    const nRowsAll = p.rows.length;
    const scratchRow = new Uint8Array(nRowsAll);
    const scratchRow2 = new Uint8Array(nRowsAll);
    const scratchPos = new Int32Array(nRowsAll);
    const scratchCol = new Uint8Array(nCols);
    const scratchCol2 = new Uint8Array(nCols);
    const scratchCost = new Float64Array(nCols);
    const scratchSupR = new Uint32Array((nRowsAll + 31) >>> 5);
    const scratchSupC = new Uint32Array((nCols + 31) >>> 5);

    const scratchOrder = new Int32Array(nRowsAll);
    const countStart = new Int32Array(nCols + 2);
    /** Local rows by ascending column count, ties by index (a stable counting sort) into out. */
    const rowsByCount = (t: Table, out: Int32Array): Int32Array => {
        const nr = t.rows.length;
        const nc = t.cols.length;
        countStart.fill(0, 0, nc + 2);
        for (let i = 0; i < nr; i++) countStart[t.rowCount[i]! + 1]!++;
        for (let k = 1; k <= nc + 1; k++) countStart[k]! += countStart[k - 1]!;
        for (let i = 0; i < nr; i++) out[countStart[t.rowCount[i]!]!++] = i;
        return out;
    };

    const parity: number[] = [];
    /**
     * The table of rows × cols. With `src`, rows and cols are subsequences of src's (in order),
     * and each row's columns are read from src's bits — only the columns still alive — instead
     * of the row's full column list. Two storage sets per depth, alternated, so that src may be
     * the previous pass of the same node.
     */
    const build = (rows: number[], cols: number[], depth: number, src: Table | null): Table => {
        cols.forEach((c, i) => { localCol[c] = i; });
        rows.forEach((r, i) => { localRow[r] = i; });
        const cw = (cols.length + 31) >>> 5;
        const rw = (rows.length + 31) >>> 5;
        const slot = 2 * depth + (parity[depth] = (parity[depth] ?? 0) ^ 1);
        const pool = pools[slot] ??= { rowBits: new Uint32Array(0), colBits: new Uint32Array(0), rowCount: new Int32Array(0), colCount: new Int32Array(0) };
        const rowBits = pool.rowBits = grow(pool.rowBits, rows.length * cw, (n) => new Uint32Array(n));
        const colBits = pool.colBits = grow(pool.colBits, cols.length * rw, (n) => new Uint32Array(n));
        const rowCount = pool.rowCount = grow(pool.rowCount, rows.length, (n) => new Int32Array(n));
        const colCount = pool.colCount = grow(pool.colCount, cols.length, (n) => new Int32Array(n));
        if (src !== null) {
            const scw = src.cw;
            let io = 0;
            for (let i = 0; i < rows.length; i++) {
                while (src.rows[io] !== rows[i]) io++;
                const so = io * scw;
                for (let w = 0; w < scw; w++) {
                    let y = src.rowBits[so + w]!;
                    while (y !== 0) {
                        const b = y & -y;
                        y ^= b;
                        const j = localCol[src.cols[w * 32 + 31 - Math.clz32(b)]!]!;
                        if (j < 0) continue;
                        rowBits[i * cw + (j >>> 5)]! |= 1 << (j & 31);
                        colBits[j * rw + (i >>> 5)]! |= 1 << (i & 31);
                        rowCount[i]!++;
                        colCount[j]!++;
                    }
                }
            }
        } else for (let i = 0; i < rows.length; i++) {
            for (const c of p.rows[rows[i]!]!) {
                const j = localCol[c]!;
                if (j < 0) continue;
                rowBits[i * cw + (j >>> 5)]! |= 1 << (j & 31);
                colBits[j * rw + (i >>> 5)]! |= 1 << (i & 31);
                rowCount[i]!++;
                colCount[j]!++;
            }
        }
        for (const c of cols) localCol[c] = -1;
        for (const r of rows) localRow[r] = -1;
        return { rows, cols, cw, rw, rowBits, colBits, rowCount, colCount };
    };

    /**
     * Applies the reductions until nothing changes. Returns the table left (possibly empty),
     * or null when a row has no column left. Chosen columns go to `chosen`, their cost to acc.
     */
    const reduceTable = (rows: number[], cols: number[], chosen: number[], acc: { cost: number }, depth: number, from: Table | null): Table | null => {
        let src = from;
        // Dominance checks are quadratic; past this many word operations they are skipped.
        const effort = 8_000_000;
        for (;;) {
            if (cpuNow() > deadline) throw new OutOfTime();
            const t = build(rows, cols, depth, src);
            src = t;
            const nr = t.rows.length;
            const nc = t.cols.length;
            const cw = (nc + 31) >>> 5;
            const rw = (nr + 31) >>> 5;
            // Per pass: building the table, both dominance checks, and a fixed cost per node
            // (allocation, sorting, the bound) that small tables are dominated by.
            // A dominance check ANDs, for every row (column), the bitsets of its columns (rows):
            // one word operation per entry per word of the other side.
            let nnz = 0;
            for (let i = 0; i < nr; i++) nnz += t.rowCount[i]!;
            const rowDominanceWork = (nnz + nr) * rw;
            const colDominanceWork = (nnz + nc) * cw;
            work += 2000 + 16 * (nr + nc) + nr * cw + nc * rw + Math.min(effort, rowDominanceWork) + Math.min(effort, colDominanceWork);
            if (work > maxWork) throw new OutOfTime();
            if (nr === 0) return t;
            // Essential columns.
            const taken = scratchCol; taken.fill(0, 0, nc);
            let anyEssential = false;
            for (let i = 0; i < nr; i++) {
                const k = t.rowCount[i]!;
                if (k === 0) return null;
                if (k === 1) {
                    const bits = t.rowBits;
                    const o = i * cw;
                    for (let w = 0; w < cw; w++) if (bits[o + w] !== 0) { taken[w * 32 + 31 - Math.clz32(bits[o + w]! & -bits[o + w]!)] = 1; break; }
                    anyEssential = true;
                }
            }
            if (anyEssential) {
                const coveredRows = scratchRow2; coveredRows.fill(0, 0, nr);
                const keptCols: number[] = [];
                for (let j = 0; j < nc; j++) {
                    if (!taken[j]) { keptCols.push(t.cols[j]!); continue; }
                    chosen.push(t.cols[j]!);
                    acc.cost += p.cost[t.cols[j]!]!;
                    const b = t.colBits;
                    const o = j * rw;
                    for (let i = 0; i < nr; i++) if ((b[o + (i >>> 5)]! >>> (i & 31)) & 1) coveredRows[i] = 1;
                }
                rows = t.rows.filter((_, i) => !coveredRows[i]);
                cols = keptCols;
                continue;
            }
            let changed = false;
            // Row dominance: a row containing another row's columns is implied by it.
            const order = rowsByCount(t, scratchOrder);
            const dropRow = scratchRow; dropRow.fill(0, 0, nr);
            if (rowDominanceWork <= effort) {
                // The rows holding every column of a are the AND of a's columns' row sets — a few
                // word operations per column of a, instead of a subset test against every row.
                // Same outcome as testing the pairs in `order`: a later row containing an
                // earlier kept row is dropped.
                const pos = scratchPos;
                for (let x = 0; x < nr; x++) pos[order[x]!] = x;
                const sup = scratchSupR;
                for (let x = 0; x < nr; x++) {
                    const a = order[x]!;
                    if (dropRow[a]) continue;
                    sup.fill(0xffffffff, 0, rw);
                    const ro = a * cw;
                    for (let w = 0; w < cw; w++) {
                        let y = t.rowBits[ro + w]!;
                        while (y !== 0) {
                            const bit = y & -y;
                            const co = (w * 32 + 31 - Math.clz32(bit)) * rw;
                            for (let k = 0; k < rw; k++) sup[k]! &= t.colBits[co + k]!;
                            y ^= bit;
                        }
                    }
                    for (let k = 0; k < rw; k++) {
                        let y = sup[k]!;
                        while (y !== 0) {
                            const bit = y & -y;
                            const b = k * 32 + 31 - Math.clz32(bit);
                            y ^= bit;
                            if (b >= nr || pos[b]! <= x || dropRow[b]) continue;
                            dropRow[b] = 1; changed = true;
                        }
                    }
                }
            }
            // Column dominance: a column whose rows lie within a no-dearer column's is not needed.
            const dropCol = scratchCol2; dropCol.fill(0, 0, nc);
            if (colDominanceWork <= effort) {
                // Local copies: the pair loop below is the hottest of the search.
                const cc = t.colCount;
                const colCost = scratchCost;
                for (let j = 0; j < nc; j++) colCost[j] = p.cost[t.cols[j]!]!;
                // The columns covering every row of a: the AND of a's rows' column sets (as for rows).
                const sup = scratchSupC;
                for (let a = 0; a < nc; a++) {
                    if (t.colCount[a] === 0) { dropCol[a] = 1; changed = true; continue; }
                    const ca = colCost[a]!;
                    const na = cc[a]!;
                    sup.fill(0xffffffff, 0, cw);
                    const co = a * rw;
                    for (let k = 0; k < rw; k++) {
                        let y = t.colBits[co + k]!;
                        while (y !== 0) {
                            const bit = y & -y;
                            const ro = (k * 32 + 31 - Math.clz32(bit)) * cw;
                            for (let w = 0; w < cw; w++) sup[w]! &= t.rowBits[ro + w]!;
                            y ^= bit;
                        }
                    }
                    let dominated = false;
                    for (let w = 0; w < cw && !dominated; w++) {
                        let y = sup[w]!;
                        while (y !== 0) {
                            const bit = y & -y;
                            const b = w * 32 + 31 - Math.clz32(bit);
                            y ^= bit;
                            if (b >= nc || b === a || dropCol[b]) continue;
                            const cb = colCost[b]!;
                            if (cb > ca + EPS) continue;
                            // Twins (same rows, same cost): keep the first.
                            if (cc[b] === na && cb >= ca - EPS && b > a) continue;
                            dominated = true;
                            break;
                        }
                    }
                    if (dominated) { dropCol[a] = 1; changed = true; }
                }
            }
            if (!changed) return t;
            rows = t.rows.filter((_, i) => !dropRow[i]);
            cols = t.cols.filter((_, j) => !dropCol[j]);
        }
    };

    // Row multipliers of the Lagrangian bound, by global row: a node starts from its parent's.
    const uRow = new Float64Array(p.rows.length);
    p.rows.forEach((cols, r) => {
        let m = Infinity;
        for (const c of cols) m = Math.min(m, p.cost[c]! / Math.max(1, colRows[c]!.length));
        uRow[r] = Number.isFinite(m) ? m : 0;
    });
    const integral = p.cost.every((c) => Number.isInteger(c));
    const maxColumns = p.maxColumns ?? Infinity;
    // The multiplier of the column-count limit, carried from node to node like uRow.
    const mu = { value: 0 };

    /** The table in compressed form, with its column costs and their range. */
    const viewOf = (t: Table): CoverView & { cmin: number; cmax: number } => {
        const nr = t.rows.length;
        const nc = t.cols.length;
        const colStart = new Int32Array(nc + 1);
        for (let j = 0; j < nc; j++) colStart[j + 1] = colStart[j]! + t.colCount[j]!;
        const colRow = new Int32Array(colStart[nc]!);
        const rowStart = new Int32Array(nr + 1);
        for (let i = 0; i < nr; i++) rowStart[i + 1] = rowStart[i]! + t.rowCount[i]!;
        const rowCol = new Int32Array(rowStart[nr]!);
        const fill = new Int32Array(nr);
        const cost = new Float64Array(nc);
        let cmin = Infinity;
        let cmax = 0;
        for (let j = 0; j < nc; j++) {
            const c = p.cost[t.cols[j]!]!;
            cost[j] = c;
            if (c < cmin) cmin = c;
            if (c > cmax) cmax = c;
            let at = colStart[j]!;
            const o = j * t.rw;
            for (let k = 0; k < t.rw; k++) {
                let y = t.colBits[o + k]!;
                while (y !== 0) {
                    const b = y & -y;
                    y ^= b;
                    const i = k * 32 + 31 - Math.clz32(b);
                    colRow[at++] = i;
                    rowCol[rowStart[i]! + fill[i]!++] = j;
                }
            }
        }
        work += 2 * colStart[nc]! + nr + nc;
        return { rowCount: nr, colCount: nc, colStart, colRow, rowStart, rowCol, cost, cmin, cmax };
    };
    const round = (bound: number, v: { cmin: number; cmax: number }): number =>
        integral ? roundUpBound(bound, v.cmin, v.cmax) : bound;

    const search = (rows: number[], cols: number[], chosen: number[], cost: number, depth: number, parent: Table | null): void => {
        if (cpuNow() > deadline) throw new OutOfTime();
        const acc = { cost };
        let t = reduceTable(rows, cols, chosen, acc, depth, parent);
        let view: CoverView & { cmin: number; cmax: number };
        let bound: number;
        let reduced: Float64Array;
        // Bound, then fix columns by reduced cost and reduce again, until nothing is fixed.
        for (let pass = 0; ; pass++) {
            if (t === null) return;
            if (acc.cost >= bestCost - EPS) return;
            if (chosen.length > maxColumns || (chosen.length === maxColumns && t.rows.length > 0)) return;
            if (t.rows.length === 0) {
                bestCost = acc.cost;
                best = [...chosen];
                return;
            }
            view = viewOf(t);
            const u = new Float64Array(view.rowCount);
            for (let i = 0; i < u.length; i++) u[i] = uRow[t.rows[i]!]!;
            const budget = bestCost - acc.cost;
            // The bound that prunes this node: a cover must cost at least `enough` more to lose.
            let enough = budget;
            if (integral && Number.isFinite(budget)) enough = budget - 1 + 1e-6;
            // The root starts from scratch; a child starts from its parent's multipliers, near
            // their optimum already, with smaller steps.
            const root = depth === 0 && pass === 0;
            const iterations = root ? 400 : 40;
            const lag = lagrangianBound(view, u, iterations, Number.isFinite(budget) ? budget : view.cmax * view.rowCount, enough,
                maxColumns - chosen.length, mu, root ? 2 : 0.5);
            work += lag.work;
            for (let i = 0; i < u.length; i++) uRow[t.rows[i]!] = u[i]!;
            if (lag.optimal !== null) {
                let c = acc.cost;
                for (const j of lag.optimal) c += view.cost[j]!;
                if (c < bestCost - EPS) { bestCost = c; best = [...chosen, ...lag.optimal.map((j) => t!.cols[j]!)]; }
                return;
            }
            // A cover built from the reduced costs: deep in the tree the incumbent is rarely
            // improved this way, so only near the root.
            const greedy = depth <= GREEDY_DEPTH ? greedyCover(view, lag.reduced) : { columns: [], cost: Infinity, work: 0 };
            work += greedy.work;
            if (acc.cost + greedy.cost < bestCost - EPS && chosen.length + greedy.columns.length <= maxColumns) {
                bestCost = acc.cost + greedy.cost;
                best = [...chosen, ...greedy.columns.map((j) => t!.cols[j]!)];
            }
            if (work > maxWork) throw new OutOfTime();
            bound = lag.bound;
            reduced = lag.reduced;
            if (acc.cost + round(bound, view) >= bestCost - EPS) return;
            // A column whose reduced cost lifts the bound past the incumbent cannot be in a cheaper
            // cover; one whose exclusion does must be in every cheaper cover.
            const keep: number[] = [];
            const forced: number[] = [];
            for (let j = 0; j < view.colCount; j++) {
                const r = reduced[j]!;
                if (r >= 0 && acc.cost + round(bound + r, view) >= bestCost - EPS) continue;
                if (r < 0 && acc.cost + round(bound - r, view) >= bestCost - EPS) { forced.push(j); continue; }
                keep.push(j);
            }
            if (keep.length + forced.length === view.colCount && forced.length === 0) break;
            let nextRows = t.rows;
            if (forced.length > 0) {
                const covered = new Uint8Array(view.rowCount);
                for (const j of forced) {
                    chosen.push(t.cols[j]!);
                    acc.cost += view.cost[j]!;
                    for (let k = view.colStart[j]!; k < view.colStart[j + 1]!; k++) covered[view.colRow[k]!] = 1;
                }
                nextRows = t.rows.filter((_, i) => !covered[i]);
            }
            t = reduceTable(nextRows, keep.map((j) => t!.cols[j]!), chosen, acc, depth, t);
        }
        const tt = t;
        // Branch on a shortest row; each child takes one of its columns, later children may
        // not take the columns of earlier ones. Children in order of reduced cost: the likeliest
        // members of a cheap cover first.
        let row = 0;
        for (let i = 1; i < tt.rows.length; i++) if (tt.rowCount[i]! < tt.rowCount[row]!) row = i;
        const options: number[] = [];
        for (let q = view.rowStart[row]!; q < view.rowStart[row + 1]!; q++) options.push(view.rowCol[q]!);
        options.sort((a, b) => reduced[a]! - reduced[b]! || a - b);
        const saved = new Float64Array(tt.rows.length);
        for (let i = 0; i < saved.length; i++) saved[i] = uRow[tt.rows[i]!]!;
        const savedMu = mu.value;
        const excluded = new Uint8Array(tt.cols.length);
        // The parent's multipliers bound each child: taking j adds max(0, s_j), and every
        // earlier sibling it may not take adds back what its negative reduced cost subtracted.
        let bannedLift = 0;
        for (const j of options) {
            const r = reduced[j]!;
            const childBound = bound + Math.max(0, r) + bannedLift;
            bannedLift += Math.max(0, -r);
            excluded[j] = 1;
            if (acc.cost + round(childBound, view) >= bestCost - EPS) continue;
            for (let i = 0; i < saved.length; i++) uRow[tt.rows[i]!] = saved[i]!;
            mu.value = savedMu;
            const c = tt.cols[j]!;
            const o = j * tt.rw;
            const childRows = tt.rows.filter((_, i) => ((tt.colBits[o + (i >>> 5)]! >>> (i & 31)) & 1) === 0);
            const childCols = tt.cols.filter((_, k) => !excluded[k]);
            const base = chosen.length;
            chosen.push(c);
            search(childRows, childCols, chosen, acc.cost + p.cost[c]!, depth + 1, tt);
            chosen.length = base;
        }
    };

    // Without an upper bound, a greedy cover of the whole table first: whatever the work limit,
    // the search then returns a cover.
    if (!Number.isFinite(bestCost) && p.rows.every((row) => row.length > 0)) {
        const first = greedyCover(problemView(p, colRows), new Float64Array(nCols));
        if (first.columns.length <= maxColumns) { best = first.columns; bestCost = first.cost; }
    }
    const chosenRoot: number[] = [];
    try {
        search(p.rows.map((_, i) => i), Array.from({ length: nCols }, (_, j) => j), chosenRoot, 0, 0, null);
        return { columns: best, cost: bestCost, complete: true, work };
    } catch (e) {
        if (e instanceof OutOfTime) return { columns: best, cost: bestCost, complete: false, work };
        throw e;
    }
}

/** The whole problem in compressed form (for the first greedy cover). */
function problemView(p: CoverProblem, colRows: readonly (readonly number[])[]): CoverView {
    const colStart = new Int32Array(p.columns + 1);
    colRows.forEach((rows, j) => { colStart[j + 1] = colStart[j]! + rows.length; });
    const rowStart = new Int32Array(p.rows.length + 1);
    p.rows.forEach((cols, i) => { rowStart[i + 1] = rowStart[i]! + cols.length; });
    return {
        rowCount: p.rows.length, colCount: p.columns, colStart, rowStart,
        colRow: Int32Array.from(colRows.flat()), rowCol: Int32Array.from(p.rows.flat()), cost: Float64Array.from(p.cost),
    };
}

