/**
 * The seeded suite of incompletely specified functions shared by the minimizer tests and
 * scripts/bench-minimize.ts, plus independent brute-force helpers (truth tables built from the
 * cube strings here, never from the code under test).
 */

import { mulberry32 } from '../support/random-machine.js';

/** The shared seeded PRNG (mulberry32), so the suite is the same on every run. */
export const rng = mulberry32;

export interface SuiteFunction {
    readonly name: string;
    readonly nvars: number;
    /** Cube strings, variable 0 first: '0', '1', '-'. ON and DC are disjoint. */
    readonly on: string[];
    readonly dc: string[];
}

function mintermString(m: number, n: number): string {
    let s = '';
    for (let v = 0; v < n; v++) s += (m >> v) & 1 ? '1' : '0';
    return s;
}

function randomCube(r: () => number, n: number, litProb: number): string {
    let s = '';
    for (let v = 0; v < n; v++) s += r() < litProb ? (r() < 0.5 ? '0' : '1') : '-';
    return s;
}

export function cubesMeet(a: string, b: string): boolean {
    for (let i = 0; i < a.length; i++) {
        const x = a[i], y = b[i];
        if (x !== '-' && y !== '-' && x !== y) return false;
    }
    return true;
}

/** Functions of 4–16 variables, given as minterm lists (≤ 10 variables) or as cube lists. */
export function buildSuite(count: number, seed: number): SuiteFunction[] {
    const r = rng(seed);
    const out: SuiteFunction[] = [];
    for (let k = 0; k < count; k++) {
        const n = 4 + Math.floor(r() * 13);
        const byMinterms = n <= 10 && r() < 0.5;
        if (byMinterms) {
            const pOn = [0.15, 0.3, 0.5][Math.floor(r() * 3)]!;
            const pDc = [0, 0.1, 0.25][Math.floor(r() * 3)]!;
            const on: string[] = [];
            const dc: string[] = [];
            for (let m = 0; m < 1 << n; m++) {
                const x = r();
                if (x < pOn) on.push(mintermString(m, n));
                else if (x < pOn + pDc) dc.push(mintermString(m, n));
            }
            out.push({ name: `m${k}-n${n}-on${pOn}-dc${pDc}`, nvars: n, on, dc });
        } else {
            const nOn = 2 + Math.floor(r() * (n + 6));
            const litProb = 0.35 + r() * 0.45;
            const on: string[] = [];
            for (let i = 0; i < nOn; i++) on.push(randomCube(r, n, litProb));
            const nDc = Math.floor(r() * (n / 2 + 3));
            const dc: string[] = [];
            // Don't-care cubes are drawn until they miss every ON cube, so ON and DC are disjoint.
            for (let i = 0, tries = 0; i < nDc && tries < 50 * nDc; tries++) {
                const c = randomCube(r, n, litProb);
                if (!on.some((o) => cubesMeet(o, c))) { dc.push(c); i++; }
            }
            out.push({ name: `c${k}-n${n}-on${nOn}-dc${dc.length}`, nvars: n, on, dc });
        }
    }
    return out;
}

/** Marks every minterm of a cube string in `table` with `value`. */
export function markCube(table: Uint8Array, s: string, value: number): void {
    const freeVars: number[] = [];
    let base = 0;
    for (let v = 0; v < s.length; v++) {
        if (s[v] === '1') base |= 1 << v;
        else if (s[v] === '-') freeVars.push(v);
        else if (s[v] !== '0') throw new Error(`bad cube ${s}`);
    }
    for (let k = 0; k < 1 << freeVars.length; k++) {
        let m = base;
        for (let i = 0; i < freeVars.length; i++) if ((k >> i) & 1) m |= 1 << freeVars[i]!;
        table[m] = value;
    }
}

/** Truth table: 1 = ON, 2 = DC, 0 = OFF. */
export function truthTable(f: SuiteFunction): Uint8Array {
    const t = new Uint8Array(1 << f.nvars);
    for (const c of f.dc) markCube(t, c, 2);
    for (const c of f.on) markCube(t, c, 1);
    return t;
}

/** Null when `cover` implements f (contains ON, inside ON ∪ DC), else a description of the fault. */
export function checkCover(f: SuiteFunction, table: Uint8Array, cover: readonly string[]): string | null {
    const hit = new Uint8Array(table.length);
    for (const c of cover) markCube(hit, c, 1);
    for (let m = 0; m < table.length; m++) {
        if (table[m] === 1 && !hit[m]) return `ON minterm ${m} not covered`;
        if (table[m] === 0 && hit[m]) return `OFF minterm ${m} covered`;
    }
    return null;
}

export function literalsOf(cover: readonly string[]): number {
    let n = 0;
    for (const c of cover) for (const ch of c) if (ch !== '-') n++;
    return n;
}

/** The PLA text the reference package reads (type fd: '1' = ON, '-' = don't-care). */
export function plaLines(f: SuiteFunction): string[] {
    return [`.i ${f.nvars}`, '.o 1', '.type fd', ...f.on.map((c) => `${c} 1`), ...f.dc.map((c) => `${c} -`), '.e'];
}

export interface Wide { n: number; on: string[]; dc: string[]; states: number }

/** `states` one-hot bits then `inputs` inputs; per state a few products hot bit · 1–3 input literals. */
export function oneHotFunction(seed: number, states: number, inputs: number, productsPerState: number): Wide {
    const r = rng(seed);
    const n = states + inputs;
    const on: string[] = [];
    for (let s = 0; s < states; s++) {
        const k = 1 + Math.floor(r() * productsPerState);
        for (let j = 0; j < k; j++) {
            const cube = new Array<string>(n).fill('-');
            cube[s] = '1';
            const lits = 1 + Math.floor(r() * 3);
            for (let l = 0; l < lits; l++) cube[states + Math.floor(r() * inputs)] = r() < 0.5 ? '0' : '1';
            on.push(cube.join(''));
        }
    }
    // Don't-cares: the all-zero state code, and a few "two hot bits" cubes.
    const dc = ['0'.repeat(states) + '-'.repeat(inputs)];
    for (let j = 0; j < 8; j++) {
        const cube = new Array<string>(n).fill('-');
        const a = Math.floor(r() * states);
        const b = (a + 1 + Math.floor(r() * (states - 1))) % states;
        cube[a] = '1';
        cube[b] = '1';
        dc.push(cube.join(''));
    }
    return { n, on, dc, states };
}

function allCubeStrings(n: number): string[] {
    let out = [''];
    for (let v = 0; v < n; v++) out = out.flatMap((s) => [s + '0', s + '1', s + '-']);
    return out;
}

export interface Optimum { readonly products: number; readonly literals: number }

/**
 * The minimum cover cost (fewest products, then fewest literals) by exhaustive search, written
 * independently of the minimizer: every implicant of ON ∪ DC from the truth table (all 3^n cube
 * strings), keep the primes (a minimum cover can always be made of primes: growing a cube to a
 * prime keeps the product count and never adds literals), then search all covers by branch and
 * bound — branch on the uncovered ON minterm with the fewest primes, prune with a lower bound
 * from minterms no prime covers two of (each needs its own product).
 */
export function bruteForceOptimum(f: SuiteFunction): Optimum {
    const n = f.nvars;
    const table = truthTable(f);
    const onList: number[] = [];
    table.forEach((x, m) => { if (x === 1) onList.push(m); });
    if (onList.length === 0) return { products: 0, literals: 0 };
    const primes = primeStrings(f);
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

/** The primes of ON ∪ DC that meet the ON-set, as cube strings, from the truth table (all 3^n cube strings). */
export function primeStrings(f: SuiteFunction): string[] {
    const n = f.nvars;
    const table = truthTable(f);
    const isImplicant = (s: string): boolean => {
        const hit = new Uint8Array(1 << n);
        markCube(hit, s, 1);
        for (let m = 0; m < hit.length; m++) if (hit[m] && table[m] === 0) return false;
        return true;
    };
    const implicants = new Set(allCubeStrings(n).filter(isImplicant));
    return [...implicants].filter((s) => {
        for (let v = 0; v < n; v++) if (s[v] !== '-' && implicants.has(s.slice(0, v) + '-' + s.slice(v + 1))) return false;
        const hit = new Uint8Array(1 << n);
        markCube(hit, s, 1);
        return hit.some((x, m) => x === 1 && table[m] === 1);
    });
}

export interface MipSolver {
    solve(lp: string, options: Record<string, unknown>): { Status: string; ObjectiveValue: number };
}

/**
 * The minimum cover cost by an outside solver: HiGHS (npm `highs`, the HiGHS mixed-integer
 * solver compiled to WebAssembly) on the covering problem over the primes above — first the
 * fewest products, then the fewest literals with at most that many products — with the gap
 * tolerances at zero, so that "Optimal" means proven optimal.
 */
export function mipOptimum(f: SuiteFunction, highs: MipSolver): Optimum {
    const primes = primeStrings(f);
    const table = truthTable(f);
    const hits = primes.map((p) => { const hit = new Uint8Array(table.length); markCube(hit, p, 1); return hit; });
    const rows: string[] = [];
    for (let m = 0; m < table.length; m++) {
        if (table[m] !== 1) continue;
        const terms = primes.flatMap((_, j) => (hits[j]![m] ? [`x${j}`] : []));
        rows.push(` r${m}: ${terms.join(' + ')} >= 1`);
    }
    if (rows.length === 0) return { products: 0, literals: 0 };
    const lits = primes.map((p) => [...p].filter((c) => c !== '-').length);
    const vars = primes.map((_, j) => `x${j}`);
    const model = (objective: string, extra: string[]): string =>
        ['Minimize', ` obj: ${objective}`, 'Subject To', ...rows, ...extra, 'Binaries', ` ${vars.join(' ')}`, 'End'].join('\n');
    const options = { output_flag: false, mip_rel_gap: 0, mip_abs_gap: 0 };
    const first = highs.solve(model(vars.join(' + '), []), options);
    if (first.Status !== 'Optimal') throw new Error(`HiGHS: ${first.Status} on ${f.name}`);
    const products = Math.round(first.ObjectiveValue);
    const second = highs.solve(model(vars.map((v, j) => `${lits[j]} ${v}`).join(' + '), [` count: ${vars.join(' + ')} <= ${products}`]), options);
    if (second.Status !== 'Optimal') throw new Error(`HiGHS: ${second.Status} on ${f.name}`);
    return { products, literals: Math.round(second.ObjectiveValue) };
}
