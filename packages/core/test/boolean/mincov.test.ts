// Oracle: exhaustive enumeration of every subset of columns (≤ 16 columns), written here,
// independent of mincov.ts; the cheapest subset that covers every row is the optimum.
import { describe, expect, it } from 'vitest';
import { solveCover } from '../../src/boolean/mincov.js';
import { rng } from './minimize-suite.js';

function bruteForce(rows: number[][], nCols: number, cost: number[], maxColumns = Infinity): number {
    let best = Infinity;
    for (let set = 0; set < 1 << nCols; set++) {
        let c = 0;
        let n = 0;
        for (let j = 0; j < nCols; j++) if ((set >> j) & 1) n++;
        if (n > maxColumns) continue;
        for (let j = 0; j < nCols; j++) if ((set >> j) & 1) c += cost[j]!;
        if (c >= best) continue;
        if (rows.every((r) => r.some((j) => (set >> j) & 1))) best = c;
    }
    return best;
}

describe('solveCover finds minimum-cost covers (exhaustive oracle)', () => {
    it('600 random tables of up to 16 columns, unit, integer and product-weighted costs', () => {
        const r = rng(5_2026);
        for (let t = 0; t < 600; t++) {
            const nCols = 2 + Math.floor(r() * 15);
            const nRows = 1 + Math.floor(r() * 30);
            const density = 0.1 + r() * 0.4;
            const rows: number[][] = [];
            for (let i = 0; i < nRows; i++) {
                const row: number[] = [];
                for (let j = 0; j < nCols; j++) if (r() < density) row.push(j);
                if (row.length === 0) row.push(Math.floor(r() * nCols));
                rows.push(row);
            }
            const kind = t % 3;
            const cost = Array.from({ length: nCols }, () => kind === 0 ? 1 : kind === 1 ? 1 + Math.floor(r() * 9) : 100 + Math.floor(r() * 8));
            const opt = bruteForce(rows, nCols, cost);
            // With the optimum as the upper bound nothing cheaper exists; with a looser one the
            // search must find a cover of the optimum's cost.
            const sol = solveCover({ rows, columns: nCols, cost }, Infinity, Infinity);
            expect(sol.complete).toBe(true);
            expect(sol.cost, `table ${t}`).toBe(opt);
            const chosen = new Set(sol.columns);
            expect(rows.every((row) => row.some((j) => chosen.has(j)))).toBe(true);
            expect(sol.columns!.reduce((s, j) => s + cost[j]!, 0)).toBe(opt);
            const tight = solveCover({ rows, columns: nCols, cost }, opt, Infinity);
            expect(tight.columns).toBeNull();
            expect(tight.complete).toBe(true);
            const loose = solveCover({ rows, columns: nCols, cost }, opt + 1, Infinity);
            expect(loose.cost).toBe(opt);
            // At most k columns: the cheapest cover of at most k columns, or none.
            const k = 1 + Math.floor(r() * Math.min(nCols, 8));
            const optK = bruteForce(rows, nCols, cost, k);
            const solK = solveCover({ rows, columns: nCols, cost, maxColumns: k }, Infinity, Infinity);
            expect(solK.complete).toBe(true);
            expect(solK.cost, `table ${t} with at most ${k} columns`).toBe(optK);
            if (optK < Infinity) expect(solK.columns!.length).toBeLessThanOrEqual(k);
            else expect(solK.columns).toBeNull();
        }
    });
});
