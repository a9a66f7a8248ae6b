/**
 * Stimulus files for `detent sim` (format in docs/stimulus.md): one line per clock,
 * `name=value …` with input names, `reset=1` (asserted, whatever the level) or the reset's own
 * name at its pin level, values decimal / 0b / 0x; `* N` at the end repeats the line N times;
 * `-` alone is one clock with every input 0; `#` starts a comment; blank lines are ignored.
 * Inputs a line does not name are 0 and the reset is not asserted (as in a scenario `step`).
 */
import type { Machine } from '../model/machine.js';
import { type SimState, type SimulatorOptions, createSimulator } from './simulator.js';

export interface StimulusCycle {
    /** By input index. */
    readonly inputs: readonly number[];
    readonly reset: boolean;
    /** 1-based line of the stimulus file. */
    readonly line: number;
}

export class StimulusError extends Error {
    constructor(readonly line: number, message: string) {
        super(`line ${line}: ${message}`);
    }
}

const MAX_REPEAT = 1_000_000;

export function parseNumber(text: string): number | undefined {
    let v: number;
    if (/^0[bB][01]+$/.test(text)) v = parseInt(text.slice(2), 2);
    else if (/^0[xX][0-9a-fA-F]+$/.test(text)) v = parseInt(text.slice(2), 16);
    else if (/^[0-9]+$/.test(text)) v = parseInt(text, 10);
    else return undefined;
    return Number.isSafeInteger(v) ? v : undefined;
}

export function parseStimulus(machine: Machine, text: string): StimulusCycle[] {
    const cycles: StimulusCycle[] = [];
    const lines = text.split(/\r?\n/);
    let total = 0;
    lines.forEach((raw, idx) => {
        const line = idx + 1;
        const body = raw.replace(/#.*$/, '').trim();
        if (body === '') return;
        let repeat = 1;
        let rest = body;
        const rep = /\*\s*(\S+)\s*$/.exec(rest);
        if (rep) {
            const n = parseNumber(rep[1]!);
            if (n === undefined || n < 1) throw new StimulusError(line, `'* ${rep[1]}' needs a positive count`);
            repeat = n;
            rest = rest.slice(0, rep.index).trim();
        }
        const inputs = machine.inputs.map(() => 0);
        let reset = false;
        const seen = new Set<string>();
        const tokens = rest === '-' ? [] : rest.split(/[\s,]+/).filter((t) => t !== '');
        if (tokens.length === 0 && rest !== '-' && !rep) throw new StimulusError(line, 'empty clock line (write - for all inputs 0)');
        for (const tok of tokens) {
            const m = /^([A-Za-z_][A-Za-z0-9_]*)(?:=(\S+))?$/.exec(tok);
            if (!m) throw new StimulusError(line, `cannot read '${tok}' (write name=value)`);
            const name = m[1]!;
            const value = m[2] === undefined ? 1 : parseNumber(m[2]);
            if (value === undefined) throw new StimulusError(line, `'${m[2]}' is not a number (decimal, 0b…, 0x…)`);
            if (seen.has(name)) throw new StimulusError(line, `'${name}' given twice`);
            seen.add(name);
            const r = machine.reset;
            const index = machine.inputs.findIndex((i) => i.name === name);
            if (index >= 0) {
                const width = machine.inputs[index]!.width;
                if (value >= 2 ** width) throw new StimulusError(line, `${value} does not fit input '${name}' (${width} bit${width > 1 ? 's' : ''})`);
                inputs[index] = value;
            } else if (r && name === r.name) {
                if (value > 1) throw new StimulusError(line, `reset '${name}' is 1 bit`);
                reset = (value === 1) === r.activeHigh;
            } else if (name === 'reset') {
                if (!r) throw new StimulusError(line, `machine ${machine.name} has no reset`);
                if (value > 1) throw new StimulusError(line, 'reset is 0 or 1 (1 = asserted)');
                reset = value === 1;
            } else {
                const names = [...machine.inputs.map((i) => i.name), ...(r ? [r.name, 'reset'] : [])];
                throw new StimulusError(line, `unknown name '${name}' (inputs: ${names.join(', ') || 'none'})`);
            }
        }
        total += repeat;
        if (total > MAX_REPEAT) throw new StimulusError(line, `more than ${MAX_REPEAT} clocks`);
        for (let n = 0; n < repeat; n++) cycles.push({ inputs, reset, line });
    });
    return cycles;
}

export interface TraceRow {
    /** 1-based cycle number (the edge that ended it). */
    readonly cycle: number;
    readonly inputs: readonly number[];
    readonly reset: boolean;
    /** After the edge. */
    readonly state: SimState;
    readonly outputs: readonly number[];
    /**
     * Between the input change and the edge: the state (already the reset state while an
     * asynchronous reset is asserted) and the outputs with this cycle's inputs.
     */
    readonly before: { readonly state: SimState; readonly outputs: readonly number[] };
}

export interface Trace {
    readonly initial: SimState;
    readonly initialOutputs: readonly number[];
    readonly rows: readonly TraceRow[];
}

export function simulate(machine: Machine, stimulus: readonly StimulusCycle[], options: SimulatorOptions = {}): Trace {
    const sim = createSimulator(machine, options);
    const initial = sim.initial();
    const zero = machine.inputs.map(() => 0);
    const rows: TraceRow[] = [];
    let st = initial;
    stimulus.forEach((c, i) => {
        const pre = c.reset && machine.reset?.async ? sim.resetState() : st;
        const before = { state: pre, outputs: sim.outputs(pre, c.inputs) };
        const r = sim.cycle(st, c.inputs, c.reset);
        st = r.state;
        rows.push({ cycle: i + 1, inputs: c.inputs, reset: c.reset, state: r.state, outputs: r.outputs, before });
    });
    return { initial, initialOutputs: sim.outputs(initial, zero), rows };
}

/** The cycle table `detent sim` prints. */
export function traceTable(machine: Machine, trace: Trace): string {
    const head = ['cycle', ...(machine.reset ? ['reset'] : []), ...machine.inputs.map((i) => i.name), 'state', ...machine.outputs.map((o) => o.name)];
    const rows = trace.rows.map((r) => [
        String(r.cycle),
        ...(machine.reset ? [r.reset ? '1' : '0'] : []),
        ...r.inputs.map(String),
        r.state.state === null ? `<${r.state.code}>` : machine.states[r.state.state]!.name,
        ...r.outputs.map(String),
    ]);
    const widths = head.map((h, k) => Math.max(h.length, ...rows.map((r) => r[k]!.length)));
    const fmt = (cells: readonly string[]) => cells.map((c, k) => c.padEnd(widths[k]!)).join('  ').trimEnd();
    return [fmt(head), ...rows.map(fmt)].join('\n') + '\n';
}
