/**
 * Yosys proves the structural export (synthesized equations + flip-flop characteristic
 * equations) equivalent to the behavioral export (case on the state), for every example and 40
 * seeded random machines (with `otherwise dontcare`, every encoding and flip-flop type).
 *
 * What is proven (docs/decisions.md): a miter of the two modules, after one reset clock (or from
 * the initial values when there is no reset), has equal `state` and equal outputs in every
 * cycle of every trace that stays in the care space — the state is a used code (any code with
 * `recover`) and, in a state with `otherwise dontcare`, some guard is true. Method:
 * `sat -tempinduct -prove trigger 0 -set-assumes` (temporal induction, Yosys manual "sat").
 * Mutated machines (one output's Moore value flipped in every state) must fail the same proof.
 */
import { describe, expect, it, beforeAll } from 'vitest';
import { type Guard, type Machine, exportMachine, synthesize } from '@detent/core';
import { type CorpusMachine, exampleMachines, randomCorpus, run, scratchDir, toolsAvailable } from './support.js';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';

/** Guard → Verilog, written here independently of the exporter (LANGUAGE.md guard semantics). */
function vGuard(g: Guard, m: Machine): string {
    switch (g.kind) {
        case 'const': return g.value ? "1'b1" : "1'b0";
        case 'input': return `in_${m.inputs[g.input]!.name}`;
        case 'bit': return `in_${m.inputs[g.input]!.name}[${g.bit}]`;
        case 'compare': return `({1'b0, in_${m.inputs[g.input]!.name}} ${g.op} 32'd${g.value})`;
        case 'not': return `!(${vGuard(g.operand, m)})`;
        case 'and': return `(${g.operands.map((o) => vGuard(o, m)).join(' && ')})`;
        case 'or': return `(${g.operands.map((o) => vGuard(o, m)).join(' || ')})`;
        case 'xor': return `(${g.operands.map((o) => `(${vGuard(o, m)} ? 1'b1 : 1'b0)`).join(' ^ ')})`;
    }
}

function miter(c: CorpusMachine): string {
    const m = c.machine;
    const w = c.synth.assignment.width;
    const codes = c.synth.assignment.codes;
    const vec = (n: number, bus: boolean) => (bus ? `[${n - 1}:0] ` : '');
    const ports = ['input clk', ...(m.reset ? ['input rst'] : []), ...m.inputs.map((i) => `input ${vec(i.width, i.isBus)}in_${i.name}`), 'output trigger'];
    const L = ['module miter(' + ports.join(', ') + ');'];
    for (const side of ['g', 't']) {
        m.outputs.forEach((o, k) => L.push(`    wire ${vec(o.width, o.isBus)}${side}_o${k};`));
        L.push(`    wire [${w - 1}:0] ${side}_st;`);
        const conns = ['clk', ...(m.reset ? ['rst'] : []), ...m.inputs.map((i) => `in_${i.name}`), ...m.outputs.map((_, k) => `${side}_o${k}`), `${side}_st`];
        L.push(`    ${side === 'g' ? 'gold' : 'gate'} u_${side} (${conns.join(', ')});`);
    }
    const diffs = ['(g_st != t_st)', ...m.outputs.map((_, k) => `(g_o${k} != t_o${k})`)];
    L.push(`    assign trigger = ${diffs.join(' || ')};`);
    const valid = m.recover ? "1'b1" : codes.map((code) => `(g_st == ${w}'b${code})`).join(' || ');
    const care = m.states.map((s, i) => {
        if (s.otherwise?.kind !== 'dontcare') return "1'b1";
        const any = s.transitions.length ? s.transitions.map((t) => vGuard(t.guard, m)).join(' || ') : "1'b0";
        return `((g_st != ${w}'b${codes[i]}) || ${any})`;
    });
    L.push(`    wire care = (${valid}) && ${care.join(' && ')};`);
    L.push('    always @* assume(care);', 'endmodule', '');
    return L.join('\n');
}

async function prove(c: CorpusMachine, dir: string, gate: CorpusMachine = c): Promise<{ ok: boolean; log: string }> {
    const opts = (x: CorpusMachine, style: 'behavioral' | 'structural') => ({ style, statePort: true, sourceName: 'x.detent', sourceText: '', assignment: x.synth.assignment, synthesis: x.synth });
    const [gold] = exportMachine(c.machine, 'verilog', opts(c, 'behavioral'));
    const [gateFile] = exportMachine(gate.machine, 'verilog', opts(gate, 'structural'));
    const name = c.machine.name;
    writeFileSync(join(dir, `${name}_gold.v`), gold!.text);
    writeFileSync(join(dir, `${name}_gate.v`), gateFile!.text);
    writeFileSync(join(dir, `${name}_miter.v`), miter(c));
    const r = c.machine.reset;
    const resetAt = r ? ` -set-at 1 rst ${r.activeHigh ? 1 : 0}` : '';
    const script = [
        `read_verilog ${name}_gold.v`, `rename ${name} gold`,
        `read_verilog ${name}_gate.v`, `rename ${name} gate`,
        `read_verilog -formal ${name}_miter.v`,
        'hierarchy -top miter', 'proc', 'flatten', 'async2sync', 'opt_clean',
        `sat -tempinduct -prove trigger 0 -set-assumes -seq 1${resetAt} -maxsteps 30 -verify -show-ports miter`,
    ].join('; ');
    const res = await run('yosys', ['-q', '-p', script], dir);
    return { ok: res.code === 0, log: res.stdout + res.stderr };
}

describe.runIf(toolsAvailable(['yosys']))('Yosys proves structural ≡ behavioral on the care space', () => {
    let corpus: CorpusMachine[] = [];
    beforeAll(() => {
        corpus = [...exampleMachines().map((e) => ({ machine: e.machine, synth: e.synth })), ...randomCorpus(40, 31337, 'E', true)];
    }, 120_000);

    it('every example and 40 random machines', async () => {
        const dir = scratchDir('equiv');
        const results = await Promise.all(corpus.map(async (c) => ({ name: c.machine.name, ...(await prove(c, dir)) })));
        const failed = results.filter((r) => !r.ok);
        process.stdout.write(`equivalence: ${results.length} machines proven, ${failed.length} failed\n`);
        expect(failed.map((f) => `${f.name}: ${f.log.slice(-1500)}`)).toEqual([]);
    }, 900_000);

    it('mutated machines fail the proof (the check can fail), with and without a reset', async () => {
        const dir = scratchDir('equiv-neg');
        const fit = (c: CorpusMachine) => c.machine.outputs.some((o) => !o.registered && !o.isBus) && c.machine.states.length > 1 && c.synth.assignment.encoding !== 'auto';
        const bases = [corpus.find((c) => fit(c) && c.machine.reset), corpus.find((c) => fit(c) && !c.machine.reset)];
        for (const base of bases) {
            if (!base) throw new Error('no machine to mutate');
            const out = base.machine.outputs.findIndex((o) => !o.registered && !o.isBus);
            // State 0 is the reset target or the power-up state of most machines; flip its Moore value.
            const states = base.machine.states.map((s) => ({
                ...s, emits: s.emits.some((e) => e.output === out) ? s.emits.map((e) => (e.output === out ? { ...e, value: 1 - e.value } : e)) : [...s.emits, { output: out, value: 1, range: s.range }],
            }));
            const mutated: Machine = { ...base.machine, states };
            const mutant = { machine: mutated, synth: synthesize(mutated) };
            expect(mutant.synth.assignment.codes).toEqual(base.synth.assignment.codes);
            const r = await prove(base, dir, mutant);
            expect(r.log).toMatch(/proof did fail/);
            expect(r.ok).toBe(false);
        }
    }, 300_000);
});
