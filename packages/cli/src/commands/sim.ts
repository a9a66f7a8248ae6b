/**
 * `detent sim FILE --stimulus F [--vcd OUT] [--machine M] [--force]` — simulates a stimulus file
 * (format: docs/stimulus.md) and prints one row per clock (cycle, reset, inputs, state, outputs);
 * `--vcd` also writes an IEEE 1364 value change dump. Exit 0: simulated; 1: the machine has
 * errors; 2: usage, I/O or a stimulus file that cannot be read.
 */
import { parseArgs, stringFlag } from '../args.js';
import type { CliIO } from '../io.js';
import { UsageError } from '../io.js';
import { readSource } from '../check-files.js';
import { StimulusError, parseStimulus, simulate, traceTable, traceToVcd } from '@detent/core';
import { checkClobber, loadMachines, writeAtomic } from './export.js';
import { simulatorOptions } from './test.js';
import { resolve } from 'node:path';

const FLAGS = {
    stimulus: { value: true },
    vcd: { value: true },
    machine: { value: true },
    force: {},
    help: { alias: 'h' },
} as const;

export const SIM_HELP = `Usage: detent sim FILE --stimulus F [--vcd OUT] [--machine M] [--force]

Simulates one machine clock by clock. The stimulus file has one line per clock:
    request obstacle=0 level=0xC     # name=value (decimal, 0b…, 0x…); a bare name means 1
    reset=1                          # assert the reset (or the reset's own name at its pin level)
    level=3 * 5                      # the same inputs for 5 clocks
    -                                # one clock with every input 0
Inputs a line does not name are 0. '#' starts a comment; blank lines are ignored (docs/stimulus.md).

  --stimulus F   the stimulus file (required)
  --vcd OUT      also write a value change dump (IEEE 1364 VCD; clock, reset, inputs, outputs, state code, state name)
  --machine M    the machine to simulate (default: the first in FILE)
  --force        overwrite OUT even when it was not written by Detent
  --help         this text

Exit status: 0 simulated, 1 the machine has errors, 2 usage, I/O or stimulus problem.
`;

export async function simCommand(args: readonly string[], io: CliIO): Promise<number> {
    const parsed = parseArgs('sim', args, FLAGS);
    if (parsed.flags.has('help')) {
        io.stdout(SIM_HELP);
        return 0;
    }
    if (parsed.positionals.length !== 1) throw new UsageError('detent sim: expected one FILE; see `detent sim --help`');
    const stimulusPath = stringFlag(parsed, 'stimulus');
    if (!stimulusPath) throw new UsageError('detent sim: --stimulus F is required');
    const path = parsed.positionals[0]!;
    const wanted = stringFlag(parsed, 'machine');
    const loaded = loadMachines('sim', path, wanted, io);
    if (typeof loaded === 'number') return loaded;
    const machine = loaded.machines[0]!;
    if (wanted === undefined && loaded.machines.length > 1) io.stderr(`detent sim: ${path} has ${loaded.machines.length} machines; simulating '${machine.name}' (use --machine)\n`);
    const stimulusText = readSource('sim', stimulusPath).text;
    let cycles;
    try {
        cycles = parseStimulus(machine, stimulusText);
    } catch (err) {
        if (err instanceof StimulusError) throw new UsageError(`detent sim: ${stimulusPath}:${err.line}: ${err.message.replace(/^line \d+: /, '')}`);
        throw err;
    }
    const trace = simulate(machine, cycles, simulatorOptions(machine));
    io.stdout(traceTable(machine, trace));
    const vcd = stringFlag(parsed, 'vcd');
    if (vcd) {
        const out = resolve(vcd);
        checkClobber('sim', [out], parsed.flags.has('force'));
        writeAtomic('sim', out, traceToVcd(machine, trace));
        io.stdout(`wrote ${vcd}\n`);
    }
    return 0;
}
