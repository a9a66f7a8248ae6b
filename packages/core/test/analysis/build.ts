/**
 * A small builder of core machine models for hand-written analysis tests (no parser package):
 * guards are written in Detent syntax and parsed by the little recursive-descent reader below;
 * every element gets a distinct synthetic range so tests can check ranges exactly.
 */
import type { CompareOp, EncodingKind, Emit, Guard, Input, Machine, Otherwise, Output, Reset, SourceRange, State, Transition } from '../../src/model/machine.js';

let line = 1000;
export function freshRange(): SourceRange {
    const l = line++;
    return { start: { line: l, character: 4 }, end: { line: l, character: 12 } };
}

export interface TransitionSpec { readonly when: string; readonly to: string; readonly emit?: readonly string[] }
export interface StateSpec {
    readonly name: string;
    readonly priority?: boolean;
    readonly emit?: readonly string[];
    readonly when?: readonly TransitionSpec[];
    /** `stay`, `dontcare`, or a goto `{ to, emit }`. */
    readonly otherwise?: 'stay' | 'dontcare' | { readonly to: string; readonly emit?: readonly string[] };
    readonly code?: string;
}
export interface MachineSpec {
    readonly name?: string;
    /** `a` for a bit, `level:4` for a bus. */
    readonly inputs?: readonly string[];
    readonly outputs?: readonly string[];
    /** `-> S` target name, or 'clear'. */
    readonly reset?: string | 'clear';
    readonly encoding?: EncodingKind;
    readonly recover?: string;
    readonly states: readonly StateSpec[];
}

function parseGuard(text: string, inputs: readonly Input[]): Guard {
    const tokens = text.match(/\s*(==|!=|<=|>=|[!&^|()<>[\]]|\d+|[A-Za-z_]\w*)/g)?.map((t) => t.trim()) ?? [];
    let pos = 0;
    const peek = () => tokens[pos];
    const take = (want?: string) => {
        const t = tokens[pos++];
        if (want !== undefined && t !== want) throw new Error(`guard '${text}': expected ${want}, got ${t}`);
        return t!;
    };
    const inputIndex = (name: string) => {
        const i = inputs.findIndex((x) => x.name === name);
        if (i < 0) throw new Error(`guard '${text}': unknown input ${name}`);
        return i;
    };
    const binary = (kind: 'or' | 'xor' | 'and', op: string, next: () => Guard) => (): Guard => {
        const first = next();
        if (peek() !== op) return first;
        const operands = [first];
        while (peek() === op) { take(); operands.push(next()); }
        return { kind, operands, range: freshRange() };
    };
    const primary = (): Guard => {
        const t = take();
        if (t === '(') { const g = or(); take(')'); return g; }
        if (t === '!') return { kind: 'not', operand: primary(), range: freshRange() };
        if (t === '0' || t === '1') return { kind: 'const', value: t === '1', range: freshRange() };
        const input = inputIndex(t);
        if (peek() === '[') { take(); const bit = Number(take()); take(']'); return { kind: 'bit', input, bit, range: freshRange() }; }
        if (['==', '!=', '<', '<=', '>', '>='].includes(peek() ?? '')) {
            const op = take() as CompareOp;
            return { kind: 'compare', input, op, value: Number(take()), range: freshRange() };
        }
        return { kind: 'input', input, range: freshRange() };
    };
    const and = binary('and', '&', primary);
    const xor = binary('xor', '^', and);
    const or: () => Guard = binary('or', '|', xor);
    const g = or();
    if (pos !== tokens.length) throw new Error(`guard '${text}': trailing ${tokens[pos]}`);
    return g;
}

export function build(spec: MachineSpec): Machine {
    const inputs: Input[] = (spec.inputs ?? []).map((d) => {
        const [name, w] = d.split(':');
        return { name: name!, width: w ? Number(w) : 1, isBus: w !== undefined, async: false, range: freshRange(), nameRange: freshRange() };
    });
    const outputs: Output[] = (spec.outputs ?? []).map((d) => {
        const [name, w] = d.split(':');
        return { name: name!, width: w ? Number(w) : 1, isBus: w !== undefined, registered: false, range: freshRange(), nameRange: freshRange() };
    });
    const stateIndex = (name: string) => {
        const i = spec.states.findIndex((s) => s.name === name);
        if (i < 0) throw new Error(`unknown state ${name}`);
        return i;
    };
    const emits = (list: readonly string[] | undefined): Emit[] => (list ?? []).map((e) => {
        const [name, v] = e.split('=').map((x) => x.trim());
        const output = outputs.findIndex((o) => o.name === name);
        if (output < 0) throw new Error(`unknown output ${name}`);
        return { output, value: v === undefined ? 1 : Number(v), range: freshRange() };
    });
    const states: State[] = spec.states.map((s, index) => {
        const transitions: Transition[] = (s.when ?? []).map((t) => ({
            guard: parseGuard(t.when, inputs), target: stateIndex(t.to), emits: emits(t.emit), range: freshRange(), targetRange: freshRange(),
        }));
        let otherwise: Otherwise | undefined;
        if (s.otherwise === 'stay' || s.otherwise === 'dontcare') otherwise = { kind: s.otherwise, range: freshRange() };
        else if (s.otherwise) otherwise = { kind: 'goto', target: stateIndex(s.otherwise.to), emits: emits(s.otherwise.emit), range: freshRange(), targetRange: freshRange() };
        return {
            name: s.name, index, priority: s.priority ?? false, emits: emits(s.emit), transitions, otherwise,
            code: s.code ? { bits: s.code, range: freshRange() } : undefined, range: freshRange(), nameRange: freshRange(),
        };
    });
    const reset: Reset | undefined = spec.reset === undefined ? undefined : {
        name: 'rst', activeHigh: true, async: false, target: spec.reset === 'clear' ? 'clear' : stateIndex(spec.reset), range: freshRange(), nameRange: freshRange(),
    };
    return {
        name: spec.name ?? 'Test', clock: { name: 'clk', edge: 'rising', range: freshRange() }, reset, inputs, outputs, states,
        encoding: spec.encoding ?? 'binary', encodingRange: freshRange(), flipflop: 'D', flipflopRange: freshRange(),
        recover: spec.recover ? { target: stateIndex(spec.recover), range: freshRange() } : undefined,
        scenarios: [], range: freshRange(), nameRange: freshRange(),
    };
}
