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

