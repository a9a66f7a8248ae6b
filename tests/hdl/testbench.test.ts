/**
 * Generated scenario testbenches (`--testbench`) in the real simulators: every example's
 * scenarios pass in Icarus (Verilog-2005 and SystemVerilog designs) and GHDL (VHDL-2008), for the
 * behavioral and structural designs, and the run exits non-zero with a FAIL line when a scenario
 * is deliberately broken. For 30 random machines with random scenarios the per-scenario verdicts
 * of the testbench equal those of `detent test`'s core (runScenarios), whose own oracle is
 * packages/core/test/simulation.
 */
import { describe, expect, it, beforeAll } from 'vitest';
import {
    type ExportLanguage, type ExportStyle, type Machine, type Scenario, type ScenarioStep, NO_RANGE,
    createSimulator, exportMachine, runScenarios,
} from '@detent/core';
import { type ExampleMachine, exampleMachines, mulberry32, randomCorpus, run, scratchDir, toolsAvailable, writeAll, icarusMessages } from './support.js';
import { int } from '../../packages/core/test/support/random-machine.js';
import type { SynthesisResult } from '@detent/core';

interface BenchRun { code: number; verdicts: Map<string, boolean>; out: string }

async function runBench(machine: Machine, synth: SynthesisResult, lang: ExportLanguage, style: ExportStyle, label: string): Promise<BenchRun> {
    const dir = scratchDir(`tb-${label}`);
    const files = exportMachine(machine, lang, { style, testbench: true, sourceName: `${machine.name}.detent`, sourceText: '', assignment: synth.assignment, synthesis: synth });
    const names = writeAll(dir, files);
    let out: string;
    let code: number;
    if (lang === 'vhdl') {
        const a = await run('ghdl', ['-a', '--std=08', ...names], dir);
        expect(a.stdout + a.stderr).toBe('');
        const r = await run('ghdl', ['--elab-run', '--std=08', `${machine.name}_tb`], dir);
        out = r.stdout + r.stderr;
        code = r.code;
    } else {
        const c = await run('iverilog', [lang === 'verilog' ? '-g2005' : '-g2012', '-o', 'tb.vvp', ...names], dir);
        expect(icarusMessages(c.stdout + c.stderr)).toEqual([]);
        expect(c.code).toBe(0);
        const r = await run('vvp', ['-n', 'tb.vvp'], dir);
        out = r.stdout + r.stderr;
        code = r.code;
    }
    const verdicts = new Map<string, boolean>();
    for (const m of out.matchAll(/(PASS|FAIL) (\w+)/g)) verdicts.set(m[2]!, m[1] === 'PASS');
    return { code, verdicts, out };
}

const LANGS: readonly [ExportLanguage, ExportStyle][] = [
    ['verilog', 'behavioral'], ['verilog', 'structural'], ['systemverilog', 'behavioral'], ['systemverilog', 'structural'], ['vhdl', 'behavioral'], ['vhdl', 'structural'],
];

/** Breaks the first expect of the first scenario: another state, or a flipped 1-bit output. */
function breakScenario(machine: Machine): Machine {
    const sc = machine.scenarios[0]!;
    const k = sc.steps.findIndex((s) => s.kind === 'expect');
    const e = sc.steps[k] as Extract<ScenarioStep, { kind: 'expect' }>;
    const broken: ScenarioStep = e.state !== undefined
        ? { ...e, state: (e.state + 1) % machine.states.length }
        : { ...e, outputs: e.outputs.map((o, j) => (j === 0 ? { ...o, value: o.value === 0 ? 1 : 0 } : o)) };
    const steps = sc.steps.map((s, j) => (j === k ? broken : s));
    return { ...machine, scenarios: [{ ...sc, steps }, ...machine.scenarios.slice(1)] };
}

describe.runIf(toolsAvailable(['iverilog', 'vvp', 'ghdl']))('scenario testbenches in Icarus and GHDL', () => {
    let examples: ExampleMachine[] = [];
    beforeAll(() => { examples = exampleMachines(); }, 120_000);

    it.concurrent('every example: all scenarios pass in every language and style', async () => {
        expect(examples.length).toBeGreaterThan(0);
        let runs = 0;
        for (const ex of examples) {
            const core = runScenarios(ex.machine, { assignment: ex.synth.assignment });
            expect(core.every((r) => r.passed)).toBe(true);
            await Promise.all(LANGS.map(async ([lang, style]) => {
                const r = await runBench(ex.machine, ex.synth, lang, style, `${ex.machine.name}-${lang}-${style}`);
                expect(r.code, r.out).toBe(0);
                expect([...r.verdicts.entries()]).toEqual(ex.machine.scenarios.map((s) => [s.name, true]));
                runs++;
            }));
        }
        process.stdout.write(`testbench: ${examples.length} examples × ${LANGS.length} language/style runs = ${runs} passing runs\n`);
    }, 600_000);

    it.concurrent('a deliberately broken scenario fails (non-zero exit, FAIL line)', async () => {
        for (const ex of examples) {
            const broken = breakScenario(ex.machine);
            const core = runScenarios(broken, { assignment: ex.synth.assignment });
            expect(core[0]!.passed).toBe(false);
            await Promise.all(LANGS.filter(([, s]) => s === 'behavioral').map(async ([lang, style]) => {
                const r = await runBench(broken, ex.synth, lang, style, `broken-${ex.machine.name}-${lang}`);
                expect(r.code).not.toBe(0);
                expect(r.verdicts.get(broken.scenarios[0]!.name)).toBe(false);
                expect(r.out).toMatch(/expect: .* expected .*, got /);
            }));
        }
    }, 600_000);

    it.concurrent('30 random machines with random scenarios: testbench verdicts equal the core verdicts', async () => {
        const rng = mulberry32(5150);
        const corpus = randomCorpus(30, 8080, 'T');
        let agreeing = 0;
        let failing = 0;
        await Promise.all(corpus.map(async (c, n) => {
            const m = c.machine;
            const sim = createSimulator(m, { assignment: c.synth.assignment });
            const scenarios: Scenario[] = [];
            for (let s = 0; s < 3; s++) {
                const steps: ScenarioStep[] = [];
                let st = sim.initial();
                for (let k = 0; k < 6; k++) {
                    if (m.reset && rng() < 0.15) { steps.push({ kind: 'reset', range: NO_RANGE }); st = sim.cycle(st, m.inputs.map(() => 0), true).state; continue; }
                    const inputs = m.inputs.map((i) => int(rng, 0, 2 ** i.width - 1));
                    const repeat = int(rng, 1, 3);
                    steps.push({ kind: 'step', repeat, range: NO_RANGE, assignments: inputs.map((value, input) => ({ input, value, range: NO_RANGE })) });
                    for (let r = 0; r < repeat; r++) st = sim.cycle(st, inputs, false).state;
                    // Most expects are what the simulator computes, one in ten is a random guess.
                    const outs = sim.outputs(st, inputs);
                    const truthful = rng() < 0.9;
                    steps.push({
                        kind: 'expect', range: { start: { line: 100 * s + k, character: 0 }, end: { line: 100 * s + k, character: 1 } },
                        state: truthful ? st.state ?? undefined : int(rng, 0, m.states.length - 1),
                        outputs: m.outputs.map((o, j) => ({ output: j, value: truthful ? outs[j]! : int(rng, 0, 2 ** o.width - 1), range: NO_RANGE })),
                    });
                }
                scenarios.push({ name: `sc${s}`, steps, range: NO_RANGE, nameRange: NO_RANGE });
            }
            const machine: Machine = { ...m, scenarios };
            const core = runScenarios(machine, { assignment: c.synth.assignment });
            const lang: ExportLanguage = n % 2 === 0 ? 'verilog' : 'vhdl';
            const r = await runBench(machine, c.synth, lang, 'behavioral', `rand-${m.name}`);
            expect([...r.verdicts.entries()]).toEqual(core.map((x) => [x.scenario, x.passed]));
            expect(r.code === 0).toBe(core.every((x) => x.passed));
            agreeing += core.length;
            failing += core.filter((x) => !x.passed).length;
        }));
        process.stdout.write(`testbench verdicts: ${agreeing} random scenarios agree with the core (${failing} failing ones)\n`);
    }, 600_000);
});
