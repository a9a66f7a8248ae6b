/** Small hand-built machines for simulation tests (built as core models; no parser). */
import type { Emit, Guard, Machine, Output, Input, State, Scenario, ScenarioStep, Reset } from '../../src/model/machine.js';
import { NO_RANGE } from '../../src/model/machine.js';

let line = 1000;
const r = () => { const l = line++; return { start: { line: l, character: 2 }, end: { line: l, character: 20 } }; };

export const inp = (name: string, width = 1): Input => ({ name, width, isBus: width > 1, async: false, range: r(), nameRange: r() });
export const out = (name: string, width = 1, registered = false): Output => ({ name, width, isBus: width > 1, registered, range: r(), nameRange: r() });
export const g = {
    in: (input: number): Guard => ({ kind: 'input', input, range: r() }),
    not: (operand: Guard): Guard => ({ kind: 'not', operand, range: r() }),
    and: (...operands: Guard[]): Guard => ({ kind: 'and', operands, range: r() }),
    eq: (input: number, value: number): Guard => ({ kind: 'compare', input, op: '==', value, range: r() }),
};
export const emit = (output: number, value = 1): Emit => ({ output, value, range: r() });

export function state(name: string, index: number, parts: Partial<State> = {}): State {
    return { name, index, priority: false, emits: [], transitions: [], range: r(), nameRange: r(), ...parts };
}

export function machine(parts: Partial<Machine> & Pick<Machine, 'states'>): Machine {
    return {
        name: 'Fixture', clock: { name: 'clk', edge: 'rising', range: NO_RANGE }, inputs: [], outputs: [], encoding: 'binary', encodingRange: NO_RANGE,
        flipflop: 'D', flipflopRange: NO_RANGE, scenarios: [], range: NO_RANGE, nameRange: NO_RANGE, ...parts,
    };
}

export const reset = (target: number | 'clear', activeHigh = true, async = false): Reset => ({ name: 'rst', activeHigh, async, target, range: r(), nameRange: r() });

export const step = (assign: Record<number, number>, repeat = 1): ScenarioStep => ({
    kind: 'step', repeat, range: r(), assignments: Object.entries(assign).map(([k, v]) => ({ input: Number(k), value: v, range: r() })),
});
export const expectStep = (st: number | undefined, outputs: Record<number, number> = {}): ScenarioStep => ({
    kind: 'expect', state: st, range: r(), outputs: Object.entries(outputs).map(([k, v]) => ({ output: Number(k), value: v, range: r() })),
});
export const resetStep = (): ScenarioStep => ({ kind: 'reset', range: r() });
export const scenario = (name: string, steps: ScenarioStep[]): Scenario => ({ name, steps, range: r(), nameRange: r() });

/**
 * A two-button arming panel: Idle -(arm)-> Armed; in Armed, holding arm beeps (Mealy) and
 * code == 2 opens; Open has Moore `unlocked` and a registered lamp = 2; Idle's lamp = 1.
 * inputs: arm, [2] code; outputs: beep (Mealy), unlocked (Moore), registered [2] lamp.
 */
export function panel(extra: Partial<Machine> = {}): Machine {
    return machine({
        name: 'Panel',
        reset: reset(0),
        inputs: [inp('arm'), inp('code', 2)],
        outputs: [out('beep'), out('unlocked'), out('lamp', 2, true)],
        states: [
            state('Idle', 0, { emits: [emit(2, 1)], transitions: [{ guard: g.in(0), target: 1, emits: [], range: r(), targetRange: r() }] }),
            state('Armed', 1, {
                priority: true,
                transitions: [
                    { guard: g.eq(1, 2), target: 2, emits: [], range: r(), targetRange: r() },
                    { guard: g.in(0), target: 1, emits: [emit(0)], range: r(), targetRange: r() },
                ],
                otherwise: { kind: 'goto', target: 0, emits: [], range: r(), targetRange: r() },
            }),
            state('Open', 2, { emits: [emit(1), emit(2, 2)], transitions: [{ guard: g.not(g.in(0)), target: 0, emits: [], range: r(), targetRange: r() }] }),
        ],
        ...extra,
    });
}
