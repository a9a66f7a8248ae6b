/**
 * Differential test: every export (Verilog-2005, SystemVerilog-2017, VHDL-2008, each behavioral
 * and structural; C99) of every example and 200 seeded random machines is driven with the same random stimulus as
 * the core simulator (240 cycles from a reset, reset also asserted mid-run) in the real tools —
 * Icarus Verilog, GHDL, gcc — and state (through the `state` port / the C state) and every output
 * are compared after every clock edge. Oracle for the simulator itself: the independent
 * evaluator in packages/core/test/simulation/simulator.test.ts.
 */
import { describe, expect, it, beforeAll } from 'vitest';
import { join } from 'node:path';
import { exportMachine, type ExportLanguage, type ExportStyle } from '@detent/core';
import {
    type CorpusMachine, type StimulusCycle, cHarness, exampleMachines, awkwardMachines, narrowBusMachines, cMain, compareDumps, expectedDump, mulberry32, parseDump, randomCorpus,
    icarusMessages, randomStimulus, run, scratchDir, toolsAvailable, verilogDumpBench, vhdlDumpBench, vhdlTop, writeAll,
} from './support.js';

const COUNT = 200;
const CYCLES = 240;
const TOOLS = ['iverilog', 'vvp', 'ghdl', 'gcc'];

describe.runIf(toolsAvailable(TOOLS))('exports behave like the core simulator, cycle by cycle (real tools)', () => {
    let corpus: CorpusMachine[] = [];
    const stimuli = new Map<string, StimulusCycle[]>();
    const expected = new Map<string, string[]>();
    let totalCycles = 0;

    beforeAll(() => {
        corpus = [...exampleMachines().map((e) => ({ machine: e.machine, synth: e.synth })), ...randomCorpus(COUNT, 424242), ...awkwardMachines(8, 606), ...narrowBusMachines(6, 616)];
        const rng = mulberry32(99);
        for (const c of corpus) {
            const s = randomStimulus(c.machine, rng, CYCLES);
            stimuli.set(c.machine.name, s);
            expected.set(c.machine.name, expectedDump(c, s));
            totalCycles += s.length;
        }
    }, 120_000);

    const files = (lang: ExportLanguage, style: ExportStyle) => corpus.flatMap((c) => exportMachine(c.machine, lang, {
        style, statePort: true, sourceName: `${c.machine.name}.detent`, sourceText: c.machine.name, assignment: c.synth.assignment, synthesis: c.synth,
    }));

    function check(label: string, stdout: string): void {
        const problems = compareDumps(expected, parseDump(stdout));
        // Measured figure for the report.
        process.stdout.write(`differential ${label}: ${corpus.length} machines, ${totalCycles} cycles, ${problems.length} mismatches\n`);
        expect(problems.slice(0, 10)).toEqual([]);
    }

    for (const [lang, gen] of [['verilog', '-g2005'], ['systemverilog', '-g2012']] as const) {
        for (const style of ['behavioral', 'structural'] as const) {
            it.concurrent(`${lang} ${style} in Icarus Verilog (${gen})`, async () => {
                const dir = scratchDir(`diff-${lang}-${style}`);
                const names = writeAll(dir, files(lang, style));
                const benches = writeAll(dir, corpus.map((c) => verilogDumpBench(c.machine, c.synth.assignment.width, stimuli.get(c.machine.name)!)));
                const compile = await run('iverilog', [gen, '-o', 'sim.vvp', ...names, ...benches], dir);
                expect(icarusMessages(compile.stderr + compile.stdout)).toEqual([]);
                expect(compile.code).toBe(0);
                const sim = await run('vvp', ['-n', 'sim.vvp'], dir);
                expect(sim.code).toBe(0);
                check(`${lang} ${style}`, sim.stdout);
            }, 600_000);
        }
    }

    for (const style of ['behavioral', 'structural'] as const) {
        it.concurrent(`vhdl ${style} in GHDL (--std=08)`, async () => {
            const dir = scratchDir(`diff-vhdl-${style}`);
            const names = writeAll(dir, files('vhdl', style));
            const benches = writeAll(dir, [...corpus.map((c) => vhdlDumpBench(c.machine, c.synth.assignment.width, stimuli.get(c.machine.name)!)), vhdlTop(corpus.map((c) => c.machine.name))]);
            const analyze = await run('ghdl', ['-a', '--std=08', ...names, ...benches], dir);
            expect(analyze.stderr + analyze.stdout).toBe('');
            expect(analyze.code).toBe(0);
            const sim = await run('ghdl', ['--elab-run', '--std=08', 'tb_all'], dir);
            expect(sim.stderr).toBe('');
            expect(sim.code).toBe(0);
            check(`vhdl ${style}`, sim.stdout);
        }, 600_000);
    }

    it.concurrent('c99 with gcc -std=c99 -Wall -Wextra -Werror -pedantic', async () => {
        const dir = scratchDir('diff-c');
        const names = writeAll(dir, files('c', 'behavioral')).filter((n) => n.endsWith('.c'));
        const harness = writeAll(dir, [...corpus.map((c) => cHarness(c.machine, c.synth.assignment.width, stimuli.get(c.machine.name)!)), cMain(corpus.map((c) => c.machine.name))]);
        const compile = await run('gcc', ['-std=c99', '-Wall', '-Wextra', '-Werror', '-pedantic', '-O0', '-o', 'model', ...names, ...harness], dir);
        expect(compile.stderr).toBe('');
        expect(compile.code).toBe(0);
        const sim = await run(join(dir, 'model'), [], dir);
        expect(sim.code).toBe(0);
        check('c99', sim.stdout);
    }, 600_000);
});
