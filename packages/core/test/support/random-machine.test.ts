// Sanity of the shared generator: disjoint plain guards really are disjoint (brute force over all valuations).
import { describe, expect, it } from 'vitest';
import { allInputValuations, evalGuard, mulberry32, randomMachine } from './random-machine.js';

describe('random machine generator', () => {
    it('plain states have pairwise-disjoint guards', () => {
        const rng = mulberry32(1234);
        for (let k = 0; k < 200; k++) {
            const m = randomMachine(rng);
            for (const s of m.states) {
                if (s.priority) continue;
                for (const values of allInputValuations(m)) {
                    const hits = s.transitions.filter((t) => evalGuard(t.guard, values)).length;
                    expect(hits).toBeLessThanOrEqual(1);
                }
            }
        }
    });
});
