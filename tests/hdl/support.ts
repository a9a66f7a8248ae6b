/**
 * Shared machinery of the real-tool tests: tool detection (a missing tool FAILS under CI=true and
 * skips locally), a two-wide process pool, the seeded machine corpus, random stimulus, and the
 * dumping testbenches the differential test drives the exports with. The testbenches here are
 * written independently of the exporters' own scenario testbenches.
 */
import { spawn, spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parseDetent } from '@detent/language';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { EncodingKind, FlipFlopKind, Guard, Machine, SynthesisResult } from '@detent/core';
import { cField, clearResetState, synthesize, createSimulator } from '@detent/core';
import { int, mulberry32, randomMachine, type Rng } from '../../packages/core/test/support/random-machine.js';

export const IN_CI = process.env.CI === 'true';

export function missingTools(tools: readonly string[]): string[] {
    return tools.filter((t) => spawnSync('sh', ['-c', `command -v ${t}`], { encoding: 'utf8' }).status !== 0);
}

/**
 * Whether a suite needing `tools` runs: locally a missing tool skips (with a message); under
 * CI=true it runs anyway so that the missing tool fails the suite.
 */
export function toolsAvailable(tools: readonly string[]): boolean {
    const missing = missingTools(tools);
    if (missing.length === 0) return true;
    if (IN_CI) return true;
    process.stderr.write(`tests/hdl: skipping (missing ${missing.join(', ')}; .ci/install-hdl-tools.sh installs them)\n`);
    return false;
}

export interface RunResult {
    readonly code: number;
    readonly stdout: string;
    readonly stderr: string;
}

let running = 0;
const waiting: (() => void)[] = [];
/** At most this many tool processes at once (CI has 2 cores). */
export const PARALLEL = 2;

async function slot(): Promise<void> {
    if (running < PARALLEL) { running++; return; }
    await new Promise<void>((resolve) => waiting.push(resolve));
    running++;
}

function release(): void {
    running--;
    waiting.shift()?.();
}

export async function run(cmd: string, args: readonly string[], cwd: string): Promise<RunResult> {
    await slot();
    try {
        return await new Promise<RunResult>((resolve) => {
            const child = spawn(cmd, args, { cwd });
            let stdout = '';
            let stderr = '';
            child.stdout.on('data', (d: Buffer) => { stdout += d.toString(); });
            child.stderr.on('data', (d: Buffer) => { stderr += d.toString(); });
            child.on('error', (err) => resolve({ code: 127, stdout, stderr: stderr + String(err) }));
            child.on('close', (code) => resolve({ code: code ?? 1, stdout, stderr }));
        });
    } finally {
        release();
    }
}

/**
 * Icarus messages that count: everything except Icarus 11's notice that a bit select inside an
 * `always_comb` makes the whole vector part of the sensitivity (a simulator limitation, not a
 * problem of the design; Verilator lints the same files with -Wall).
 */
export function icarusMessages(text: string): string[] {
    return text.split('\n').filter((l) => l.trim() !== '' && !/sorry: constant selects in always_\* processes are not currently supported/.test(l));
}

export function scratchDir(label: string): string {
    const base = join(tmpdir(), 'detent-hdl');
    mkdirSync(base, { recursive: true });
    return mkdtempSync(join(base, `${label}-`));
}

export function writeAll(dir: string, files: readonly { name: string; text: string }[]): string[] {
    return files.map((f) => { writeFileSync(join(dir, f.name), f.text); return f.name; });
}

export const ENCODINGS: readonly EncodingKind[] = ['binary', 'gray', 'onehot', 'onecold', 'johnson', 'explicit', 'auto'];
export const FLIPFLOPS: readonly FlipFlopKind[] = ['D', 'T', 'JK', 'SR'];

export interface CorpusMachine {
    readonly machine: Machine;
    readonly synth: SynthesisResult;
}

/**
 * `count` seeded random machines cycling through every encoding × flip-flop pair. No
 * `otherwise dontcare` (the structural export may do anything there) and no `reset … clear`
 * onto a code that is no state without `recover` (a `reset-code` error).
 */
export function randomCorpus(count: number, seed: number, prefix = 'R', dontcare = false): CorpusMachine[] {
    const rng = mulberry32(seed);
    const out: CorpusMachine[] = [];
    let attempt = 0;
    while (out.length < count) {
        const i = out.length;
        const encoding = ENCODINGS[i % ENCODINGS.length]!;
        const flipflop = FLIPFLOPS[Math.floor(i / ENCODINGS.length) % FLIPFLOPS.length]!;
        const machine = randomMachine(rng, { dontcare, encodings: [encoding], flipflops: [flipflop], maxStates: 7 }, `${prefix}${i}`);
        attempt++;
        if (attempt > count * 20) throw new Error('corpus: too many rejected machines');
        let synth: SynthesisResult;
        try {
            synth = synthesize(machine, { budgetMs: 30 });
        } catch {
            continue;
        }
        if (machine.reset?.target === 'clear' && clearResetState(synth.assignment) === undefined && !machine.recover) continue;
        out.push({ machine, synth });
    }
    return out;
}

export const ROOT = fileURLToPath(new URL('../../', import.meta.url));

export interface ExampleMachine extends CorpusMachine {
    readonly file: string;
    readonly text: string;
}

/** Every usable machine of examples/*.detent (the realistic examples; defects/ is not included). */
export function exampleMachines(): ExampleMachine[] {
    const dir = join(ROOT, 'examples');
    const out: ExampleMachine[] = [];
    for (const name of readdirSync(dir).filter((n) => n.endsWith('.detent')).sort()) {
        const text = readFileSync(join(dir, name), 'utf8');
        for (const lm of parseDetent(text).machines) {
            if (!lm.usable || lm.findings.some((f) => f.severity === 'error')) throw new Error(`example ${name}: machine ${lm.machine.name} has errors`);
            out.push({ file: name, text, machine: lm.machine, synth: synthesize(lm.machine, { budgetMs: 200 }) });
        }
    }
    return out;
}

/**
 * Machines whose signal and state names collide with the exporters' internal names (state_q,
 * state_d, unused_inputs, <out>_q, CLEARED, state_t) or are C keywords (goto, char): the exports
 * must rename their own signals, never the ports.
 */
export function awkwardMachines(count: number, seed: number): CorpusMachine[] {
    const base = randomCorpus(count, seed, 'W');
    const inNames = ['state_q', 'goto', 'unused_inputs', 'state_t'];
    const outNames = ['state_d', 'char', 'lamp_q', 'lamp'];
    return base.map((c) => {
        const m = c.machine;
        const machine: Machine = {
            ...m,
            inputs: m.inputs.map((i, k) => ({ ...i, name: inNames[k] ?? i.name })),
            outputs: m.outputs.map((o, k) => ({ ...o, name: outNames[k] ?? o.name })),
            states: m.states.map((st, k) => ({ ...st, name: k === 0 ? 'CLEARED' : k === 1 ? 'state_d_1' : st.name })),
        };
        return { machine, synth: synthesize(machine, { encoding: c.synth.assignment.encoding === 'auto' ? 'binary' : undefined, budgetMs: 30 }) };
    });
}

/** Machines whose 1-bit inputs and outputs are all declared as 1-bit buses (`input [1] a;`): `[0:0]` ports. */
export function narrowBusMachines(count: number, seed: number): CorpusMachine[] {
    const toBit = (g: Guard): Guard => {
        switch (g.kind) {
            case 'input': return { kind: 'bit', input: g.input, bit: 0, range: g.range };
            case 'not': return { ...g, operand: toBit(g.operand) };
            case 'and': case 'or': case 'xor': return { ...g, operands: g.operands.map(toBit) };
            default: return g;
        }
    };
    return randomCorpus(count, seed, 'N').map((c) => {
        const m = c.machine;
        const machine: Machine = {
            ...m,
            inputs: m.inputs.map((i) => ({ ...i, isBus: true })),
            outputs: m.outputs.map((o) => ({ ...o, isBus: true })),
            states: m.states.map((st) => ({
                ...st,
                transitions: st.transitions.map((t) => ({ ...t, guard: toBit(t.guard) })),
            })),
        };
        return { machine, synth: synthesize(machine, { encoding: c.synth.assignment.encoding === 'auto' ? 'binary' : undefined, budgetMs: 30 }) };
    });
}

export interface StimulusCycle {
    readonly reset: boolean;
    readonly inputs: readonly number[];
}

/** Reset first (when there is one), then random inputs; reset again now and then mid-run. */
export function randomStimulus(machine: Machine, rng: Rng, cycles: number): StimulusCycle[] {
    const out: StimulusCycle[] = [];
    for (let k = 0; k < cycles; k++) {
        const reset = machine.reset !== undefined && (k === 0 || rng() < 0.03);
        out.push({ reset, inputs: machine.inputs.map((i) => int(rng, 0, 2 ** i.width - 1)) });
    }
    return out;
}

export function bitsOf(value: number, width: number): string {
    let s = '';
    for (let b = width - 1; b >= 0; b--) s += Math.floor(value / 2 ** b) % 2 === 1 ? '1' : '0';
    return s;
}

/** Expected dump lines `k code out…` from the core simulator. */
export function expectedDump(c: CorpusMachine, stimulus: readonly StimulusCycle[]): string[] {
    const sim = createSimulator(c.machine, { assignment: c.synth.assignment });
    let st = sim.initial();
    return stimulus.map((cy, k) => {
        const r = sim.cycle(st, cy.inputs, cy.reset);
        st = r.state;
        return [k, st.code, ...r.outputs.map((v, j) => bitsOf(v, c.machine.outputs[j]!.width))].join(' ');
    });
}

/** Dump lines `D <id> …` grouped by id. */
export function parseDump(text: string): Map<string, string[]> {
    const m = new Map<string, string[]>();
    for (const line of text.split('\n')) {
        const t = line.trim().split(/\s+/);
        if (t[0] !== 'D' || t.length < 3) continue;
        const id = t[1]!;
        if (!m.has(id)) m.set(id, []);
        m.get(id)!.push(t.slice(2).join(' '));
    }
    return m;
}

const pinLevel = (machine: Machine, asserted: boolean) => (asserted === machine.reset!.activeHigh ? 1 : 0);

/** A Verilog testbench that applies the stimulus and prints `D id k state out…` after each edge. Ports by position (the contract's order). */
export function verilogDumpBench(machine: Machine, width: number, stimulus: readonly StimulusCycle[]): { name: string; text: string } {
    const id = machine.name;
    const idle = machine.clock.edge === 'rising' ? 0 : 1;
    const L: string[] = [`module tb_${id};`, `    reg clk = 1'b${idle};`, '    integer k = 0;'];
    if (machine.reset) L.push(`    reg rst = 1'b${pinLevel(machine, false)};`);
    machine.inputs.forEach((inp, j) => L.push(`    reg ${inp.isBus ? `[${inp.width - 1}:0] ` : ''}i${j} = 0;`));
    machine.outputs.forEach((o, j) => L.push(`    wire ${o.isBus ? `[${o.width - 1}:0] ` : ''}o${j};`));
    L.push(`    wire [${width - 1}:0] st;`);
    const conns = ['clk', ...(machine.reset ? ['rst'] : []), ...machine.inputs.map((_, j) => `i${j}`), ...machine.outputs.map((_, j) => `o${j}`), 'st'];
    L.push(`    ${id} dut (${conns.join(', ')});`);
    const params = [...(machine.reset ? ['input r'] : []), ...machine.inputs.map((inp, j) => `input ${inp.isBus ? `[${inp.width - 1}:0] ` : ''}x${j}`)];
    L.push(`    task cyc(${params.length ? params.join(', ') : 'input dummy'});`, '    begin');
    if (machine.reset) L.push('        rst = r;');
    machine.inputs.forEach((_, j) => L.push(`        i${j} = x${j};`));
    if (!params.length) L.push('        if (dummy) ;');
    L.push(`        #5 clk = 1'b${1 - idle};`);
    const fmt = ['%0d', '%b', ...machine.outputs.map(() => '%b')].join(' ');
    L.push(`        #2 $display("D ${id} ${fmt}", k, st${machine.outputs.map((_, j) => `, o${j}`).join('')});`);
    L.push(`        #3 clk = 1'b${idle};`, '        k = k + 1;', '    end', '    endtask');
    L.push('    initial begin');
    for (const cy of stimulus) {
        const args = [...(machine.reset ? [`1'b${pinLevel(machine, cy.reset)}`] : []), ...cy.inputs.map((v, j) => `${machine.inputs[j]!.width}'d${v}`)];
        L.push(`        cyc(${args.length ? args.join(', ') : "1'b0"});`);
    }
    L.push('    end', 'endmodule', '');
    return { name: `tb_${id}.v`, text: L.join('\n') };
}

/** The same testbench in VHDL-2008 (std.textio to stdout). */
export function vhdlDumpBench(machine: Machine, width: number, stimulus: readonly StimulusCycle[]): { name: string; text: string } {
    const id = machine.name;
    const idle = machine.clock.edge === 'rising' ? 0 : 1;
    const slv = (w: number) => `std_logic_vector(${w - 1} downto 0)`;
    const L: string[] = ['library ieee;', 'use ieee.std_logic_1164.all;', 'use std.textio.all;', '', `entity tb_${id} is`, `end entity tb_${id};`, '', `architecture sim of tb_${id} is`];
    L.push(`    signal clk : std_logic := '${idle}';`);
    if (machine.reset) L.push(`    signal rst : std_logic := '${pinLevel(machine, false)}';`);
    machine.inputs.forEach((inp, j) => L.push(`    signal i${j} : ${inp.isBus ? `${slv(inp.width)} := (others => '0')` : "std_logic := '0'"};`));
    machine.outputs.forEach((o, j) => L.push(`    signal o${j} : ${o.isBus ? slv(o.width) : 'std_logic'};`));
    L.push(`    signal st : ${slv(width)};`, 'begin');
    const conns = ['clk', ...(machine.reset ? ['rst'] : []), ...machine.inputs.map((_, j) => `i${j}`), ...machine.outputs.map((_, j) => `o${j}`), 'st'];
    L.push(`    dut : entity work.${id} port map (${conns.join(', ')});`);
    L.push('    stimulus : process');
    L.push('        variable l : line;', '        variable k : integer := 0;');
    machine.inputs.forEach((inp, j) => { if (inp.isBus) L.push(`        subtype t${j} is ${slv(inp.width)};`); });
    const params = [...(machine.reset ? ['r : std_logic'] : []), ...machine.inputs.map((inp, j) => `x${j} : ${inp.isBus ? `t${j}` : 'std_logic'}`)];
    L.push(`        procedure cyc${params.length ? `(${params.join('; ')})` : ''} is`, '        begin');
    if (machine.reset) L.push('            rst <= r;');
    machine.inputs.forEach((_, j) => L.push(`            i${j} <= x${j};`));
    L.push(`            wait for 5 ns;`, `            clk <= '${1 - idle}';`, '            wait for 2 ns;');
    L.push(`            write(l, string'("D ${id} "));`, '            write(l, k);', `            write(l, string'(" "));`, '            write(l, to_string(st));');
    machine.outputs.forEach((_, j) => L.push(`            write(l, string'(" "));`, `            write(l, to_string(o${j}));`));
    L.push('            writeline(output, l);', '            wait for 3 ns;', `            clk <= '${idle}';`, '            k := k + 1;', '        end procedure;', '    begin');
    for (const cy of stimulus) {
        const args = [...(machine.reset ? [`'${pinLevel(machine, cy.reset)}'`] : []), ...cy.inputs.map((v, j) => (machine.inputs[j]!.isBus ? `"${bitsOf(v, machine.inputs[j]!.width)}"` : `'${v}'`))];
        L.push(`        cyc${args.length ? `(${args.join(', ')})` : ''};`);
    }
    L.push('        wait;', '    end process;', 'end architecture sim;', '');
    return { name: `tb_${id}.vhd`, text: L.join('\n') };
}

export function vhdlTop(ids: readonly string[], name = 'tb_all'): { name: string; text: string } {
    const L = [`entity ${name} is`, `end entity ${name};`, '', `architecture sim of ${name} is`, 'begin'];
    ids.forEach((id, k) => L.push(`    u${k} : entity work.tb_${id};`));
    L.push('end architecture sim;', '');
    return { name: `${name}.vhd`, text: L.join('\n') };
}

/** A C harness calling <m>_reset/_step/_outputs_of with the stimulus, printing the same dump. */
export function cHarness(machine: Machine, width: number, stimulus: readonly StimulusCycle[]): { name: string; text: string } {
    const id = machine.name;
    const field = cField; // the export's member naming (C keywords get a trailing _)
    const L = ['#include <stdio.h>', `#include "${id}.h"`, 'void pb(unsigned long v, int w);', `void run_${id}(void);`, ''];
    const params = ['int r', ...machine.inputs.map((_, j) => `unsigned x${j}`)];
    L.push(`static void cyc_${id}(${id}_state *s, int *k, ${params.join(', ')})`, '{', `    ${id}_inputs in;`, `    ${id}_outputs out;`);
    if (machine.inputs.length === 0) L.push('    in.no_inputs = 0;');
    machine.inputs.forEach((inp, j) => L.push(`    in.${field(inp.name)} = ${inp.isBus ? `x${j}` : `x${j} != 0u`};`));
    L.push(`    if (r) *s = ${id}_reset(); else *s = ${id}_step(*s, &in, &out);`, `    ${id}_outputs_of(*s, &in, &out);`);
    L.push(`    printf("D ${id} %d ", *k);`, `    pb((unsigned long)s->code, ${width});`);
    machine.outputs.forEach((o) => L.push('    putchar(\' \');', `    pb((unsigned long)out.${field(o.name)}, ${o.width});`));
    L.push('    putchar(\'\\n\');', '    *k += 1;', '}', '', `void run_${id}(void)`, '{', `    ${id}_state s = ${id}_reset();`, '    int k = 0;');
    for (const cy of stimulus) L.push(`    cyc_${id}(&s, &k, ${[cy.reset ? 1 : 0, ...cy.inputs.map((v) => `${v}u`)].join(', ')});`);
    L.push('}', '');
    return { name: `h_${id}.c`, text: L.join('\n') };
}

export function cMain(ids: readonly string[]): { name: string; text: string } {
    const L = ['#include <stdio.h>', ...ids.map((id) => `void run_${id}(void);`), '',
        'void pb(unsigned long v, int w);', 'void pb(unsigned long v, int w)', '{', '    int b;', '    for (b = w - 1; b >= 0; b--) putchar(((v >> b) & 1ul) ? \'1\' : \'0\');', '}', '',
        'int main(void)', '{', ...ids.map((id) => `    run_${id}();`), '    return 0;', '}', ''];
    return { name: 'main.c', text: L.join('\n') };
}

/** Compares dumps: returns mismatch descriptions (empty = identical). */
export function compareDumps(expected: ReadonlyMap<string, readonly string[]>, actual: ReadonlyMap<string, readonly string[]>): string[] {
    const problems: string[] = [];
    for (const [id, lines] of expected) {
        const got = actual.get(id) ?? [];
        if (got.length !== lines.length) problems.push(`${id}: ${got.length} dump lines, expected ${lines.length}`);
        for (let k = 0; k < Math.min(got.length, lines.length); k++) {
            if (got[k] !== lines[k]) problems.push(`${id}: cycle ${k}: got '${got[k]}', expected '${lines[k]}'`);
        }
    }
    return problems;
}

export { mulberry32 };
