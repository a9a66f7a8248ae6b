/**
 * Guards printed back in Detent syntax must mean what the guard means: the printed text is read
 * back by the test's own guard reader (build.ts, written from LANGUAGE.md's precedence
 * `!` > `&` > `^` > `|`, comparisons as primaries) and both are compared on every input
 * valuation with the independent evaluator evalGuard.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { guardToDetentText } from '../../src/analysis/index.js';
import { allInputValuations, evalGuard, mulberry32, randomGuard, randomMachine } from '../support/random-machine.js';
import { build } from './build.js';

describe('guard text', () => {
    it('round-trips through a reader of Detent guard syntax with the same meaning (seeded)', () => {
        fc.assert(fc.property(fc.integer({ min: 0, max: 2 ** 31 - 1 }), (seed) => {
            const rng = mulberry32(seed);
            const m = randomMachine(rng, { minBitInputs: 1, maxBitInputs: 3, maxBuses: 1, maxBusWidth: 3, maxStates: 1 });
            const guard = randomGuard(rng, m.inputs, 4);
            const text = guardToDetentText(guard, m);
            const back = build({
                inputs: m.inputs.map((i) => (i.isBus ? `${i.name}:${i.width}` : i.name)),
                states: [{ name: 'S', when: [{ when: text, to: 'S' }] }],
            }).states[0]!.transitions[0]!.guard;
            for (const v of allInputValuations(m)) expect(evalGuard(back, v), text).toBe(evalGuard(guard, v));
        }), { seed: 99, numRuns: 300 });
    });

    it('keeps parentheses that precedence needs and drops the others', () => {
        const m = build({ inputs: ['a', 'b', 'c', 'level:4'], states: [{ name: 'S', when: [
            { when: '(a | b) & !(c ^ a)', to: 'S' },
            { when: 'a | b & c', to: 'S' },
            { when: '!level < 4 | level[3]', to: 'S' },
        ] }] });
        const texts = m.states[0]!.transitions.map((t) => guardToDetentText(t.guard, m));
        expect(texts).toEqual(['(a | b) & !(c ^ a)', 'a | b & c', '!level < 4 | level[3]']);
    });
});
