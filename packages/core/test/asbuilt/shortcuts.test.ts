/**
 * The as-built fast paths give the findings the full analysis gives: no synthesis when nothing can
 * be found, only the equations the analyses read, and a self-holding unused code as the lock-up
 * witness. Oracle: the same findings computed the slow way — a full synthesis (every equation,
 * every minimization) and the fixpoint analysis — with the witness re-checked by evaluating the
 * equations' cube bits directly (test/synthesis/oracle.ts, independent of the code under test).
 */
import { describe, expect, it } from 'vitest';
import type { Machine } from '../../src/model/machine.js';
import { synthesize } from '../../src/synthesis/run.js';
import type { SynthesisOptions } from '../../src/synthesis/synthesize.js';
import { asBuiltFindings, asyncInputFindings, recoveryReport } from '../../src/asbuilt/report.js';
import { asBuiltNextCode } from '../synthesis/oracle.js';
import { mulberry32, randomMachine } from '../support/random-machine.js';

const SAME: SynthesisOptions = { quick: false, minimizeBudgetMs: 5000, deadline: undefined, budgetMs: 200 };

describe('as-built fast paths agree with the full analysis', () => {
    it('random machines: same codes of findings; async-input message identical; lockup witness a real cycle', () => {
        const rng = mulberry32(0xfa57);
        let lockups = 0, asyncs = 0, none = 0;
        for (let k = 0; k < 120; k++) {
            const base: Machine = randomMachine(rng, {
                minStates: 2, maxStates: 7, maxBitInputs: 3, maxBuses: 1, maxBusWidth: 2,
                encodings: ['binary', 'gray', 'onehot', 'onecold', 'johnson'], recoverRate: 0.2,
            }, `P${k}`);
            const machine: Machine = { ...base, inputs: base.inputs.map((i, n) => ({ ...i, async: n === 0 && k % 2 === 0 })) };
            // Slow way: everything synthesized and minimized, fixpoint analysis.
            const full = synthesize(machine, SAME);
            const report = recoveryReport(full, { recoverCost: false });
            const wantAsync = asyncInputFindings(full).map((f) => f.message);
            const clearStuck = machine.reset?.target === 'clear' && report.resetCode === 'stuck';
            const wantLockup = report.lockup && !(clearStuck && report.lockupBesidesResetCode === false);
            const got = asBuiltFindings(machine, { synthesis: SAME });
            expect(got.filter((f) => f.code === 'async-input').map((f) => f.message), machine.name).toEqual(wantAsync);
            expect(got.filter((f) => f.code === 'reset-code').length, machine.name).toBe(clearStuck ? 1 : 0);
            const lock = got.filter((f) => f.code === 'lockup');
            expect(lock.length, machine.name).toBe(wantLockup ? 1 : 0);
            if (lock.length) {
                const nextCode = asBuiltNextCode(full);
                const cycle = lock[0]!.witness!.cycle!;
                cycle.forEach((step, i) => {
                    expect(full.assignment.codes).not.toContain(step.code);
                    const code = parseInt(step.code, 2);
                    let x = 0, v = 0;
                    machine.inputs.forEach((inp) => { x += step.inputs[inp.name]! * 2 ** v; v += inp.width; });
                    const next = nextCode(code, x);
                    expect(next, `${machine.name} ${step.code}`).toBe(parseInt(cycle[(i + 1) % cycle.length]!.code, 2));
                });
                lockups++;
            }
            if (wantAsync.length) asyncs++;
            if (got.length === 0) none++;
        }
        expect(lockups).toBeGreaterThan(10);
        expect(asyncs).toBeGreaterThan(5);
        expect(none).toBeGreaterThan(10);
    });
});
