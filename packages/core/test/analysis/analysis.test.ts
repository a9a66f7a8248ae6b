/**
 * Hand-written machines, one concern each. Expected findings, ranges, witnesses and messages are
 * worked out by hand from LANGUAGE.md ("States and transitions", "Diagnostics") and the
 * Analysis section of docs/decisions.md; every witness is also re-evaluated with the test's
 * own guard evaluator (evalGuard), independent of the cover code.
 */
import { describe, expect, it } from 'vitest';
import type { Machine } from '../../src/model/machine.js';
import type { Finding } from '../../src/model/finding.js';
import { analyzeMachine } from '../../src/analysis/index.js';
import { evalGuard } from '../support/random-machine.js';
import { build } from './build.js';

const codes = (fs: readonly Finding[]) => fs.map((f) => `${f.code}:${f.state ?? f.signal ?? ''}`).sort();
const only = (fs: readonly Finding[], code: string) => fs.filter((f) => f.code === code);
const values = (m: Machine, f: Finding) => m.inputs.map((i) => f.witness!.inputs![i.name]!);
const state = (m: Machine, name: string) => m.states.find((s) => s.name === name)!;

describe('guard analyses on a press guard controller', () => {
    const m = build({
        name: 'PressGuard',
        inputs: ['two_hand', 'guard_closed', 'overload', 'pressure:4'],
        outputs: ['ram_down', 'alarm', 'spare'],
        reset: 'Idle',
        states: [
            { name: 'Idle', when: [{ when: 'two_hand & guard_closed', to: 'Pressing' }, { when: 'overload', to: 'Fault', emit: ['alarm'] }], otherwise: 'stay' },
            {
                name: 'Pressing', priority: true, emit: ['ram_down'],
                when: [
                    { when: 'overload', to: 'Fault' },
                    { when: '!two_hand', to: 'Idle' },
                    { when: 'overload & pressure >= 12', to: 'Fault', emit: ['alarm'] },
                    { when: 'pressure > 15', to: 'Fault' },
                ],
                otherwise: 'stay',
            },
            { name: 'Fault', emit: ['alarm'], when: [{ when: '!overload & pressure < 4', to: 'Idle' }] },
            { name: 'Service', when: [{ when: '1', to: 'Idle' }] },
        ],
    });
    const fs = analyzeMachine(m);

    it('reports exactly the expected findings', () => {
        expect(codes(fs)).toEqual(['incomplete:Fault', 'never:Pressing', 'overlap:Idle', 'shadowed:Pressing', 'unreachable:Service', 'unused-output:spare']);
    });

    it('overlap: on the later guard, related to the earlier one, witness both true', () => {
        const [f] = only(fs, 'overlap');
        const idle = state(m, 'Idle');
        expect(f!.severity).toBe('error');
        expect(f!.range).toEqual(idle.transitions[1]!.guard.range);
        expect(f!.related).toEqual([{ message: "overlapping guard 'when two_hand & guard_closed'", range: idle.transitions[0]!.guard.range }]);
        // Smallest witness: the three inputs both guards need set, the bus at 0.
        expect(f!.witness).toEqual({ inputs: { two_hand: 1, guard_closed: 1, overload: 1, pressure: 0 } });
        expect(f!.message).toBe("the guards of 'when two_hand & guard_closed' and 'when overload' in state 'Idle' are both true for two_hand=1, guard_closed=1, overload=1 (other inputs 0), and the transitions differ (the first one in source order is taken)");
        expect(idle.transitions.every((t) => evalGuard(t.guard, values(m, f!)))).toBe(true);
    });

    it('shadowed: covered by an earlier guard of a priority state', () => {
        const [f] = only(fs, 'shadowed');
        const p = state(m, 'Pressing');
        expect(f!.range).toEqual(p.transitions[2]!.guard.range);
        expect(f!.state).toBe('Pressing');
        expect(f!.witness).toEqual({ inputs: { two_hand: 0, guard_closed: 0, overload: 1, pressure: 12 } });
        expect(f!.related?.[0]?.range).toEqual(p.transitions[0]!.guard.range);
        expect(f!.message).toBe("the guard of 'when overload & pressure >= 12' in priority state 'Pressing' is never the first true one: earlier guards are true wherever it is (for overload=1, pressure=12 (other inputs 0), 'when overload' is taken)");
    });

    it('never: a 4-bit bus is never above 15; never is not also shadowed', () => {
        const [f] = only(fs, 'never');
        expect(f!.range).toEqual(state(m, 'Pressing').transitions[3]!.guard.range);
        expect(f!.severity).toBe('warning');
        expect(f!.message).toBe("the guard of 'when pressure > 15' in state 'Pressing' is never true; the transition can never be taken");
        expect(f!.witness).toBeUndefined();
    });

    it('incomplete: on the state name, witness takes no transition', () => {
        const [f] = only(fs, 'incomplete');
        const fault = state(m, 'Fault');
        expect(f!.range).toEqual(fault.nameRange);
        // Uncovered: overload=1 alone escapes `!overload & pressure < 4`.
        expect(f!.witness).toEqual({ inputs: { two_hand: 0, guard_closed: 0, overload: 1, pressure: 0 } });
        expect(fault.transitions.some((t) => evalGuard(t.guard, values(m, f!)))).toBe(false);
        expect(f!.message).toBe("no transition of state 'Fault' is taken for overload=1, pressure=0 (other inputs 0); the state holds there (add 'otherwise' to say what happens)");
    });

    it('unreachable: on the state name, names the reset state', () => {
        const [f] = only(fs, 'unreachable');
        expect(f!.range).toEqual(state(m, 'Service').nameRange);
        expect(f!.message).toBe("no sequence of inputs leads from the reset state 'Idle' to state 'Service'");
        expect(f!.related?.[0]?.range).toEqual(state(m, 'Idle').nameRange);
    });

    it('unused-output: on the output name, info severity', () => {
        const [f] = only(fs, 'unused-output');
        expect(f!.range).toEqual(m.outputs[2]!.nameRange);
        expect(f!.severity).toBe('info');
        expect(f!.signal).toBe('spare');
    });
});

describe('effects decide overlaps', () => {
    const m = build({
        inputs: ['a', 'b'], outputs: ['y'], reset: 'S',
        states: [
            // Same target and same emits: an overlap that does no harm.
            { name: 'S', when: [{ when: 'a', to: 'T', emit: ['y'] }, { when: 'a | b', to: 'T', emit: ['y'] }], otherwise: 'stay' },
            // `emit y` against no emit: different effects.
            { name: 'T', when: [{ when: 'a', to: 'S', emit: ['y'] }, { when: 'b', to: 'S' }], otherwise: 'stay' },
            // Moore y makes both transitions put y = 1: same effect.
            { name: 'U', emit: ['y'], when: [{ when: 'a', to: 'S', emit: ['y'] }, { when: 'b', to: 'S' }], otherwise: 'stay' },
        ],
    });
    const fs = analyzeMachine(m);
    it('finds the overlap in T only; S and T differ for b alone (y = 1 against y = 0)', () => {
        expect(codes(fs)).toEqual(['overlap:T', 'unreachable:U']);
        const [o] = only(fs, 'overlap');
        expect(o!.witness).toEqual({ inputs: { a: 1, b: 1 } });
        expect(o!.message).toBe("the guards of 'when a' and 'when b' in state 'T' are both true for a=1, b=1, and the transitions differ (the first one in source order is taken)");
    });
});

describe('equivalent', () => {
    it('observable outputs decide: a Moore output equals the same Mealy output on every transition', () => {
        const m = build({
            inputs: ['a'], outputs: ['y'], reset: 'S',
            states: [
                { name: 'S', when: [{ when: 'a', to: 'T' }], otherwise: 'stay' },
                { name: 'T', emit: ['y'], when: [{ when: 'a', to: 'S' }], otherwise: { to: 'T' } },
                { name: 'V', when: [{ when: 'a', to: 'S', emit: ['y'] }], otherwise: { to: 'V', emit: ['y'] } },
            ],
        });
        const fs = analyzeMachine(m);
        expect(codes(fs)).toEqual(['equivalent:V', 'unreachable:V']);
        const [f] = only(fs, 'equivalent');
        expect(f!.range).toEqual(state(m, 'V').nameRange);
        expect(f!.related).toEqual([{ message: "equivalent state 'T'", range: state(m, 'T').nameRange }]);
        expect(f!.message).toBe("state 'V' cannot be told apart from state 'T' by any input sequence (same outputs, equivalent next states); the two can be merged");
    });
});

describe('equivalence classes', () => {
    it('reports every member but the first, naming the first; keeps don\'t-care states apart', () => {
        const m = build({
            inputs: ['go', 'stop'], outputs: ['run'], reset: 'Home',
            states: [
                { name: 'Home', priority: true, when: [{ when: 'go', to: 'P1' }, { when: 'stop', to: 'Q1' }], otherwise: 'stay' },
                { name: 'P1', emit: ['run'], when: [{ when: 'stop', to: 'Home' }], otherwise: { to: 'P2' } },
                { name: 'P2', emit: ['run'], when: [{ when: 'stop', to: 'Home' }], otherwise: { to: 'P3' } },
                { name: 'P3', emit: ['run'], when: [{ when: 'stop', to: 'Home' }], otherwise: { to: 'P1' } },
                // Identical, but `otherwise dontcare` leaves !stop free: incompletely specified, not reported.
                { name: 'Q1', when: [{ when: 'stop', to: 'Home' }], otherwise: 'dontcare' },
                { name: 'Q2', when: [{ when: 'stop', to: 'Home' }], otherwise: 'dontcare' },
            ],
        });
        const fs = analyzeMachine(m);
        expect(only(fs, 'equivalent').map((f) => `${f.state}~${f.related?.[0]?.message}`)).toEqual(["P2~equivalent state 'P1'", "P3~equivalent state 'P1'"]);
        expect(codes(fs)).toEqual(['equivalent:P2', 'equivalent:P3', 'unreachable:Q2']);
    });
    it('distinguishes states that differ only after several steps', () => {
        // A chain: only E emits; D is one step from it, C two steps; all are distinct.
        const m = build({
            inputs: ['tick'], outputs: ['done'], reset: 'C',
            states: [
                { name: 'C', when: [{ when: 'tick', to: 'D' }], otherwise: 'stay' },
                { name: 'D', when: [{ when: 'tick', to: 'E' }], otherwise: 'stay' },
                { name: 'E', emit: ['done'], when: [{ when: 'tick', to: 'C' }], otherwise: 'stay' },
            ],
        });
        expect(codes(analyzeMachine(m))).toEqual([]);
    });
});

describe('priority states', () => {
    it('shadowed by the union of earlier guards, also after a shadowed one; an empty otherwise is fine', () => {
        const m = build({
            inputs: ['a', 'b'], outputs: ['o'], reset: 'P',
            states: [
                {
                    name: 'P', priority: true,
                    when: [{ when: 'a', to: 'X' }, { when: 'b', to: 'Y' }, { when: 'a | b', to: 'Y' }, { when: 'a & b', to: 'X' }, { when: '!a & !b', to: 'P' }],
                    otherwise: { to: 'X' },
                },
                { name: 'X', emit: ['o'], when: [{ when: '1', to: 'P' }] },
                // Y and P both output 0 at first; after `a` P is in X (o = 1) and Y in P (o = 0).
                { name: 'Y', when: [{ when: 'a ^ b', to: 'P' }, { when: '!(a ^ b)', to: 'X' }] },
            ],
        });
        const fs = analyzeMachine(m);
        const p = state(m, 'P');
        expect(codes(fs)).toEqual(['shadowed:P', 'shadowed:P']);
        expect(only(fs, 'shadowed').map((f) => f.range)).toEqual([p.transitions[2]!.guard.range, p.transitions[3]!.guard.range]);
        for (const f of only(fs, 'shadowed')) {
            const i = p.transitions.findIndex((t) => t.guard.range === f.range);
            expect(evalGuard(p.transitions[i]!.guard, values(m, f))).toBe(true);
        }
    });
});

describe('reset state and reachability', () => {
    const chain = (extra: Partial<Parameters<typeof build>[0]>) => build({
        inputs: ['go'], outputs: ['y:2'],
        states: [
            { name: 'A', emit: ['y = 1'], when: [{ when: 'go', to: 'B' }], otherwise: 'stay', code: '01' },
            { name: 'B', emit: ['y = 2'], otherwise: 'stay', code: '00' },
            { name: 'C', emit: ['y = 3'], when: [{ when: 'go', to: 'A' }], otherwise: 'stay', code: '10' },
        ],
        ...extra,
    });

    it('reset clear under explicit codes starts from the all-zeros state', () => {
        const fs = analyzeMachine(chain({ reset: 'clear', encoding: 'explicit' }));
        expect(codes(fs)).toEqual(['unreachable:A', 'unreachable:C']);
        expect(only(fs, 'unreachable')[0]!.message).toBe("no sequence of inputs leads from the reset state 'B' to state 'A'");
    });

    it('reset clear under one-hot (no zero code) with recover starts from the recovery state; no-return carries a path', () => {
        const m = chain({ reset: 'clear', encoding: 'onehot', recover: 'C' });
        const fs = analyzeMachine(m);
        expect(codes(fs)).toEqual(['no-return:A', 'no-return:B']);
        const b = only(fs, 'no-return').find((f) => f.state === 'B')!;
        expect(b.severity).toBe('info');
        expect(b.range).toEqual(state(m, 'B').nameRange);
        expect(b.witness).toEqual({ path: ['C', 'A', 'B'] });
        expect(b.message).toBe("once in state 'B' the machine can never get back to the reset state 'C' without a reset (reached by C → A → B)");
    });

    it('reset clear under one-hot without recover, and no reset at all, start from the first state', () => {
        expect(codes(analyzeMachine(chain({ reset: 'clear', encoding: 'onehot' })))).toEqual(['no-return:B', 'unreachable:C']);
        const m = chain({});
        const fs = analyzeMachine(m);
        expect(codes(fs)).toEqual(['no-reset:', 'no-return:B', 'unreachable:C']);
        const [nr] = only(fs, 'no-reset');
        expect(nr!.range).toEqual(m.nameRange);
        expect(nr!.severity).toBe('warning');
        expect(only(fs, 'unreachable')[0]!.message).toBe("no sequence of inputs leads from the initial state 'A' to state 'C'");
    });

    it('only transitions that can fire count: a shadowed or never-true one opens no path', () => {
        const m = build({
            inputs: ['a'], outputs: ['seen'], reset: 'R',
            states: [
                { name: 'R', priority: true, when: [{ when: 'a', to: 'R' }, { when: 'a', to: 'Hidden' }, { when: 'a & !a', to: 'Hidden' }], otherwise: 'stay' },
                { name: 'Hidden', emit: ['seen'], when: [{ when: '1', to: 'R' }] },
            ],
        });
        expect(codes(analyzeMachine(m))).toEqual(['never:R', 'shadowed:R', 'unreachable:Hidden']);
    });
});

describe('signals', () => {
    it('unused-input on the input name; a tautological guard still reads its input', () => {
        const m = build({
            inputs: ['a', 'spare_in', 'level:3'], outputs: ['y'], reset: 'S',
            states: [{ name: 'S', emit: ['y = 0'], when: [{ when: 'a | !a', to: 'S' }, { when: 'level[2]', to: 'S' }] }],
        });
        const fs = analyzeMachine(m);
        // `emit y = 0` assigns y (explicitly), so y is not unused.
        expect(codes(fs)).toEqual(['unused-input:spare_in']);
        expect(fs[0]!.range).toEqual(m.inputs[1]!.nameRange);
        expect(fs[0]!.message).toBe("input 'spare_in' is declared but no guard reads it");
    });
});

describe('16-bit buses', () => {
    it('overlap, never and completeness on a wide bus, with integer witnesses', () => {
        const m = build({
            inputs: ['level:16'], outputs: ['high'], reset: 'Low',
            states: [
                { name: 'Low', when: [{ when: 'level >= 40000', to: 'High' }, { when: 'level < 40000', to: 'Low' }] },
                { name: 'High', emit: ['high'], when: [{ when: 'level > 100', to: 'Low' }, { when: 'level < 200', to: 'High' }, { when: 'level == 65535 & level < 10', to: 'Low' }] },
            ],
        });
        const fs = analyzeMachine(m);
        expect(codes(fs)).toEqual(['never:High', 'overlap:High']);
        const [o] = only(fs, 'overlap');
        const level = o!.witness!.inputs!['level']!;
        expect(level > 100 && level < 200).toBe(true);
        expect(o!.message).toContain(`are both true for level=${level}, and`);
    });
});
