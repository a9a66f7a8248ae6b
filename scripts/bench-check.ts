/**
 * Benchmark of `check` without parsing: all core analyses on generated machines
 * (64 states × 12 inputs, target ≤ 50 ms; 512 states × 12 inputs, target ≤ 500 ms; plus a
 * 16-bit bus variant). Run: node scripts/run-ts.mjs scripts/bench-check.ts [--runs N] [--json]
 *
 * The same machines are also printed as Detent text and timed through `parseDetent` and the
 * whole `checkText` path of the language package.
 */
import { analyzeMachine, checkMachine, guardToDetentText, type Emit, type Machine } from '@detent/core';
import { checkText, parseDetent } from '@detent/language';
import { mulberry32, randomMachine, type RandomMachineOptions } from '../packages/core/test/support/random-machine.js';

/** Prints a core machine model as Detent text (for the parse + check path). */
function emits(machine: Machine, list: readonly Emit[]): string {
    return list.map((e) => {
        const o = machine.outputs[e.output]!;
        return o.isBus ? `${o.name} = ${e.value}` : o.name;
    }).join(', ');
}

function machineToText(machine: Machine): string {
    const lines: string[] = [`machine ${machine.name} {`];
    lines.push(`    clock ${machine.clock.name} ${machine.clock.edge};`);
    const r = machine.reset;
    if (r) lines.push(`    reset ${r.name} ${r.activeHigh ? 'high' : 'low'} ${r.async ? 'async' : 'sync'} ${r.target === 'clear' ? 'clear' : `-> ${machine.states[r.target]!.name}`};`);
    for (const i of machine.inputs) lines.push(`    input ${i.async ? 'async ' : ''}${i.isBus ? `[${i.width}] ` : ''}${i.name};`);
    for (const o of machine.outputs) lines.push(`    output ${o.registered ? 'registered ' : ''}${o.isBus ? `[${o.width}] ` : ''}${o.name};`);
    lines.push(`    encoding ${machine.encoding};`, `    flipflop ${machine.flipflop};`);
    if (machine.recover) lines.push(`    recover -> ${machine.states[machine.recover.target]!.name};`);
    for (const s of machine.states) if (s.code) lines.push(`    code ${s.name} = 0b${s.code.bits};`);
    for (const s of machine.states) {
        lines.push(`    state ${s.name}${s.priority ? ' priority' : ''} {`);
        if (s.emits.length > 0) lines.push(`        emit ${emits(machine, s.emits)};`);
        for (const t of s.transitions) {
            const e = t.emits.length > 0 ? ` emit ${emits(machine, t.emits)}` : '';
            lines.push(`        when ${guardToDetentText(t.guard, machine)} -> ${machine.states[t.target]!.name}${e};`);
        }
        const o = s.otherwise;
        if (o?.kind === 'stay') lines.push('        otherwise stay;');
        else if (o?.kind === 'dontcare') lines.push('        otherwise dontcare;');
        else if (o?.kind === 'goto') lines.push(`        otherwise -> ${machine.states[o.target]!.name}${o.emits.length > 0 ? ` emit ${emits(machine, o.emits)}` : ''};`);
        lines.push('    }');
    }
    lines.push('}');
    return lines.join('\n') + '\n';
}

interface Case { readonly name: string; readonly options: RandomMachineOptions; readonly targetMs: number }

const common: RandomMachineOptions = {
    minBitInputs: 12, maxBitInputs: 12, maxBuses: 0, maxOutputs: 4,
    minTransitions: 1, maxTransitions: 4, priorityRate: 0.3, disjointPlainGuards: false,
    resets: ['target'],
};
const cases: Case[] = [
    { name: '64 states, 12 inputs', options: { ...common, minStates: 64, maxStates: 64 }, targetMs: 50 },
    { name: '512 states, 12 inputs', options: { ...common, minStates: 512, maxStates: 512 }, targetMs: 500 },
    {
        name: '64 states, 4 inputs + 16-bit bus', targetMs: 50,
        options: { ...common, minBitInputs: 4, maxBitInputs: 4, minBuses: 1, maxBuses: 1, minBusWidth: 16, maxBusWidth: 16, minStates: 64, maxStates: 64 },
    },
];

const args = process.argv.slice(2);
const runs = Number(args[args.indexOf('--runs') + 1] ?? '') || 15;
const asJson = args.includes('--json');

function median(xs: number[]): number {
    const s = [...xs].sort((a, b) => a - b);
    const m = s.length >> 1;
    return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

function time(fn: () => unknown): number[] {
    for (let i = 0; i < 3; i++) fn(); // warm-up: let the JIT settle
    const times: number[] = [];
    for (let i = 0; i < runs; i++) {
        const t0 = performance.now();
        fn();
        times.push(performance.now() - t0);
    }
    return times;
}


const results: Record<string, unknown>[] = [];
for (const c of cases) {
    const machine: Machine = randomMachine(mulberry32(20261202), c.options, 'BenchMachine');
    const findings = checkMachine(machine);
    const row: Record<string, unknown> = {
        case: c.name,
        states: machine.states.length,
        transitions: machine.states.reduce((a, s) => a + s.transitions.length, 0),
        findings: findings.length,
        analyzeMs: median(time(() => analyzeMachine(machine))),
        checkMs: median(time(() => checkMachine(machine))),
        targetMs: c.targetMs,
    };
    const text = machineToText(machine);
    const parsed = parseDetent(text);
    const problems = parsed.findings.filter((f) => f.severity === 'error');
    if (problems.length > 0 || parsed.machines.length !== 1) throw new Error(`generated text does not parse cleanly: ${problems[0]?.message}`);
    row['textBytes'] = text.length;
    row['textFindings'] = checkText(text).length;
    row['parseMs'] = median(time(() => parseDetent(text)));
    row['checkTextMs'] = median(time(() => checkText(text)));
    results.push(row);
}

if (asJson) {
    process.stdout.write(JSON.stringify({ runs, results }, null, 2) + '\n');
} else {
    process.stdout.write(`check benchmark (median of ${runs} runs, parse excluded unless noted)\n`);
    for (const r of results) {
        const text = `; text (${r['textBytes']} chars): parse+lower ${(r['parseMs'] as number).toFixed(1)} ms, checkText ${(r['checkTextMs'] as number).toFixed(1)} ms`;
        process.stdout.write(`${String(r['case']).padEnd(34)} ${r['transitions']} transitions, ${r['findings']} findings: analyze ${(r['analyzeMs'] as number).toFixed(1)} ms, check ${(r['checkMs'] as number).toFixed(1)} ms (target ≤ ${r['targetMs']} ms)${text}\n`);
    }
}
