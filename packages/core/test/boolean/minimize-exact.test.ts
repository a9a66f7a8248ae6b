// Oracle: an exhaustive search written here, independent of exact.ts / mincov.ts. It lists
// every implicant of ON ∪ DC from the truth table (all 3^n cube strings), keeps the primes
// (a minimum cover — fewest products, then fewest literals — can always be made of primes:
// growing a cube to a prime keeps the product count and never adds literals), and searches all
// covers by branch and bound: branch on the uncovered ON minterm with the fewest primes, prune
// with a lower bound from minterms no prime covers two of (each needs its own product).
import { describe, expect, it } from 'vitest';
import { cubeFromString, cubeToString } from '../../src/boolean/cube.js';
import { minimize } from '../../src/boolean/minimize.js';
import { type SuiteFunction, checkCover, markCube, rng, truthTable } from './minimize-suite.js';

interface Optimum { readonly products: number; readonly literals: number }

function allCubeStrings(n: number): string[] {
    let out = [''];
    for (let v = 0; v < n; v++) out = out.flatMap((s) => [s + '0', s + '1', s + '-']);
    return out;
}

function bruteForceOptimum(f: SuiteFunction): Optimum {
    const n = f.nvars;
    const table = truthTable(f);
    const onList: number[] = [];
    table.forEach((x, m) => { if (x === 1) onList.push(m); });
    if (onList.length === 0) return { products: 0, literals: 0 };
    const isImplicant = (s: string): boolean => {
        const hit = new Uint8Array(1 << n);
        markCube(hit, s, 1);
        for (let m = 0; m < hit.length; m++) if (hit[m] && table[m] === 0) return false;
        return true;
    };
    const implicants = new Set(allCubeStrings(n).filter(isImplicant));
    const primes = [...implicants].filter((s) => {
        for (let v = 0; v < n; v++) if (s[v] !== '-' && implicants.has(s.slice(0, v) + '-' + s.slice(v + 1))) return false;
        return true;
    });
    const onIndex = new Map(onList.map((m, i) => [m, i]));
    const primeRows: bigint[] = [];
    const primeLits: number[] = [];
    for (const s of primes) {
        const hit = new Uint8Array(1 << n);
        markCube(hit, s, 1);
        let mask = 0n;
        hit.forEach((x, m) => { if (x && onIndex.has(m)) mask |= 1n << BigInt(onIndex.get(m)!); });
        if (mask !== 0n) { primeRows.push(mask); primeLits.push([...s].filter((c) => c !== '-').length); }
    }
    const full = (1n << BigInt(onList.length)) - 1n;
    const coveredBy: number[][] = onList.map((_, i) => primeRows.flatMap((r, j) => ((r >> BigInt(i)) & 1n ? [j] : [])));
    const W = 1000; // one product outweighs any literal count here (n ≤ 8, < 125 products)
    let best = Infinity;
    const search = (covered: bigint, cost: number): void => {
        if (covered === full) { if (cost < best) best = cost; return; }
        // Lower bound: greedy set of uncovered minterms with pairwise disjoint prime sets.
        const uncovered: number[] = [];
        for (let i = 0; i < onList.length; i++) if (!((covered >> BigInt(i)) & 1n)) uncovered.push(i);
        uncovered.sort((a, b) => coveredBy[a]!.length - coveredBy[b]!.length);
        const used = new Set<number>();
        let bound = 0;
        for (const i of uncovered) {
            if (coveredBy[i]!.some((j) => used.has(j))) continue;
            let m = Infinity;
            for (const j of coveredBy[i]!) { used.add(j); m = Math.min(m, W + primeLits[j]!); }
            bound += m;
        }
        if (cost + bound >= best) return;
        const pick = uncovered[0]!;
        const options = [...coveredBy[pick]!].sort((a, b) => primeLits[a]! - primeLits[b]!);
        for (const j of options) search(covered | primeRows[j]!, cost + W + primeLits[j]!);
    };
    search(0n, 0);
    return { products: Math.floor(best / W), literals: best % W };
}

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
