import { describe, expect, it } from 'vitest';
import { analyzeAsBuilt } from '../../src/asbuilt/index.js';
import { mulberry32, randomMachine } from '../support/random-machine.js';

describe('analyzeAsBuilt on arbitrary machines', () => {
    it('never throws and stays within its keystroke budget (overlapping guards, every encoding, wide inputs)', () => {
        const rng = mulberry32(1);
        for (let m = 0; m < 120; m++) {
            const machine = randomMachine(rng, {
                maxStates: m % 10 === 0 ? 30 : 8, maxBitInputs: 5, maxBuses: 2, maxBusWidth: 4, disjointPlainGuards: m % 2 === 0,
                encodings: ['binary', 'gray', 'onehot', 'onecold', 'johnson', 'explicit', 'auto'],
            }, `F${m}`);
            const t = performance.now();
            const findings = analyzeAsBuilt(machine);
            // Budgets: auto 100 ms, synthesis 400 ms, lock-up 300 ms; one minimizer call may overrun them.
            expect(performance.now() - t, machine.name).toBeLessThan(3000);
            for (const f of findings) {
                expect(['lockup', 'reset-code', 'async-input', 'limit']).toContain(f.code);
                if (f.code === 'limit') expect(f.message).toMatch(/skipped/);
            }
        }
    });
});
