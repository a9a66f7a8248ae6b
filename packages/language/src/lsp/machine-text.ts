/**
 * Editor-facing text about one machine, as pure functions of core results (so they are testable
 * without a server): hover Markdown for states, the Equations document, the cost lens title,
 * the encoding comparison table. No analysis happens here — only wording and layout.
 */
import {
    type BehaviourTable, type Cost, type Machine, type SynthesisResult, type Witness,
    coverText, equationText, minimize, karnaughMap, renderKarnaughMap, restrictToCode, KMAP_MAX_VARIABLES, supportOf,
} from '@detent/core';

export const SAFETY_CAUTION = 'Detent checks logic, not safety certification; defer to the applicable codes and licensed practice.';

export function plural(n: number, one: string, many = `${one}s`): string {
    return `${n} ${n === 1 ? one : many}`;
}

/** `3 flip-flops · 12 literals · 18 gate inputs (binary, D)`. */
export function costTitle(cost: Cost, encoding: string, flipflop: string): string {
    return `${plural(cost.flipflops, 'flip-flop')} · ${plural(cost.literals, 'literal')} · ${plural(cost.gateInputs, 'gate input')} (${encoding}, ${flipflop})`;
}

function variablesOf(result: SynthesisResult): { variables: readonly string[]; inputCount: number } {
    return { variables: result.variables, inputCount: result.inputCount };
}

/** Output values of one next-state-table row that differ from 0: `alarm`, `speed = 2`. */
function rowOutputs(table: BehaviourTable, values: readonly (0 | 1 | 'x')[], mealyOnly: boolean): string[] {
    const machine = table.machine;
    const texts: string[] = [];
    machine.outputs.forEach((output, index) => {
        const bits = table.outputBits.map((b, k) => ({ b, v: values[k] })).filter((x) => x.b.output === index);
        if (bits.length === 0 || (mealyOnly && !bits[0]!.b.mealy)) return;
        if (bits.some((x) => x.v === 'x')) { texts.push(`${output.name} = -`); return; }
        const value = bits.reduce((acc, x) => acc + (x.v === 1 ? 2 ** x.b.bit : 0), 0);
        if (value === 0) return;
        texts.push(output.isBus ? `${output.name} = ${value}` : output.name);
    });
    return texts;
}

/** Rows of one state's next-state table: `overload → Fault / alarm`. */
export function nextStateRows(table: BehaviourTable, stateIndex: number): string[] {
    const machine = table.machine;
    const behaviour = table.states[stateIndex];
    if (!behaviour) return [];
    const vars = { variables: table.inputNames, inputCount: table.inputCount };
    const nvars = table.inputCount;
    return behaviour.pieces.map((piece) => {
        // The piece is a correct but unminimized cover: show its minimal sum for reading.
        const region = coverText(minimize(piece.inputs, [], nvars, { budgetMs: 20 }).cover, vars, 'textbook');
        const target = piece.target === 'x' ? "don't care" : piece.target === stateIndex ? `${machine.states[piece.target]!.name} (hold)` : machine.states[piece.target]!.name;
        const outputs = rowOutputs(table, piece.outputs, true);
        return `${region} → ${target}${outputs.length ? ` / ${outputs.join(', ')}` : ''}`;
    });
}

/** Each excitation equation restricted to the state's code: `t1 = overload + low_float'`. */
export function excitationSlice(result: SynthesisResult, stateIndex: number): string[] {
    const code = result.assignment.codes[stateIndex];
    if (code === undefined) return [];
    const vars = variablesOf(result);
    return result.equations
        .filter((e) => e.role === 'excitation')
        .map((e) => equationText(e.name, restrictToCode(e.cover, code, vars), vars, 'textbook'));
}

export interface StateHoverInput {
    readonly machine: Machine;
    readonly stateIndex: number;
    readonly synthesis?: SynthesisResult;
    readonly table?: BehaviourTable;
    /** Why synthesis is missing (errors in the machine, too large, …). */
    readonly synthesisNote?: string;
}

export function stateHoverMarkdown(input: StateHoverInput): string {
    const { machine, stateIndex, synthesis, table } = input;
    const state = machine.states[stateIndex]!;
    const parts: string[] = [];
    const code = synthesis?.assignment.codes[stateIndex];
    const head = `**state ${state.name}**${state.priority ? ' (priority)' : ''}`;
    parts.push(code !== undefined ? `${head} — code \`${code}\` (${synthesis!.assignment.encoding}, ${synthesis!.flipflop} flip-flops)` : head);
    if (state.doc) parts.push(state.doc);
    const moore = table ? rowOutputs(table, table.states[stateIndex]?.moore ?? [], false).filter((t) => {
        const name = t.split(' ')[0]!;
        const index = machine.outputs.findIndex((o) => o.name === name);
        return index >= 0 && !table.outputBits.find((b) => b.output === index)?.mealy;
    }) : [];
    if (moore.length) parts.push(`Moore outputs: ${moore.map((m) => `\`${m}\``).join(', ')}`);
    if (table) {
        const rows = nextStateRows(table, stateIndex);
        if (rows.length) parts.push(['Next state (inputs → next / Mealy outputs):', '```', ...rows, '```'].join('\n'));
    }
    if (synthesis) {
        const slice = excitationSlice(synthesis, stateIndex);
        if (slice.length) parts.push([`Excitation in this state (q = ${code}):`, '```', ...slice, '```'].join('\n'));
    } else if (input.synthesisNote) {
        parts.push(`_${input.synthesisNote}_`);
    }
    parts.push(`_${SAFETY_CAUTION}_`);
    return parts.join('\n\n');
}

/** Hover on a machine's name: its documentation, size, codes and cost under the active encoding. */
export function machineHoverMarkdown(machine: Machine, synthesis: SynthesisResult | undefined, note?: string): string {
    const parts = [`**machine ${machine.name}** — ${plural(machine.states.length, 'state')}, ${plural(machine.inputs.length, 'input')}, ${plural(machine.outputs.length, 'output')}, ${plural(machine.scenarios.length, 'scenario')}`];
    if (machine.doc) parts.push(machine.doc);
    if (synthesis) {
        parts.push(costTitle(synthesis.cost, synthesis.assignment.encoding, synthesis.flipflop));
        parts.push(`Codes: ${machine.states.map((s, i) => `${s.name} \`${synthesis.assignment.codes[i]}\``).join(', ')}`);
    } else if (note) {
        parts.push(`_${note}_`);
    }
    parts.push(`_${SAFETY_CAUTION}_`);
    return parts.join('\n\n');
}

/** A witness in words: `level = 3, overload = 1`, a path `Idle → Pumping`, a lock-up cycle. */
export function witnessText(witness: Witness | undefined): string | undefined {
    if (!witness) return undefined;
    const parts: string[] = [];
    if (witness.inputs) {
        const entries = Object.entries(witness.inputs);
        parts.push(entries.length ? `inputs ${entries.map(([k, v]) => `${k} = ${v}`).join(', ')}` : 'every input 0');
    }
    if (witness.state) parts.push(`in state ${witness.state}`);
    if (witness.path) parts.push(`path ${witness.path.join(' → ')}`);
    if (witness.cycle) {
        parts.push(`cycle ${witness.cycle.map((c) => {
            const inputs = Object.entries(c.inputs);
            return `${c.code}${inputs.length ? ` (${inputs.map(([k, v]) => `${k} = ${v}`).join(', ')})` : ''}`;
        }).join(' → ')} → ${witness.cycle[0]?.code ?? ''}`);
    }
    return parts.length ? parts.join('; ') : undefined;
}

/** The read-only Equations document: codes, equations in both notations, cost, Karnaugh maps. */
export function equationsDocument(result: SynthesisResult): string {
    const machine = result.machine;
    const vars = variablesOf(result);
    const lines: string[] = [];
    lines.push(`Machine ${machine.name} — ${result.assignment.encoding} encoding, ${result.flipflop} flip-flops`);
    lines.push(`${SAFETY_CAUTION}`);
    lines.push('');
    if (result.assignment.note) { lines.push(result.assignment.note); lines.push(''); }
    lines.push(`State codes (q${result.assignment.width - 1} … q0):`);
    const nameWidth = Math.max(...machine.states.map((s) => s.name.length));
    machine.states.forEach((s, i) => lines.push(`  ${s.name.padEnd(nameWidth)}  ${result.assignment.codes[i]}`));
    lines.push('');
    lines.push('Equations (textbook):');
    for (const e of result.equations) lines.push(`  ${equationText(e.name, e.cover, vars, 'textbook')}`);
    lines.push('');
    lines.push('Equations (HDL):');
    for (const e of result.equations) lines.push(`  ${equationText(e.name, e.cover, vars, 'hdl')};`);
    lines.push('');
    const c = result.cost;
    lines.push(`Cost: ${plural(c.flipflops, 'flip-flop')}, ${plural(c.literals, 'literal')}, ${plural(c.gateInputs, 'gate input')}, ${plural(c.products, 'product')}, largest fan-in ${c.maxFanIn}`);
    const inexact = result.equations.filter((e) => !e.exact).map((e) => e.name);
    if (inexact.length) lines.push(`Not proven minimal (heuristic): ${inexact.join(', ')}`);
    lines.push('');
    lines.push(`Karnaugh maps (equations of at most ${KMAP_MAX_VARIABLES} variables; letters mark the chosen products, - marks don't-cares):`);
    for (const e of result.equations) {
        const support = supportOf([e.cover], vars.variables.length);
        if (support.size === 0) { lines.push('', `${e.name} = ${coverText(e.cover, vars, 'textbook')} (constant)`); continue; }
        // The function's ON-set and don't-cares over the cover's variables, the cover's products as groups.
        const map = e.onSet ? karnaughMap(e.onSet, vars, { dc: e.dontCare ?? [], groups: e.cover, drawn: [e.cover] }) : karnaughMap(e.cover, vars);
        if (!map) { lines.push('', `${e.name}: ${support.size} variables — no map`); continue; }
        lines.push('', `${e.name}:`, renderKarnaughMap(map, vars).trimEnd());
    }
    return lines.join('\n') + '\n';
}

export interface CompareRow {
    readonly encoding: string;
    readonly flipflop: string;
    readonly cost?: Cost;
    /** Marked by the comparison itself (core compareEncodings); computed here when absent. */
    readonly best?: boolean;
    readonly note?: string;
}

/** The encoding × flip-flop table as Markdown, the cheapest row (gate inputs, then literals, then flip-flops) marked. */
export function compareMarkdown(machineName: string, rows: readonly CompareRow[]): string {
    const priced = rows.filter((r) => r.cost);
    const key = (c: Cost) => [c.gateInputs, c.literals, c.flipflops];
    let best: CompareRow | undefined;
    for (const r of priced) {
        if (!best) { best = r; continue; }
        const a = key(r.cost!);
        const b = key(best.cost!);
        for (let i = 0; i < a.length; i++) {
            if (a[i]! < b[i]!) { best = r; break; }
            if (a[i]! > b[i]!) break;
        }
    }
    const lines = [
        `### ${machineName}: encoding × flip-flop`,
        '',
        '| encoding | flip-flop | flip-flops | literals | gate inputs | |',
        '|---|---|---:|---:|---:|---|',
    ];
    const marked = rows.some((r) => r.best !== undefined);
    for (const r of rows) {
        const c = r.cost;
        const isBest = marked ? r.best === true : r === best;
        const note = (r.note ?? '').replace(/\|/g, '\\|').replace(/\n/g, ' ');
        lines.push(`| ${r.encoding} | ${r.flipflop} | ${c ? c.flipflops : '–'} | ${c ? c.literals : '–'} | ${c ? c.gateInputs : '–'} | ${isBest ? '**best** ' : ''}${note} |`);
    }
    lines.push('', `_${SAFETY_CAUTION}_`);
    return lines.join('\n');
}
