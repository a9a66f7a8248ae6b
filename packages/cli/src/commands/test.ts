/**
 * `detent test PATH…` — runs every scenario of every machine: one PASS/FAIL line per scenario,
 * the failing expect with expected and actual values, a summary line.
 * Exit 0: all passed; 1: a scenario failed or a machine has errors; 2: usage or I/O.
 */
import { parseDetent } from '@detent/language';
import { type Machine, type SimulatorOptions, analyzeMachine, describeFailure, runScenarios, synthesize } from '@detent/core';
import { parseArgs, stringFlag } from '../args.js';
import type { CliIO } from '../io.js';
import { UsageError } from '../io.js';
import { collectFiles, readSource } from '../check-files.js';
import { location } from './export.js';

const FLAGS = {
    machine: { value: true },
    help: { alias: 'h' },
} as const;

export const TEST_HELP = `Usage: detent test PATH… [--machine M]

Runs the scenarios of every machine in the files (folders: every *.detent inside). Each scenario
starts from power-up (after one reset clock when the machine has a reset); 'reset;' holds the
reset for one clock, 'step … * n' applies inputs for n clocks, 'expect' checks after the last edge.

  --machine M   only machines named M
  --help        this text

Exit status: 0 every scenario passed, 1 a scenario failed or a machine has errors, 2 usage or I/O problem.
Detent checks logic, not safety certification; defer to the applicable codes and licensed practice.
`;

/** The codes scenarios run with: the synthesized ones for `encoding auto` (a clear reset depends on them). */
export function simulatorOptions(machine: Machine): SimulatorOptions {
    if (machine.encoding !== 'auto' || machine.reset?.target !== 'clear') return {};
    try {
        return { assignment: synthesize(machine).assignment };
    } catch {
        return {};
    }
}

export async function testCommand(args: readonly string[], io: CliIO): Promise<number> {
    const parsed = parseArgs('test', args, FLAGS);
    if (parsed.flags.has('help')) {
        io.stdout(TEST_HELP);
        return 0;
    }
    if (parsed.positionals.length === 0) throw new UsageError('detent test: expected PATH…; see `detent test --help`');
    const wanted = stringFlag(parsed, 'machine');
    const files = collectFiles('test', parsed.positionals);
    let passed = 0;
    let failed = 0;
    let broken = 0;
    for (const path of files) {
        const source = readSource('test', path);
        const doc = parseDetent(source.text, path);
        if (doc.machines.length === 0) {
            const errors = doc.findings.filter((f) => f.severity === 'error');
            for (const f of errors) io.stdout(`${location(path, f)}\n`);
            if (errors.length) broken++;
            continue;
        }
        for (const lm of doc.machines) {
            const m = lm.machine;
            if (wanted !== undefined && m.name !== wanted) continue;
            const errors = [...lm.findings, ...(lm.usable ? analyzeMachine(m) : [])].filter((f) => f.severity === 'error');
            if (!lm.usable || errors.length > 0) {
                for (const f of errors) io.stdout(`${location(path, f)}\n`);
                io.stdout(`ERROR ${path} ${m.name}: has errors; scenarios not run\n`);
                broken++;
                continue;
            }
            for (const r of runScenarios(m, simulatorOptions(m))) {
                if (r.passed) {
                    passed++;
                    io.stdout(`PASS ${path} ${m.name}/${r.scenario} (${r.expects} expect${r.expects === 1 ? '' : 's'}, ${r.cycles} clock${r.cycles === 1 ? '' : 's'})\n`);
                } else {
                    failed++;
                    const f = r.failure!;
                    io.stdout(`FAIL ${path}:${f.range.start.line + 1}:${f.range.start.character + 1} ${m.name}/${r.scenario}: ${describeFailure(f)}\n`);
                }
            }
        }
    }
    const total = passed + failed;
    io.stdout(`${total} scenario${total === 1 ? '' : 's'}: ${passed} passed, ${failed} failed${broken ? `; ${broken} machine${broken === 1 ? '' : 's'} with errors` : ''}\n`);
    return failed > 0 || broken > 0 ? 1 : 0;
}
