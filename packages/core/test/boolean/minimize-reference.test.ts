// Reference: the `espresso-logic-minimizer` npm package (a native binding of Berkeley's Espresso),
// fed PLA text of type fd ('1' ON, '-' don't-care). Every cover — ours and the reference's — is
// also checked against a brute-force truth table built in minimize-suite.ts from the cube strings.
// Minimality on every function of ≤ 8 variables: the HiGHS mixed-integer solver (npm `highs`)
// solves the covering problem over all primes (listed from the truth table) to proven optimality.
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { cubeFromString, cubeToString } from '../../src/boolean/cube.js';
import { minimize } from '../../src/boolean/minimize.js';
import { type MipSolver, buildSuite, checkCover, literalsOf, mipOptimum, plaLines, truthTable } from './minimize-suite.js';

const require = createRequire(import.meta.url);
const espresso = require('espresso-logic-minimizer') as { minimize(lines: string[]): string[] };

const SUITE_SEED = 20261202;

describe('minimize vs the reference Espresso on a seeded suite', () => {
    it('reads don\'t-cares the way we think (brute-force check of a tiny case)', () => {
        // ON = {001} ∪ 11-, DC = 0-0: the reference must cover ON and may use 000/010.
        const out = espresso.minimize(['.i 3', '.o 1', '.type fd', '001 1', '11- 1', '0-0 -', '.e']).map((l) => l.split(' ')[0]!);
        // Our strings are variable 0 first, as the PLA columns are.
        const g = { name: 't', nvars: 3, on: ['001', '11-'], dc: ['0-0'] };
        expect(checkCover(g, truthTable(g), out)).toBeNull();
        expect(literalsOf(out)).toBe(4); // 00- + 11-, worked by hand: the DC minterm 000 joins 001
    });

    const suite = buildSuite(320, SUITE_SEED);
    it(`${suite.length} functions of 4–16 variables: sound, and no more literals than the reference`, () => {
        let ours = 0;
        let ref = 0;
        let notWorse = 0;
        const worse: string[] = [];
        for (const f of suite) {
            const table = truthTable(f);
            const r = minimize(f.on.map(cubeFromString), f.dc.map(cubeFromString), f.nvars);
            const mine = r.cover.map((c) => cubeToString(c, f.nvars));
            const theirs = espresso.minimize(plaLines(f)).map((l) => l.split(' ')[0]!);
            expect(checkCover(f, table, mine), `ours on ${f.name}`).toBeNull();
            expect(checkCover(f, table, theirs), `reference on ${f.name}`).toBeNull();
            const lo = literalsOf(mine);
            const lr = literalsOf(theirs);
            ours += lo;
            ref += lr;
            if (lo <= lr) notWorse++;
            else worse.push(`${f.name}: ${mine.length}/${lo} vs ${theirs.length}/${lr}`);
        }
        console.log(`literals: ours ${ours}, reference ${ref}; not worse on ${notWorse}/${suite.length}`, worse);
        expect(ours).toBeLessThanOrEqual(ref);
        expect(notWorse / suite.length).toBeGreaterThanOrEqual(0.95);
    });

    const small = suite.filter((f) => f.nvars <= 8);
    it(`every one of its ${small.length} functions of ≤ 8 variables: proven minimal by default, and as cheap as HiGHS's optimum`, async () => {
        const highs = await (require('highs') as () => Promise<MipSolver>)();
        for (const f of small) {
            const r = minimize(f.on.map(cubeFromString), f.dc.map(cubeFromString), f.nvars);
            const mine = r.cover.map((c) => cubeToString(c, f.nvars));
            expect(checkCover(f, truthTable(f), mine), f.name).toBeNull();
            expect({ name: f.name, exact: r.exact }).toEqual({ name: f.name, exact: true });
            expect({ name: f.name, products: mine.length, literals: literalsOf(mine) }).toEqual({ name: f.name, ...mipOptimum(f, highs) });
        }
    }, 120_000);
});
