// Wide one-hot style functions (what one-hot synthesis hands the minimizer): checked by an
// independent containment test written here (Shannon expansion with unate reduction on cube
// strings, common practice) and by evaluating ON, DC and the result on seeded random
// assignments, most of them one-hot codes.
import { describe, expect, it } from 'vitest';
import { cubeFromString, cubeToString } from '../../src/boolean/cube.js';
import { minimize } from '../../src/boolean/minimize.js';
import { oneHotFunction, rng } from './minimize-suite.js';

/** Cofactor of cube string c by cube string p, or null when they are disjoint. */
function cofactorStr(c: string, p: string): string | null {
    let out = '';
    for (let i = 0; i < c.length; i++) {
        if (p[i] === '-') out += c[i];
        else if (c[i] === '-' || c[i] === p[i]) out += '-';
        else return null;
    }
    return out;
}

/** Tautology of a cover of cube strings (independent of the code under test). */
function taut(f: string[], n: number): boolean {
    if (f.length === 0) return false;
    if (f.some((c) => !/[01]/.test(c))) return true;
    const zeros = new Array<number>(n).fill(0);
    const ones = new Array<number>(n).fill(0);
    for (const c of f) for (let i = 0; i < n; i++) { if (c[i] === '0') zeros[i]++; else if (c[i] === '1') ones[i]++; }
    // A variable seen in one phase only: F is a tautology iff the cubes without it are.
    const unate = new Set<number>();
    for (let i = 0; i < n; i++) if ((zeros[i]! > 0) !== (ones[i]! > 0)) unate.add(i);
    if (unate.size > 0) {
        const g = f.filter((c) => ![...unate].some((i) => c[i] !== '-'));
        if (g.length < f.length) return taut(g, n);
    }
    let v = -1;
    for (let i = 0; i < n; i++) if (zeros[i]! > 0 && ones[i]! > 0 && (v < 0 || zeros[i]! + ones[i]! > zeros[v]! + ones[v]!)) v = i;
    if (v < 0) return false;
    const half = (bit: string) => f.flatMap((c) => (c[v] === '-' ? [c] : c[v] === bit ? [c.slice(0, v) + '-' + c.slice(v + 1)] : []));
    return taut(half('0'), n) && taut(half('1'), n);
}

function coverHas(f: string[], c: string, n: number): boolean {
    return taut(f.flatMap((k) => { const x = cofactorStr(k, c); return x === null ? [] : [x]; }), n);
}

function evalCover(f: string[], bits: string): boolean {
    return f.some((c) => [...c].every((ch, i) => ch === '-' || ch === bits[i]));
}

describe('minimize on wide one-hot style functions', () => {
    for (const [seed, states, inputs, per] of [[11, 72, 28, 6], [12, 64, 36, 5], [13, 96, 8, 4]] as const) {
        it(`${states} hot bits + ${inputs} inputs: sound and fast`, () => {
            const f = oneHotFunction(seed, states, inputs, per);
            expect(f.n).toBeGreaterThanOrEqual(100);
            // CPU time of this process (a loaded CI machine does not inflate it).
            const t0 = process.cpuUsage();
            const res = minimize(f.on.map(cubeFromString), f.dc.map(cubeFromString), f.n);
            const used = process.cpuUsage(t0);
            const ms = (used.user + used.system) / 1000;
            const cover = res.cover.map((c) => cubeToString(c, f.n));
            console.log(`${f.on.length} ON cubes → ${cover.length} products in ${ms.toFixed(0)} ms CPU (exact: ${res.exact})`);
            // Contains ON; lies within ON ∪ DC.
            for (const c of f.on) expect(coverHas(cover, c, f.n), `ON cube ${c}`).toBe(true);
            const care = [...f.on, ...f.dc];
            for (const c of cover) expect(coverHas(care, c, f.n), `product ${c}`).toBe(true);
            // Sampled assignments: 3000 one-hot codes and 1000 arbitrary ones.
            const r = rng(seed + 1000);
            for (let k = 0; k < 4000; k++) {
                let bits = '';
                if (k < 3000) {
                    const hot = Math.floor(r() * f.states);
                    for (let i = 0; i < f.states; i++) bits += i === hot ? '1' : '0';
                } else for (let i = 0; i < f.states; i++) bits += r() < 0.5 ? '1' : '0';
                for (let i = f.states; i < f.n; i++) bits += r() < 0.5 ? '1' : '0';
                const on = evalCover(f.on, bits);
                const dc = evalCover(f.dc, bits);
                const got = evalCover(cover, bits);
                if (on) expect(got).toBe(true);
                else if (!dc) expect(got).toBe(false);
            }
            expect(cover.length).toBeLessThanOrEqual(f.on.length);
            // The default budget is 2 s of CPU; the figure is printed above (typically a few hundred ms).
            expect(ms).toBeLessThan(2500);
        });
    }
});
