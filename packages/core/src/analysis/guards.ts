/**
 * Per-state guard analyses (LANGUAGE.md "States and transitions", "Diagnostics"):
 * `never`, `overlap` (plain states), `shadowed` (priority states), `incomplete`.
 */
import type { Machine, State } from '../model/machine.js';
import { type Finding, finding } from '../model/finding.js';
import { evaluate } from '../boolean/cover.js';
import { type MachineSpace, commonMinterm, firstMinterm, fixedInputs, mintermInputs, mintermOutside } from './space.js';
import { formatInputs, transitionLabel } from './format.js';

/** Target plus observable outputs: two transitions with equal effects may overlap harmlessly. */
function sameEffect(machine: Machine, state: State, i: number, j: number): boolean {
    const a = state.transitions[i]!;
    const b = state.transitions[j]!;
    return a.target === b.target && effectOutputs(machine, state, i) === effectOutputs(machine, state, j);
}

/** Observable outputs of transition i as text (Moore overlaid with its Mealy emits; unassigned 0). */
function effectOutputs(machine: Machine, state: State, i: number): string {
    const v = new Array<number>(machine.outputs.length).fill(0);
    for (const e of state.emits) v[e.output] = e.value;
    for (const e of state.transitions[i]!.emits) v[e.output] = e.value;
    return v.join(',');
}

export function guardFindings(machine: Machine, space: MachineSpace): Finding[] {
    const out: Finding[] = [];
    const { ctx } = space;
    const n = ctx.nvars;
    machine.states.forEach((state, s) => {
        const st = space.states[s]!;
        const ts = state.transitions;
        // never: any state, a guard no input makes true.
        st.guards.forEach((g, i) => {
            if (g.length > 0) return;
            out.push(finding('never', `the guard of ${transitionLabel(ts[i]!, machine)} in state '${state.name}' is never true; the transition can never be taken`, ts[i]!.guard.range, { state: state.name }));
        });
        if (!state.priority) {
            // overlap: every pair with different effects that can both be true.
            for (let j = 1; j < ts.length; j++) {
                for (let i = 0; i < j; i++) {
                    if (sameEffect(machine, state, i, j)) continue;
                    const bits = commonMinterm(st.guards[i]!, st.guards[j]!, n);
                    if (!bits) continue;
                    const inputs = mintermInputs(machine, ctx, bits);
                    const relevant = fixedInputs(machine, ctx, [...st.guards[i]!, ...st.guards[j]!]);
                    out.push(finding('overlap',
                        `the guards of ${transitionLabel(ts[i]!, machine)} and ${transitionLabel(ts[j]!, machine)} in state '${state.name}' are both true for ${formatInputs(inputs, relevant)}, and the transitions differ (the first one in source order is taken)`,
                        ts[j]!.guard.range,
                        { state: state.name, witness: { inputs }, related: [{ message: `overlapping guard ${transitionLabel(ts[i]!, machine)}`, range: ts[i]!.guard.range }] }));
                }
            }
        } else {
            // shadowed: satisfiable, but wherever it is true an earlier guard is true too.
            st.guards.forEach((g, i) => {
                if (g.length === 0 || st.fires[i]) return;
                const bits = firstMinterm(g, n)!;
                const winner = st.guards.findIndex((h, k) => k < i && evaluate(h, bits));
                const inputs = mintermInputs(machine, ctx, bits);
                const relevant = fixedInputs(machine, ctx, [...g, ...st.guards[winner]!]);
                out.push(finding('shadowed',
                    `the guard of ${transitionLabel(ts[i]!, machine)} in priority state '${state.name}' is never the first true one: earlier guards are true wherever it is (for ${formatInputs(inputs, relevant)}, ${transitionLabel(ts[winner]!, machine)} is taken)`,
                    ts[i]!.guard.range,
                    { state: state.name, witness: { inputs }, related: [{ message: `taken first: ${transitionLabel(ts[winner]!, machine)}`, range: ts[winner]!.guard.range }] }));
            });
        }
        // incomplete: no otherwise and some input combination no guard takes.
        if (!state.otherwise && st.hasRest) {
            const bits = mintermOutside(st.covered, n)!;
            const inputs = mintermInputs(machine, ctx, bits);
            const relevant = fixedInputs(machine, ctx, st.covered);
            out.push(finding('incomplete',
                `no transition of state '${state.name}' is taken for ${formatInputs(inputs, relevant)}; the state holds there (add 'otherwise' to say what happens)`,
                state.nameRange, { state: state.name, witness: { inputs } }));
        }
    });
    return out;
}
