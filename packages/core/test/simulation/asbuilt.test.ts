/**
 * asBuilt(synthesis) — the flip-flop characteristic equations applied to the synthesized
 * excitation (D: q+ = d; T: q+ = q xor t; JK: q+ = j·q' + k'·q; SR: q+ = s + r'·q; from memory,
 * common practice) — agrees with the model semantics on every used code and every input valuation
 * of 150 random machines without don't-cares. The model side is the simulator, itself checked
 * against an independent oracle in simulator.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { asBuilt } from '../../src/simulation/asbuilt.js';
import { createSimulator } from '../../src/simulation/simulator.js';
import { synthesize } from '../../src/synthesis/run.js';
import { allInputValuations, mulberry32, randomMachine } from '../support/random-machine.js';

describe('as-built machine', () => {
    it('matches the model on the used codes (all encodings × flip-flops)', () => {
        const rng = mulberry32(1234);
        let checked = 0;
        for (let n = 0; n < 150; n++) {
            const m = randomMachine(rng, { dontcare: false, maxBitInputs: 2, maxBusWidth: 2 }, `A${n}`);
            const synth = synthesize(m, { budgetMs: 20 });
            const ab = asBuilt(synth);
            const sim = createSimulator(m, { assignment: synth.assignment });
            m.states.forEach((_, s) => {
                const code = synth.assignment.codes[s]!;
                const st = { state: s, code, registered: m.outputs.map(() => 0) };
                for (const x of allInputValuations(m)) {
                    const next = sim.cycle(st, x, false).state;
                    expect(ab.next(code, x)).toBe(next.code);
                    const outs = ab.outputs(code, x);
                    const model = sim.outputs(st, x);
                    m.outputs.forEach((o, k) => expect(outs[k]).toBe(o.registered ? next.registered[k] : model[k]));
                    checked++;
                }
            });
        }
        expect(checked).toBeGreaterThan(1000);
    });
});
