/**
 * `detent synth FILE [--machine M] [--encoding E] [--flipflop F] [--format text|json]`:
 * state codes, minimized equations (textbook and HDL notation), cost and the recovery report.
 * Exit 0: synthesized; 1: the machine has errors; 2: usage or I/O.
 */
import { parseDetent } from '@detent/language';
import {
    type EncodingKind, type Finding, type FlipFlopKind, type RecoveryReport, type SynthesisResult,
    ENCODING_KINDS, FLIPFLOP_KINDS, FREE, ONE, SynthesisError, analyzeMachine, asyncInputFindings, coverText, getVar, isUniverse,
    printOrder, recoveryReport, synthesize,
} from '@detent/core';
import { parseArgs, stringFlag } from '../args.js';
import type { CliIO } from '../io.js';
import { UsageError } from '../io.js';
import { readSource } from '../check-files.js';

const FLAGS = {
    machine: { value: true },
    encoding: { value: true, choices: ENCODING_KINDS },
    flipflop: { value: true, choices: FLIPFLOP_KINDS },
    format: { value: true, choices: ['text', 'json'] },
    help: { alias: 'h' },
} as const;

export const SYNTH_HELP = `Usage: detent synth FILE [--machine M] [--encoding E] [--flipflop F] [--format text|json]

Synthesizes one machine: state codes, minimized excitation and output equations, cost, and the
as-built recovery report (unused codes, lock-up, worst-case recovery latency, reset code).

  --machine M      the machine to synthesize (default: the first in the file)
  --encoding E     ${ENCODING_KINDS.join(' | ')} (default: the file's 'encoding')
  --flipflop F     ${FLIPFLOP_KINDS.join(' | ')} (default: the file's 'flipflop')
  --format text    codes, equations as  t0 = q1'·ready + q0·abort  and  t0 = ~q1 & ready | q0 & abort (default)
  --format json    {"machine","encoding","flipflop","width","codes","equations","cost","recovery"}
  --help           this text

Exit status: 0 synthesized, 1 the machine has errors, 2 usage or I/O problem.
Detent checks logic, not safety certification; defer to the applicable codes and licensed practice.
`;

function location(path: string, f: Finding): string {
    return `${path}:${f.range.start.line + 1}:${f.range.start.character + 1}: ${f.severity} ${f.code}: ${f.message}`;
}

/** One product as {variable: 0|1}, literals in print order (state bits MSB first, then inputs). */
function productObject(r: SynthesisResult, cube: Uint32Array): Record<string, 0 | 1> {
    const o: Record<string, 0 | 1> = {};
    if (isUniverse(cube, r.variables.length)) return o;
    for (const v of printOrder(r)) {
        const f = getVar(cube, v);
        if (f !== FREE) o[r.variables[v]!] = f === ONE ? 1 : 0;
    }
    return o;
}

export function synthJson(r: SynthesisResult, recovery: RecoveryReport, findings: readonly Finding[] = []): object {
    const codes: Record<string, string> = {};
    r.machine.states.forEach((s, i) => { codes[s.name] = r.assignment.codes[i]!; });
    return {
        machine: r.machine.name,
        encoding: r.assignment.encoding,
        flipflop: r.flipflop,
        width: r.assignment.width,
        codes,
        equations: r.equations.map((e) => ({
            name: e.name,
            products: e.cover.some((c) => isUniverse(c, r.variables.length)) ? [{}] : e.cover.map((c) => productObject(r, c)),
            role: e.role,
            exact: e.exact,
            textbook: coverText(e.cover, r, 'textbook'),
            hdl: coverText(e.cover, r, 'hdl'),
        })),
        cost: {
            flipflops: r.cost.flipflops,
            literals: r.cost.literals,
            gateInputs: r.cost.gateInputs,
            products: r.cost.products,
            maxFanIn: r.cost.maxFanIn,
            outputFlipflops: r.outputFlipflops ?? 0,
        },
        recovery,
        findings: findings.map((f) => ({ code: f.code, severity: f.severity, message: f.message, ...(f.signal ? { signal: f.signal } : {}) })),
        ...(r.assignment.note ? { note: r.assignment.note } : {}),
        ...(r.notes && r.notes.length ? { notes: r.notes } : {}),
    };
}

export function recoveryText(rep: RecoveryReport): string[] {
    const lines: string[] = [];
    if (rep.method === 'skipped') return [`recovery: analysis skipped (${rep.skipped})`];
    const unused = `${rep.unusedCodes} unused code${rep.unusedCodes === 1 ? '' : 's'}`;
    if (rep.lockup) {
        const cycle = rep.witness?.cycle ?? [];
        const steps = cycle.map((s) => {
            const ins = Object.entries(s.inputs).map(([k, v]) => `${k}=${v}`).join(',');
            return ins ? `${s.code} (${ins})` : s.code;
        });
        lines.push(`recovery: ${unused}; LOCK-UP: ${steps.join(' → ')} → ${cycle[0]?.code ?? ''} (${rep.method})`);
    } else if (rep.unusedCodes === 0) {
        lines.push(`recovery: no unused codes (${rep.method})`);
    } else {
        lines.push(`recovery: ${unused}; no lock-up; worst-case recovery ${rep.worstLatency} clock${rep.worstLatency === 1 ? '' : 's'}${rep.worstLatencyCode ? ` (from ${rep.worstLatencyCode})` : ''} (${rep.method})`);
    }
    if (rep.resetCode === 'state') lines.push('reset clear: code 0 is a state');
    else if (rep.resetCode === 'recovers') lines.push(`reset clear: code 0 is no state; it reaches a state within ${rep.resetCodeLatency ?? '?'} clock(s)`);
    else if (rep.resetCode === 'stuck') lines.push('reset clear: code 0 is no state and may never recover (reset-code)');
    if (rep.recover) {
        const d = rep.recoverCostDelta;
        lines.push(`recover -> ${rep.recover}${d ? `: costs ${d.gateInputs >= 0 ? '+' : ''}${d.gateInputs} gate inputs, ${d.literals >= 0 ? '+' : ''}${d.literals} literals over don't-care unused codes` : ''}`);
    }
    return lines;
}

export function synthText(r: SynthesisResult, recovery: RecoveryReport, findings: readonly Finding[] = []): string {
    const out: string[] = [];
    out.push(`machine ${r.machine.name}: encoding ${r.assignment.encoding}, ${r.flipflop} flip-flops, width ${r.assignment.width}`);
    if (r.assignment.note) out.push(r.assignment.note);
    out.push('codes:');
    const pad = Math.max(...r.machine.states.map((s) => s.name.length));
    r.machine.states.forEach((s, i) => out.push(`  ${s.name.padEnd(pad)}  ${r.assignment.codes[i]}`));
    out.push('equations:');
    for (const e of r.equations) out.push(`  ${e.name} = ${coverText(e.cover, r, 'textbook')}`);
    out.push('equations (HDL):');
    for (const e of r.equations) out.push(`  ${e.name} = ${coverText(e.cover, r, 'hdl')}`);
    const c = r.cost;
    out.push(`cost: ${c.flipflops} flip-flops${r.outputFlipflops ? ` (${r.outputFlipflops} for registered outputs)` : ''}, ${c.literals} literals, ${c.gateInputs} gate inputs, ${c.products} products, max fan-in ${c.maxFanIn}`);
    out.push(...recoveryText(recovery));
    for (const f of findings) out.push(`${f.severity} ${f.code}: ${f.message}`);
    for (const n of r.notes ?? []) out.push(`note: ${n}`);
    out.push('Detent checks logic, not safety certification; defer to the applicable codes and licensed practice.');
    return `${out.join('\n')}\n`;
}

export async function synthCommand(args: readonly string[], io: CliIO): Promise<number> {
    const parsed = parseArgs('synth', args, FLAGS);
    if (parsed.flags.has('help')) {
        io.stdout(SYNTH_HELP);
        return 0;
    }
    if (parsed.positionals.length !== 1) throw new UsageError('detent synth: expected one FILE; see `detent synth --help`');
    const path = parsed.positionals[0]!;
    const source = readSource('synth', path);
    const doc = parseDetent(source.text, path);
    if (doc.machines.length === 0) {
        const errors = doc.findings.filter((f) => f.severity === 'error');
        for (const f of errors) io.stderr(`${location(path, f)}\n`);
        if (errors.length) return 1;
        throw new UsageError(`detent synth: ${path}: no machine in this file`);
    }
    const wanted = stringFlag(parsed, 'machine');
    const chosen = wanted === undefined ? doc.machines[0]! : doc.machines.find((m) => m.machine.name === wanted);
    if (!chosen) throw new UsageError(`detent synth: no machine '${wanted}' in ${path} (machines: ${doc.machines.map((m) => m.machine.name).join(', ')})`);
    if (wanted === undefined && doc.machines.length > 1) {
        io.stderr(`detent synth: ${path} has ${doc.machines.length} machines; synthesizing '${chosen.machine.name}' (use --machine)\n`);
    }
    const errors = [...chosen.findings, ...(chosen.usable ? analyzeMachine(chosen.machine) : [])].filter((f) => f.severity === 'error');
    if (errors.length > 0 || !chosen.usable) {
        for (const f of errors) io.stderr(`${location(path, f)}\n`);
        io.stderr(`detent synth: ${chosen.machine.name} has errors; fix them first (see \`detent check\`)\n`);
        return 1;
    }
    const encoding = stringFlag(parsed, 'encoding') as EncodingKind | undefined;
    const flipflop = stringFlag(parsed, 'flipflop') as FlipFlopKind | undefined;
    let result: SynthesisResult;
    try {
        result = synthesize(chosen.machine, { encoding, flipflop });
    } catch (err) {
        if (err instanceof SynthesisError) {
            io.stderr(`${path}: error: ${err.message}\n`);
            return 1;
        }
        throw err;
    }
    const recovery = recoveryReport(result, { budgetMs: 5000, synthesis: { encoding, flipflop } });
    const findings = asyncInputFindings(result);
    if (stringFlag(parsed, 'format') === 'json') io.stdout(`${JSON.stringify(synthJson(result, recovery, findings), null, 2)}\n`);
    else io.stdout(synthText(result, recovery, findings));
    return 0;
}
