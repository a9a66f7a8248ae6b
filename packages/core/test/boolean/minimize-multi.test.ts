// Multi-output minimization: every per-function cover is checked against a brute-force truth
// table (minimize-suite.ts); sharing must never need more distinct products than minimizing
// apart; and we compare with the reference Espresso (npm `espresso-logic-minimizer`) run on the
// multi-output PLA, whose product rows are shared the same way.
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { cubeFromString, cubeToString } from '../../src/boolean/cube.js';
import { minimizeMulti } from '../../src/boolean/minimize.js';
import { type SuiteFunction, checkCover, cubesMeet, rng, truthTable } from './minimize-suite.js';

const require = createRequire(import.meta.url);
const espresso = require('espresso-logic-minimizer') as { minimize(lines: string[]): string[] };

function randomCube(r: () => number, n: number, p: number): string {
    let s = '';
    for (let v = 0; v < n; v++) s += r() < p ? (r() < 0.5 ? '0' : '1') : '-';
    return s;
}

/** k functions over n variables sharing a pool of cubes, so that sharing can pay off. */
function multiFunction(r: () => number, n: number, k: number): SuiteFunction[] {
    const pool = Array.from({ length: 3 + Math.floor(r() * 6) }, () => randomCube(r, n, 0.6));
    return Array.from({ length: k }, (_, i) => {
        const on = pool.filter(() => r() < 0.5);
        for (let j = 0; j < 2; j++) on.push(randomCube(r, n, 0.6));
        const dc: string[] = [];
        for (let j = 0, tries = 0; j < 2 && tries < 40; tries++) {
            const c = randomCube(r, n, 0.7);
            if (!on.some((o) => cubesMeet(o, c))) { dc.push(c); j++; }
        }
        return { name: `f${i}`, nvars: n, on, dc };
    });
}

describe('minimizeMulti (product sharing)', () => {
    it('60 seeded multi-output functions: sound, sharing never worse than apart, compared with the reference', () => {
        const r = rng(4242);
        let ours = 0;
        let ref = 0;
        let apart = 0;
        for (let t = 0; t < 60; t++) {
            const n = 5 + Math.floor(r() * 6);
            const k = 2 + Math.floor(r() * 3);
            const fs = multiFunction(r, n, k);
            const res = minimizeMulti(fs.map((f) => ({ on: f.on.map(cubeFromString), dc: f.dc.map(cubeFromString) })), n);
            fs.forEach((f, i) => {
                expect(checkCover(f, truthTable(f), res.covers[i]!.map((c) => cubeToString(c, n))), `function ${i} of case ${t}`).toBeNull();
            });
            // Products used by the covers are exactly the shared list.
            const listed = new Set(res.products.map((c) => cubeToString(c, n)));
            for (const cv of res.covers) for (const c of cv) expect(listed.has(cubeToString(c, n))).toBe(true);
            expect(res.shared.products).toBeLessThanOrEqual(res.apart.products);
            // Reference: one PLA with k outputs (type fd: '1' ON, '-' don't-care, '0' neither).
            const lines = [`.i ${n}`, `.o ${k}`, '.type fd'];
            fs.forEach((f, i) => {
                for (const c of f.on) lines.push(`${c} ${'0'.repeat(i)}1${'0'.repeat(k - i - 1)}`);
                for (const c of f.dc) lines.push(`${c} ${'0'.repeat(i)}-${'0'.repeat(k - i - 1)}`);
            });
            lines.push('.e');
            const out = espresso.minimize(lines);
            // The reference's answer must implement every output too (brute force).
            fs.forEach((f, i) => {
                const cover = out.filter((l) => l.split(' ')[1]![i] === '1').map((l) => l.split(' ')[0]!);
                expect(checkCover(f, truthTable(f), cover), `reference output ${i} of case ${t}`).toBeNull();
            });
            ours += res.shared.products;
            ref += out.length;
            apart += res.apart.products;
        }
        console.log(`distinct products: ours shared ${ours}, apart ${apart}, reference ${ref}`);
        expect(ours).toBeLessThanOrEqual(apart);
        // No more distinct products in total than the reference's multi-output run.
        expect(ours).toBeLessThanOrEqual(ref);
    });
});
