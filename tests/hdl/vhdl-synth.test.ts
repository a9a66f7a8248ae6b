/**
 * VHDL exports through a real synthesizer: Debian's Yosys has no VHDL front end (no ghdl-yosys
 * plugin is packaged), so GHDL's own synthesis (`ghdl --synth --std=08`, GHDL 2.0) elaborates
 * every example and a seeded random sample, behavioral and structural, into a netlist. It must
 * succeed without a single message. Latches cannot slip through: without `--latches`, GHDL 2.0
 * refuses a design that infers one ("latch infered for net …", exit 1 — checked by hand on a
 * deliberately latching process in the last test below).
 */
import { describe, expect, it, beforeAll } from 'vitest';
import { exportMachine, type ExportStyle } from '@detent/core';
import { type CorpusMachine, exampleMachines, randomCorpus, run, scratchDir, toolsAvailable, writeAll } from './support.js';

describe.runIf(toolsAvailable(['ghdl']))('VHDL exports: GHDL synthesis elaborates them without warnings or latches', () => {
    let corpus: CorpusMachine[] = [];
    beforeAll(() => {
        corpus = [...exampleMachines().map((e) => ({ machine: e.machine, synth: e.synth })), ...randomCorpus(40, 4711, 'V')];
    }, 120_000);

    for (const style of ['behavioral', 'structural'] as const satisfies readonly ExportStyle[]) {
        it(`vhdl ${style}`, async () => {
            const dir = scratchDir(`ghdl-synth-${style}`);
            const files = corpus.flatMap((c) => exportMachine(c.machine, 'vhdl', {
                style, statePort: true, sourceName: 'x.detent', sourceText: '', assignment: c.synth.assignment, synthesis: c.synth,
            }));
            const names = writeAll(dir, files);
            const analysed = await run('ghdl', ['-a', '--std=08', ...names], dir);
            expect(analysed.stderr + analysed.stdout).toBe('');
            expect(analysed.code).toBe(0);
            let synthesized = 0;
            await Promise.all(corpus.map(async (c) => {
                const r = await run('ghdl', ['--synth', '--std=08', c.machine.name], dir);
                expect(r.code, `${c.machine.name}: ${r.stderr}`).toBe(0);
                expect(r.stderr.split('\n').filter((l) => l.trim() !== ''), c.machine.name).toEqual([]);
                expect(r.stdout).toMatch(new RegExp(`entity ${c.machine.name} is`, 'i'));
                synthesized++;
            }));
            process.stdout.write(`ghdl --synth vhdl ${style}: ${synthesized} entities, 0 warnings\n`);
            expect(synthesized).toBe(corpus.length);
        }, 600_000);
    }

    it('the oracle can fail: GHDL refuses a design that infers a latch', async () => {
        const dir = scratchDir('ghdl-synth-latch');
        writeAll(dir, [{ name: 'latchy.vhd', text: [
            'library ieee; use ieee.std_logic_1164.all;',
            'entity latchy is port (en, d : in std_logic; q : out std_logic); end entity;',
            'architecture a of latchy is begin',
            "  process (en, d) begin if en = '1' then q <= d; end if; end process;",
            'end architecture;', ''].join('\n') }]);
        expect((await run('ghdl', ['-a', '--std=08', 'latchy.vhd'], dir)).code).toBe(0);
        const r = await run('ghdl', ['--synth', '--std=08', 'latchy'], dir);
        expect(r.code).not.toBe(0);
        expect(r.stderr).toMatch(/latch/i);
    });
});
