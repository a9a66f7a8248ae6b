/**
 * Every example and 200 seeded random machines, exported in Verilog-2005 and SystemVerilog-2017
 * (behavioral and structural): Verilator `--lint-only -Wall` reports nothing, and Yosys reads and
 * synthesizes them (`synth`) without a single warning and without latches. (Icarus -g2005/-g2012
 * and GHDL --std=08 compile the same exports in differential.test.ts; VHDL is not read by Yosys
 * here: Debian's Yosys has no VHDL front end.)
 * Batching: Verilator lints 50 files per run with MULTITOP disabled — that warning only says the
 * batch has several top modules, which is the point of batching.
 */
import { describe, expect, it, beforeAll } from 'vitest';
import { exportMachine, type ExportStyle } from '@detent/core';
import { type CorpusMachine, awkwardMachines, narrowBusMachines, exampleMachines, randomCorpus, run, scratchDir, toolsAvailable, writeAll } from './support.js';

const TOOLS = ['verilator', 'yosys'];

describe.runIf(toolsAvailable(TOOLS))('Verilog/SystemVerilog exports: Verilator -Wall and Yosys synth are silent', () => {
    let corpus: CorpusMachine[] = [];
    beforeAll(() => {
        const examples = exampleMachines();
        corpus = [...examples.map((e) => ({ machine: e.machine, synth: e.synth })), ...randomCorpus(200, 777, 'L'), ...awkwardMachines(8, 707), ...narrowBusMachines(6, 717)];
        expect(corpus.length).toBeGreaterThanOrEqual(200);
    }, 120_000);

    for (const lang of ['verilog', 'systemverilog'] as const) {
        for (const style of ['behavioral', 'structural'] as const satisfies readonly ExportStyle[]) {
            it.concurrent(`${lang} ${style}`, async () => {
                const dir = scratchDir(`lint-${lang}-${style}`);
                // Half with the state port, half without: both port lists must lint clean.
                const names = writeAll(dir, corpus.flatMap((c, k) => exportMachine(c.machine, lang, {
                    style, statePort: k % 2 === 0, sourceName: 'x.detent', sourceText: '', assignment: c.synth.assignment, synthesis: c.synth,
                })));
                const batches: string[][] = [];
                for (let k = 0; k < names.length; k += 50) batches.push(names.slice(k, k + 50));
                const lints = await Promise.all(batches.map((b) => run('verilator', ['--lint-only', '-Wall', '-Wno-MULTITOP', ...(lang === 'systemverilog' ? ['-sv'] : []), ...b], dir)));
                for (const l of lints) {
                    expect(l.stderr + l.stdout).toBe('');
                    expect(l.code).toBe(0);
                }
                const read = names.map((n) => `read_verilog ${lang === 'systemverilog' ? '-sv ' : ''}${n}`).join('; ');
                const ys = await run('yosys', ['-q', '-l', 'yosys.log', '-p', `${read}; synth; select -assert-none t:$dlatch t:$_DLATCH_*; stat`], dir);
                const warnings = ys.stdout.split('\n').concat(ys.stderr.split('\n')).filter((l) => /warning|error/i.test(l));
                process.stdout.write(`lint ${lang} ${style}: ${names.length} modules, verilator ${lints.length} runs, yosys exit ${ys.code}, ${warnings.length} warnings\n`);
                expect(warnings).toEqual([]);
                expect(ys.code).toBe(0);
            }, 600_000);
        }
    }
});
