/**
 * Scenario runs (LANGUAGE.md "Semantics of one clock cycle"): `reset;` holds reset for one clock,
 * `step … * n` applies inputs (others 0) for n clocks, `expect` checks after the last edge with the
 * last step's inputs still applied. Every scenario starts from the power-up state (`Simulator.initial`).
 */
import type { Machine, Scenario, SourceRange } from '../model/machine.js';
import { type Finding, finding } from '../model/finding.js';
import { type SimState, type SimulatorOptions, createSimulator } from './simulator.js';

export interface ExpectFailure {
    readonly range: SourceRange;
    /** Step index of the failing expect inside the scenario. */
    readonly step: number;
    readonly expectedState?: string;
    readonly actualState: string;
    /** Only the outputs the expect lists, by name. */
    readonly expectedOutputs: Readonly<Record<string, number>>;
    readonly actualOutputs: Readonly<Record<string, number>>;
    /** The inputs applied when the expect was checked, by name. */
    readonly inputs: Readonly<Record<string, number>>;
    readonly cycle: number;
}

export interface ScenarioResult {
    readonly scenario: string;
    readonly range: SourceRange;
    readonly passed: boolean;
    readonly expects: number;
    readonly cycles: number;
    /** The first failing expect (the run stops there). */
    readonly failure?: ExpectFailure;
}

/** A state name, or the code in brackets for a code that is no state. */
export function stateLabel(machine: Machine, st: SimState): string {
    return st.state === null ? `<code ${st.code}>` : machine.states[st.state]!.name;
}

export function runScenario(machine: Machine, scenario: Scenario, options: SimulatorOptions = {}): ScenarioResult {
    const sim = createSimulator(machine, options);
    let st = sim.initial();
    let inputs: number[] = machine.inputs.map(() => 0);
    let cycles = 0;
    let expects = 0;
    for (let i = 0; i < scenario.steps.length; i++) {
        const step = scenario.steps[i]!;
        if (step.kind === 'reset') {
            inputs = machine.inputs.map(() => 0);
            st = sim.cycle(st, inputs, true).state;
            cycles++;
        } else if (step.kind === 'step') {
            inputs = machine.inputs.map(() => 0);
            for (const a of step.assignments) inputs[a.input] = a.value;
            for (let n = 0; n < step.repeat; n++) {
                st = sim.cycle(st, inputs, false).state;
                cycles++;
            }
        } else {
            expects++;
            const outs = sim.outputs(st, inputs);
            const stateOk = step.state === undefined || st.state === step.state;
            const outsOk = step.outputs.every((e) => outs[e.output] === e.value);
            if (!stateOk || !outsOk) {
                const expectedOutputs: Record<string, number> = {};
                const actualOutputs: Record<string, number> = {};
                for (const e of step.outputs) {
                    const name = machine.outputs[e.output]!.name;
                    expectedOutputs[name] = e.value;
                    actualOutputs[name] = outs[e.output]!;
                }
                const named: Record<string, number> = {};
                machine.inputs.forEach((inp, k) => { named[inp.name] = inputs[k]!; });
                return {
                    scenario: scenario.name, range: scenario.range, passed: false, expects, cycles,
                    failure: {
                        range: step.range, step: i,
                        expectedState: step.state === undefined ? undefined : machine.states[step.state]!.name,
                        actualState: stateLabel(machine, st), expectedOutputs, actualOutputs, inputs: named, cycle: cycles,
                    },
                };
            }
        }
    }
    return { scenario: scenario.name, range: scenario.range, passed: true, expects, cycles };
}

export function runScenarios(machine: Machine, options: SimulatorOptions = {}): ScenarioResult[] {
    return machine.scenarios.map((s) => runScenario(machine, s, options));
}

/** `expected S with y = 1, actual T with y = 0` — the text `detent test` and the `scenario` finding use. */
export function describeFailure(f: ExpectFailure): string {
    const side = (state: string | undefined, outs: Readonly<Record<string, number>>) => {
        const parts = Object.entries(outs).map(([k, v]) => `${k} = ${v}`);
        return [state, parts.length ? `with ${parts.join(', ')}` : undefined].filter(Boolean).join(' ');
    };
    const expected = side(f.expectedState, f.expectedOutputs) || '(nothing)';
    const actual = side(f.actualState, f.actualOutputs);
    return `expected ${expected}, actual ${actual} (after cycle ${f.cycle})`;
}

/** One `scenario` error per failing scenario, at the failing expect, naming actual state and outputs. */
export function scenarioFindingsOf(machine: Machine, options: SimulatorOptions = {}): Finding[] {
    const findings: Finding[] = [];
    for (const r of runScenarios(machine, options)) {
        if (r.passed || !r.failure) continue;
        const f = r.failure;
        const witness: Record<string, number> = { ...f.inputs };
        findings.push(finding('scenario', `scenario '${r.scenario}': ${describeFailure(f)}`, f.range, {
            state: f.actualState.startsWith('<') ? undefined : f.actualState,
            witness: { inputs: witness, ...(f.actualState.startsWith('<') ? {} : { state: f.actualState }) },
        }));
    }
    return findings;
}
