/**
 * Minimum-cost unate covering by branch and bound: choose columns so that every row has a
 * chosen column, at least total cost.
 *
 * Each node rebuilds a dense bit table of what is left and applies the classic reductions to
 * a fixed point — essential columns (a row with a single column), row dominance (a row whose
 * columns include another row's is implied) and column dominance (a column covering a subset of
 * another's rows at no lower cost is never needed) — bounds by a maximal independent set of
 * rows (pairwise without common column: each needs its own column), and branches on the
 * columns of a shortest row, excluding earlier siblings' columns.
 */
import { cpuNow } from './clock.js';

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
    /** Work spent (same units as maxWork). */
    readonly work: number;
}

class OutOfTime extends Error {}

const EPS = 1e-9;

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
            work += 2000 + 16 * (nr + nc) + nr * cw + nc * rw + Math.min(effort, nr * nr * cw) + Math.min(effort, nc * nc * rw);
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
            if (nr * nr * cw <= effort) {
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
            if (nc * nc * rw <= effort) {
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

    /** Maximal independent set of rows (greedy, shortest rows first): a lower bound. */
    const lowerBound = (t: Table, order: Int32Array): number => {
        const cw = t.cw;
        const used = new Uint32Array(cw);
        let bound = 0;
        for (const i of order) {
            const bits = t.rowBits;
            const o = i * cw;
            let clash = false;
            for (let w = 0; w < cw; w++) if ((bits[o + w]! & used[w]!) !== 0) { clash = true; break; }
            if (clash) continue;
            let m = Infinity;
            for (let w = 0; w < cw; w++) {
                used[w] = (used[w]! | bits[o + w]!) >>> 0;
                let y = bits[o + w]!;
                while (y !== 0) {
                    const b = y & -y;
                    const c = p.cost[t.cols[w * 32 + 31 - Math.clz32(b)]!]!;
                    if (c < m) m = c;
                    y ^= b;
                }
            }
            bound += m;
        }
        return bound;
    };

    /** True when the child (rows outside column bits at colBits[o…], columns outside `banned`) cannot beat bestCost. */
    const childBoundExceeded = (t: Table, order: Int32Array, colBits: Uint32Array, o: number, banned: Uint32Array, base: number): boolean => {
        if (base >= bestCost - EPS) return true;
        const cw = t.cw;
        const used = new Uint32Array(cw);
        const bits = t.rowBits;
        work += 200 + order.length * cw;
        let bound = base;
        for (const i of order) {
            if ((colBits[o + (i >>> 5)]! >>> (i & 31)) & 1) continue;
            const ro = i * cw;
            let clash = false;
            let empty = true;
            for (let w = 0; w < cw; w++) {
                const x = bits[ro + w]! & ~banned[w]!;
                if (x !== 0) empty = false;
                if ((x & used[w]!) !== 0) { clash = true; break; }
            }
            if (clash) continue;
            if (empty) return true;
            let m = Infinity;
            for (let w = 0; w < cw; w++) {
                let y = (bits[ro + w]! & ~banned[w]!) >>> 0;
                used[w] = (used[w]! | y) >>> 0;
                while (y !== 0) {
                    const b = y & -y;
                    const cst = p.cost[t.cols[w * 32 + 31 - Math.clz32(b)]!]!;
                    if (cst < m) m = cst;
                    y ^= b;
                }
            }
            bound += m;
            if (bound >= bestCost - EPS) return true;
        }
        return false;
    };

    const search = (rows: number[], cols: number[], chosen: number[], cost: number, depth: number, parent: Table | null): void => {
        if (cpuNow() > deadline) throw new OutOfTime();
        const acc = { cost };
        const t = reduceTable(rows, cols, chosen, acc, depth, parent);
        if (t === null) return;
        if (acc.cost >= bestCost - EPS) return;
        if (t.rows.length === 0) {
            bestCost = acc.cost;
            best = [...chosen];
            return;
        }
        // Rows by ascending column count: the bound's order, reused by the children's bounds.
        const rowOrder = rowsByCount(t, new Int32Array(t.rows.length));
        if (acc.cost + lowerBound(t, rowOrder) >= bestCost - EPS) return;
        // Branch on a shortest row; each child takes one of its columns, later children may
        // not take the columns of earlier ones.
        let row = 0;
        for (let i = 1; i < t.rows.length; i++) if (t.rowCount[i]! < t.rowCount[row]!) row = i;
        const bits = t.rowBits;
        const options: number[] = [];
        for (let w = 0; w < t.cw; w++) {
            let y = bits[row * t.cw + w]!;
            while (y !== 0) { const b = y & -y; options.push(w * 32 + 31 - Math.clz32(b)); y ^= b; }
        }
        options.sort((a, b) => p.cost[t.cols[a]!]! - p.cost[t.cols[b]!]! || t.colCount[b]! - t.colCount[a]! || a - b);
        const excluded = new Uint8Array(t.cols.length);
        // Columns a child may not use (earlier siblings' and its own), as a mask over local columns.
        const banned = new Uint32Array(t.cw);
        for (const j of options) {
            const c = t.cols[j]!;
            const colRowsHere = t.colBits;
            const o = j * t.rw;
            banned[j >>> 5]! |= 1 << (j & 31);
            // Prune before building the child's table: a maximal independent set of the rows c
            // leaves, over the columns the child may use, bounds the child from below (the
            // reductions never lower a table's optimum), and a row with no usable column left
            // makes the child infeasible. Such children could not be accepted by the search
            // anyway, so the covers found are the same, only reached with less work.
            if (childBoundExceeded(t, rowOrder, colRowsHere, o, banned, acc.cost + p.cost[c]!)) {
                excluded[j] = 1;
                continue;
            }
            const childRows = t.rows.filter((_, i) => ((colRowsHere[o + (i >>> 5)]! >>> (i & 31)) & 1) === 0);
            const childCols = t.cols.filter((_, k) => k !== j && !excluded[k]);
            const base = chosen.length;
            chosen.push(c);
            search(childRows, childCols, chosen, acc.cost + p.cost[c]!, depth + 1, t);
            chosen.length = base;
            excluded[j] = 1;
        }
    };

    const chosenRoot: number[] = [];
    try {
        search(p.rows.map((_, i) => i), Array.from({ length: nCols }, (_, j) => j), chosenRoot, 0, 0, null);
        return { columns: best, cost: bestCost, complete: true, work };
    } catch (e) {
        if (e instanceof OutOfTime) return { columns: best, cost: bestCost, complete: false, work };
        throw e;
    }
}
