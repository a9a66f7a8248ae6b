/**
 * The simulator against an independent oracle written here from LANGUAGE.md "Semantics of one
 * clock cycle" and "States and transitions" (the oracle uses evalGuard from the shared test support,
 * never the simulator): first true guard in source order, otherwise → its target, no otherwise or
 * `stay`/`dontcare` → hold; Moore from the state, Mealy from the taken transition, registered outputs
 * equal the Moore value of the state just loaded; reset overrides the transition function.
 */
import { describe, expect, it } from 'vitest';
import { createSimulator } from '../../src/simulation/simulator.js';
import type { Machine } from '../../src/model/machine.js';
import { evalGuard, mulberry32, int, randomMachine } from '../support/random-machine.js';
import { fixedAssignment } from '../../src/synthesis/encoding.js';

interface OracleState { state: number | null; code: string; reg: number[] }

function oracle(machine: Machine) {
    const enc = machine.encoding === 'auto' ? 'binary' : machine.encoding;
    const codes = fixedAssignment(machine, enc)!.codes;
    const moore = (s: number, o: number) => {
        let v: number | undefined;
        for (const e of machine.states[s]!.emits) if (e.output === o) v = e.value;
        return v;
    };
    const take = (s: number, x: number[]) => {
        const st = machine.states[s]!;
        for (const t of st.transitions) if (evalGuard(t.guard, x)) return { target: t.target, emits: t.emits };
        if (st.otherwise && st.otherwise.kind === 'goto') return { target: st.otherwise.target, emits: st.otherwise.emits };
        return { target: s, emits: [] };
    };
    const enter = (s: number): OracleState => ({ state: s, code: codes[s]!, reg: machine.outputs.map((o, k) => (o.registered ? moore(s, k) ?? 0 : 0)) });
    const onReset = (): OracleState => {
        const r = machine.reset!;
        if (r.target !== 'clear') return enter(r.target);
        const zero = '0'.repeat(codes[0]!.length);
        const s = codes.indexOf(zero);
        return { state: s < 0 ? null : s, code: zero, reg: machine.outputs.map(() => 0) };
    };
    return {
        start: (): OracleState => (machine.reset ? onReset() : enter(0)),
        next(st: OracleState, x: number[], reset: boolean): OracleState {
            if (reset && machine.reset) return onReset();
            if (st.state === null) return machine.recover ? enter(machine.recover.target) : st;
            return enter(take(st.state, x).target);
        },
        outputs(st: OracleState, x: number[]): number[] {
            return machine.outputs.map((o, k) => {
                if (o.registered) return st.reg[k]!;
                if (st.state === null) return 0;
                const m = moore(st.state, k);
                if (m !== undefined) return m;
                const e = take(st.state, x).emits.find((em) => em.output === k);
                return e ? e.value : 0;
            });
        },
    };
}

describe('simulator vs independent oracle (LANGUAGE.md semantics)', () => {
    it('agrees on 300 random machines × 200 cycles with random resets', () => {
        const rng = mulberry32(20261202);
        let compared = 0;
        for (let m = 0; m < 300; m++) {
            const machine = randomMachine(rng, { disjointPlainGuards: m % 2 === 0 }, `M${m}`);
            const sim = createSimulator(machine);
            const ref = oracle(machine);
            let a = sim.initial();
            let b = ref.start();
            for (let c = 0; c < 200; c++) {
                const x = machine.inputs.map((i) => int(rng, 0, 2 ** i.width - 1));
                const reset = rng() < 0.05;
                const r = sim.cycle(a, x, reset);
                a = r.state;
                b = ref.next(b, x, reset);
                expect(a.code).toBe(b.code);
                expect(a.state).toBe(b.state);
                expect(r.outputs).toEqual(ref.outputs(b, x));
                compared++;
            }
        }
        expect(compared).toBe(60000);
    });
});
