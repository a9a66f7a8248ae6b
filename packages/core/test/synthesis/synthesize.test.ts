import { describe, expect, it } from 'vitest';
import type { EncodingKind, FlipFlopKind } from '../../src/model/machine.js';
import { synthesize } from '../../src/synthesis/run.js';
import { mulberry32, randomMachine } from '../support/random-machine.js';
import { verify } from './verify.js';

const FLIPFLOPS: readonly FlipFlopKind[] = ['D', 'T', 'JK', 'SR'];
const ENCODINGS: readonly EncodingKind[] = ['binary', 'gray', 'onehot', 'onecold', 'johnson', 'explicit', 'auto'];

describe('synthesis reproduces the model (exhaustive simulation)', () => {
    it('every encoding × flip-flop type on 300 random machines', () => {
        const rng = mulberry32(0x5eed_0003);
        let checked = 0;
        for (let m = 0; m < 300; m++) {
            const machine = randomMachine(rng, { maxStates: 6, maxBitInputs: 3, maxBuses: 1, maxBusWidth: 3 }, `M${m}`);
            for (const encoding of ENCODINGS) {
                if (encoding === 'explicit' && machine.encoding !== 'explicit') continue;
                for (const flipflop of FLIPFLOPS) {
                    const r = synthesize(machine, { encoding, flipflop, budgetMs: 2 });
                    verify(machine, r);
                    checked++;
                }
            }
        }
        expect(checked).toBeGreaterThan(300 * 6 * 4);
    });

    it('one-hot and one-cold with recover go to the recovery state from every unused code', () => {
        const rng = mulberry32(77);
        for (let m = 0; m < 40; m++) {
            const machine = randomMachine(rng, { minStates: 2, maxStates: 5, maxBitInputs: 2, maxBuses: 0, recoverRate: 1 }, `R${m}`);
            for (const encoding of ['onehot', 'onecold', 'binary'] as const) {
                for (const flipflop of FLIPFLOPS) verify(machine, synthesize(machine, { encoding, flipflop }));
            }
        }
    });
});
