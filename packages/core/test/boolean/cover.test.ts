// Oracle: brute-force enumeration of every minterm (written here, independent of cover.ts).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { cubeFromString, type Cube } from '../../src/boolean/cube.js';
import { complement, tautology, coverContainsCover, coverIntersect } from '../../src/boolean/cover.js';
import { compareCover } from '../../src/boolean/guard.js';

function inCube(s: string, m: number): boolean {
    for (let v = 0; v < s.length; v++) {
        const bit = (m >> v) & 1;
        if (s[v] === '0' && bit) return false;
        if (s[v] === '1' && !bit) return false;
    }
    return true;
}
function truth(cubes: string[], n: number): boolean[] {
    const t: boolean[] = [];
    for (let m = 0; m < 1 << n; m++) t.push(cubes.some((c) => inCube(c, m)));
    return t;
}
const str = (c: Cube, n: number) => {
    let s = '';
    for (let v = 0; v < n; v++) { const f = (c[v >> 4]! >>> ((v & 15) * 2)) & 3; s += f === 1 ? '0' : f === 2 ? '1' : '-'; }
    return s;
};
const arbCover = (n: number) => fc.array(fc.array(fc.constantFrom('0', '1', '-'), { minLength: n, maxLength: n }).map((a) => a.join('')), { maxLength: 8 });

describe('cover algebra against brute force (seeded)', () => {
    for (const n of [3, 7, 18]) {
        it(`complement over ${n} variables`, () => {
            fc.assert(fc.property(arbCover(n), (cubes) => {
                const f = cubes.map(cubeFromString);
                const c = complement(f, n).map((k) => str(k, n));
                const tf = truth(cubes, n), tc = truth(c, n);
                return tf.every((x, i) => x !== tc[i]);
            }), { seed: 42, numRuns: n > 12 ? 30 : 200 });
        });
    }
    it('tautology and containment', () => {
        fc.assert(fc.property(arbCover(6), arbCover(6), (a, b) => {
            const fa = a.map(cubeFromString), fb = b.map(cubeFromString);
            const ta = truth(a, 6), tb = truth(b, 6);
            const taut = ta.every(Boolean);
            const cont = tb.every((x, i) => !x || ta[i]);
            const inter = truth(coverIntersect(fa, fb, 6).map((k) => str(k, 6)), 6);
            return tautology(fa, 6) === taut && coverContainsCover(fa, fb, 6) === cont
                && inter.every((x, i) => x === (ta[i]! && tb[i]!));
        }), { seed: 7, numRuns: 300 });
    });
    it('bus comparisons match integer comparison', () => {
        const ops = ['==', '!=', '<', '<=', '>', '>='] as const;
        for (const op of ops) for (let v = 0; v <= 17; v++) {
            const cubes = compareCover(1, 4, op, v, 6).map((k) => str(k, 6));
            const t = truth(cubes, 6);
            for (let m = 0; m < 64; m++) {
                const bus = (m >> 1) & 15;
                const want = op === '==' ? bus === v : op === '!=' ? bus !== v : op === '<' ? bus < v : op === '<=' ? bus <= v : op === '>' ? bus > v : bus >= v;
                expect(t[m], `${op} ${v} at ${m}`).toBe(want);
            }
        }
    });
});
