import { describe, expect, it } from 'vitest';
import { analyzeAsBuilt } from '../../src/asbuilt/index.js';
import { explicitSafety, symbolicSafety } from '../../src/asbuilt/safety.js';
import { synthesize, synthesisBlocker } from '../../src/synthesis/run.js';
import { mulberry32, randomMachine } from '../support/random-machine.js';

describe('analyzeAsBuilt on arbitrary machines', () => {
    it('never throws and stays within its keystroke budget (overlapping guards, every encoding, wide inputs)', () => {
        const rng = mulberry32(1);
        let compared = 0;
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
            // Where both methods run, they agree on every code.
            if (synthesisBlocker(machine)) continue;
            const r = synthesize(machine, { budgetMs: 20, minimizeBudgetMs: 20 });
            if (r.assignment.width + r.inputCount > 14) continue;
            const e = explicitSafety(r), s = symbolicSafety(r);
            expect(s.lockup, machine.name).toBe(e.lockup);
            expect(s.worstLatency, machine.name).toBe(e.worstLatency);
            expect(s.zero).toEqual(e.zero);
            for (let u = 0; u < 2 ** r.assignment.width; u++) {
                const code = u.toString(2).padStart(r.assignment.width, '0');
                if (s.canStayUnused(code) !== e.canStayUnused(code) || s.latency(code) !== e.latency(code)) {
                    expect([s.canStayUnused(code), s.latency(code)], `${machine.name} ${code}`).toEqual([e.canStayUnused(code), e.latency(code)]);
                }
            }
            compared++;
        }
        expect(compared).toBeGreaterThan(50);
    });
});
