// Oracle: bruteForceOptimum (minimize-suite.ts), an exhaustive search independent of
// exact.ts / mincov.ts / primes-table.ts.
import { describe, expect, it } from 'vitest';
import { cubeFromString, cubeToString } from '../../src/boolean/cube.js';
import { minimize } from '../../src/boolean/minimize.js';
import { type SuiteFunction, bruteForceOptimum, checkCover, rng, truthTable } from './minimize-suite.js';

/** 120 seeded functions of 4–8 variables, mostly 5–7, minterm- and cube-given. */
function exactSuite(): SuiteFunction[] {
    const r = rng(7_2026);
    const out: SuiteFunction[] = [];
    const sizes = [4, 5, 5, 6, 6, 6, 7, 7, 8];
    for (let k = 0; k < 120; k++) {
        const n = sizes[Math.floor(r() * sizes.length)]!;
        const pOn = 0.1 + r() * (n === 8 ? 0.25 : 0.4);
        const pDc = r() * 0.3;
        const on: string[] = [];
        const dc: string[] = [];
        for (let m = 0; m < 1 << n; m++) {
            const x = r();
            let s = '';
            for (let v = 0; v < n; v++) s += (m >> v) & 1 ? '1' : '0';
            if (x < pOn) on.push(s);
            else if (x < pOn + pDc) dc.push(s);
        }
        out.push({ name: `x${k}-n${n}`, nvars: n, on, dc });
    }
    return out;
}

describe('minimize is exactly minimal on small functions (exhaustive oracle)', () => {
    const suite = exactSuite();
    it(`${suite.length} functions of ≤ 8 variables: proven, and as cheap as the exhaustive optimum`, () => {
        let proven = 0;
        for (const f of suite) {
            // 'auto' (the default method) with room for the proof: by default the exact step's
            // work is bounded (exactWork) to keep the heuristic-plus-exact time small.
            const r = minimize(f.on.map(cubeFromString), f.dc.map(cubeFromString), f.nvars, { budgetMs: 5000, exactWork: 2e9 });
            const mine = r.cover.map((c) => cubeToString(c, f.nvars));
            expect(checkCover(f, truthTable(f), mine), f.name).toBeNull();
            const opt = bruteForceOptimum(f);
            const lits = mine.reduce((s, c) => s + [...c].filter((x) => x !== '-').length, 0);
            expect({ name: f.name, products: mine.length, literals: lits }).toEqual({ name: f.name, ...opt });
            if (r.exact) proven++;
        }
        expect(proven).toBe(suite.length);
    });

    it('40 functions whose don\'t-care cubes overlap the ON-set (a minterm in both is ON): sound and minimal', () => {
        const r = rng(99_2026);
        for (let k = 0; k < 40; k++) {
            const n = 4 + Math.floor(r() * 4);
            const cube = (p: number) => { let s = ''; for (let v = 0; v < n; v++) s += r() < p ? (r() < 0.5 ? '0' : '1') : '-'; return s; };
            const on = Array.from({ length: 2 + Math.floor(r() * 8) }, () => cube(0.7));
            const dc = Array.from({ length: 1 + Math.floor(r() * 4) }, () => cube(0.5));
            const f: SuiteFunction = { name: `o${k}-n${n}`, nvars: n, on, dc };
            const res = minimize(on.map(cubeFromString), dc.map(cubeFromString), n, { exactWork: 2e9 });
            const mine = res.cover.map((c) => cubeToString(c, n));
            expect(checkCover(f, truthTable(f), mine), f.name).toBeNull();
            const opt = bruteForceOptimum(f);
            const lits = mine.reduce((s, c) => s + [...c].filter((x) => x !== '-').length, 0);
            expect({ name: f.name, products: mine.length, literals: lits }).toEqual({ name: f.name, ...opt });
            expect(res.exact).toBe(true);
        }
    });
});
