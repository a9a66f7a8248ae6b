/**
 * Benchmark of `check` without parsing: all core analyses on generated machines
 * (64 states × 12 inputs, target ≤ 50 ms; 512 states × 12 inputs, target ≤ 500 ms; plus a
 * 16-bit bus variant). Run: node scripts/run-ts.mjs scripts/bench-check.ts [--runs N] [--json]
 *
 * The same machines are also printed as Detent text and timed through `parseDetent` and the
 * whole `checkText` path of the language package.
 */
import { analyzeAsBuilt, analyzeMachine, checkMachine, guardToDetentText, type Emit, type Machine } from '@detent/core';
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
const flag = (name: string, fallback: number) => { const i = args.indexOf(name); return i >= 0 ? Number(args[i + 1]) || fallback : fallback; };
/** Runs of the design analyses (fast, this script's main figure). */
const runs = flag('--runs', 15);
/** Runs of the full check paths, which include synthesis-based analyses of other modules. */
const fullRuns = flag('--full-runs', 1);
const asJson = args.includes('--json');

function median(xs: number[]): number {
    const s = [...xs].sort((a, b) => a - b);
    const m = s.length >> 1;
    return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/** Fastest run of the last `time` call: the least disturbed by other processes. */
let lastMin = 0;

function time(fn: () => unknown, n: number): number {
    for (let i = 0; i < Math.min(3, n); i++) fn(); // warm-up: let the JIT settle
    const times: number[] = [];
    for (let i = 0; i < n; i++) {
        const t0 = performance.now();
        fn();
        times.push(performance.now() - t0);
    }
    lastMin = Math.min(...times);
    return median(times);
}

/** Mean CPU time (user + system) of n runs: steadier than wall time on a shared, loaded machine. */
function cpuTime(fn: () => unknown, n: number): number {
    for (let i = 0; i < Math.min(3, n); i++) fn();
    const c0 = process.cpuUsage();
    for (let i = 0; i < n; i++) fn();
    const c = process.cpuUsage(c0);
    return (c.user + c.system) / 1000 / n;
}

const ms = (x: number) => `${x.toFixed(1)} ms`;
const results: Record<string, unknown>[] = [];
if (!asJson) process.stdout.write(`check benchmark (wall-time medians, CPU time = mean; design analyses ${runs} runs, full paths ${fullRuns} runs)\n`);
for (const c of cases) {
    const machine: Machine = randomMachine(mulberry32(20261202), c.options, 'BenchMachine');
    const text = machineToText(machine);
    const parsed = parseDetent(text);
    const problems = parsed.findings.filter((f) => f.severity === 'error');
    if (problems.length > 0 || parsed.machines.length !== 1) throw new Error(`generated text does not parse cleanly: ${problems[0]?.message}`);
    const registered = machine.outputs.filter((o) => o.registered).length;
    const shape = `encoding ${machine.encoding}, flipflop ${machine.flipflop}, reset ${machine.reset ? (machine.reset.target === 'clear' ? 'clear' : '-> state') : 'none'}`
        + `${machine.recover ? ', recover' : ''}, async inputs ${machine.inputs.filter((i) => i.async).length}, registered outputs ${registered}`;
    let asBuiltCodes = '';
    const row = {
        case: c.name,
        shape,
        states: machine.states.length,
        transitions: machine.states.reduce((a, s) => a + s.transitions.length, 0),
        designFindings: analyzeMachine(machine).length,
        targetMs: c.targetMs,
        /** The design analyses of packages/core/src/analysis. */
        analyzeMs: time(() => analyzeMachine(machine), runs),
        analyzeMinMs: lastMin,
        analyzeCpuMs: cpuTime(() => analyzeMachine(machine), runs),
        /** checkMachine without the synthesis-based (as-built) analyses. */
        checkDesignMs: time(() => checkMachine(machine, { skipAsBuilt: true }), runs),
        /** The as-built analyses alone (synthesis + lock-up + reset-code + async-input). */
        asBuiltMs: time(() => { asBuiltCodes = analyzeAsBuilt(machine).map((f) => f.code).join(', ') || 'none'; }, fullRuns),
        asBuiltCpuMs: cpuTime(() => analyzeAsBuilt(machine), fullRuns),
        /** checkMachine with everything (as-built analyses synthesize the machine). */
        checkMs: time(() => checkMachine(machine), fullRuns),
        checkMinMs: lastMin,
        checkCpuMs: cpuTime(() => checkMachine(machine), fullRuns),
        textChars: text.length,
        parseMs: time(() => parseDetent(text), fullRuns),
        checkTextMs: time(() => checkText(text), fullRuns),
    };
    results.push(row);
    if (!asJson) {
        process.stdout.write(`${row.case} (${row.transitions} transitions, ${row.designFindings} design findings; target ≤ ${row.targetMs} ms)\n`
            + `    ${row.shape}\n`
            + `    design analyses ${ms(row.analyzeMs)} (fastest ${ms(row.analyzeMinMs)}, CPU ${ms(row.analyzeCpuMs)}) | check w/o as-built ${ms(row.checkDesignMs)}\n`
            + `    as-built ${ms(row.asBuiltMs)} (CPU ${ms(row.asBuiltCpuMs)}; findings: ${asBuiltCodes}) | full check ${ms(row.checkMs)} (fastest ${ms(row.checkMinMs)}, CPU ${ms(row.checkCpuMs)})\n`
            + `    text ${row.textChars} chars: parse+lower ${ms(row.parseMs)} | checkText ${ms(row.checkTextMs)}\n`);
    }
}
if (asJson) process.stdout.write(JSON.stringify({ runs, fullRuns, results }, null, 2) + '\n');
