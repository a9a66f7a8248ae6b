// Oracle: primeStrings (minimize-suite.ts), which lists the primes from all 3^n cube strings
// with a brute-force truth table, independently of primes-table.ts and primes.ts.
import { describe, expect, it } from 'vitest';
import { cubeFromString, cubeToString } from '../../src/boolean/cube.js';
import { allPrimes } from '../../src/boolean/primes.js';
import { functionTables, primesFromTable } from '../../src/boolean/primes-table.js';
import { buildSuite, cubesMeet, primeStrings } from './minimize-suite.js';

describe('primes from the truth table', () => {
    const suite = buildSuite(120, 31_2026).filter((f) => f.nvars <= 9);
    it(`${suite.length} seeded functions of ≤ 9 variables: the same primes as the brute-force list and the recursive method`, () => {
        for (const f of suite) {
            const on = f.on.map(cubeFromString);
            const dc = f.dc.map(cubeFromString);
            const { on: onTable, care } = functionTables(on, dc, f.nvars);
            const mine = primesFromTable(onTable, care, f.nvars, 1e6)!.map((c) => cubeToString(c, f.nvars)).sort();
            expect(mine, f.name).toEqual(primeStrings(f).sort());
            const recursive = allPrimes([...on, ...dc], f.nvars, 1e6)!.map((c) => cubeToString(c, f.nvars))
                .filter((p) => f.on.some((o) => cubesMeet(o, p))).sort();
            expect(mine, f.name).toEqual(recursive);
        }
    });

    it('refuses more primes than the limit', () => {
        const f = suite.find((g) => primeStrings(g).length > 10)!;
        const { on, care } = functionTables(f.on.map(cubeFromString), f.dc.map(cubeFromString), f.nvars);
        expect(primesFromTable(on, care, f.nvars, 10)).toBeNull();
    });
});
