/**
 * Scenario semantics, checked against values worked out by hand from LANGUAGE.md "Semantics of
 * one clock cycle" for the hand-built Panel machine (fixtures.ts): `reset;` holds reset one clock,
 * `step … * n`, `expect` after the last edge with the last step's inputs still applied — so a
 * Mealy output of the new state is visible; a registered output equals the Moore value of the
 * state just entered; a failing expect becomes a `scenario` error at the expect's range.
 */
import { describe, expect, it } from 'vitest';
import { runScenarios, scenarioFindingsOf, describeFailure } from '../../src/simulation/scenario.js';
import { createSimulator } from '../../src/simulation/simulator.js';
import { scenarioFindings } from '../../src/simulation/index.js';
import { expectStep, panel, resetStep, scenario, step, machine, state, out, emit, reset } from './fixtures.js';

describe('scenarios', () => {
    it('pass when the expects hold (hand-computed from LANGUAGE.md)', () => {
        const m = panel({
            scenarios: [
                // after reset: Idle, lamp (registered) = Moore value of Idle = 1, beep 0
                scenario('arm_and_hold', [resetStep(), expectStep(0, { 0: 0, 2: 1 }),
                    // arm: Idle -> Armed; arm still applied, Armed's second guard (arm) is true: beep = 1 (Mealy)
                    step({ 0: 1 }), expectStep(1, { 0: 1, 1: 0, 2: 0 }),
                    // arm twice more: stays Armed (priority: code == 0 != 2, arm true)
                    step({ 0: 1 }, 2), expectStep(1, { 0: 1 }),
                    // code = 2 with arm: first guard wins -> Open; unlocked = 1, lamp = 2
                    step({ 0: 1, 1: 2 }), expectStep(2, { 1: 1, 2: 2, 0: 0 }),
                    // no inputs: !arm -> Idle; lamp back to 1
                    step({}), expectStep(0, { 1: 0, 2: 1 })]),
                // otherwise -> Idle when neither guard holds
                scenario('timeout', [resetStep(), step({ 0: 1 }), step({}), expectStep(0)]),
            ],
        });
        const results = runScenarios(m);
        expect(results.map((r) => [r.scenario, r.passed])).toEqual([['arm_and_hold', true], ['timeout', true]]);
        expect(results[0]!.cycles).toBe(6);
        expect(scenarioFindings(m)).toEqual([]);
    });

    it('a failing expect gives a scenario error at the expect, with actual values', () => {
        const bad = expectStep(2, { 0: 1 });
        const m = panel({ scenarios: [scenario('wrong', [resetStep(), step({ 0: 1 }), bad])] });
        const [r] = runScenarios(m);
        expect(r!.passed).toBe(false);
        expect(r!.failure!.actualState).toBe('Armed');
        expect(r!.failure!.expectedState).toBe('Open');
        expect(r!.failure!.actualOutputs).toEqual({ beep: 1 });
        const findings = scenarioFindingsOf(m);
        expect(findings).toHaveLength(1);
        expect(findings[0]!.code).toBe('scenario');
        expect(findings[0]!.severity).toBe('error');
        expect(findings[0]!.range).toEqual(bad.range);
        expect(findings[0]!.message).toContain("scenario 'wrong'");
        expect(describeFailure(r!.failure!)).toBe('expected Open with beep = 1, actual Armed with beep = 1 (after cycle 2)');
    });

    it('reset clear onto a code that is no state: outputs 0, then recover', () => {
        // onehot: codes 01, 10; clear loads 00, which is no state; recover -> B.
        const m = machine({
            encoding: 'onehot', reset: reset('clear'), outputs: [out('y')], recover: { target: 1, range: { start: { line: 1, character: 0 }, end: { line: 1, character: 1 } } },
            states: [state('A', 0, { emits: [emit(0)] }), state('B', 1, { emits: [emit(0)] })],
        });
        const sim = createSimulator(m);
        const afterReset = sim.cycle(sim.initial(), [], true);
        expect(afterReset.state).toMatchObject({ state: null, code: '00' });
        expect(afterReset.outputs).toEqual([0]);
        const next = sim.cycle(afterReset.state, [], false);
        expect(next.state).toMatchObject({ state: 1, code: '10' });
        expect(next.outputs).toEqual([1]);
    });

    it('otherwise dontcare holds the state and drives Moore outputs only; no otherwise holds', () => {
        const m = machine({
            inputs: [], outputs: [out('y'), out('z')],
            states: [state('A', 0, { emits: [emit(1)], otherwise: { kind: 'dontcare', range: { start: { line: 2, character: 0 }, end: { line: 2, character: 1 } } } }), state('B', 1)],
        });
        const sim = createSimulator(m);
        const r = sim.cycle(sim.initial(), [], false);
        expect(r.state.state).toBe(0);
        expect(r.outputs).toEqual([0, 1]);
    });
});
