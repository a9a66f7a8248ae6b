/**
 * Verilog-2005 (IEEE 1364-2005) and SystemVerilog-2017 (IEEE 1800-2017) modules.
 *
 * behavioral: a state register, a combinational `case` on the state (codes as localparams / an
 * enum with explicit values), outputs as in the model. structural: the synthesized excitation and
 * output equations as continuous assignments, the flip-flops by their characteristic equations.
 * Ports: clock, reset, inputs, outputs in declaration order, then `state` with the state port.
 */
import type { CompareOp, Machine } from '../model/machine.js';
import type { StateAssignment } from '../synthesis/encoding.js';
import type { SynthesisResult } from '../synthesis/types.js';
import { defaultAssignment } from '../simulation/simulator.js';
import {
    type ExportFile, type ExportOptions, NameAllocator, bits, commentBlock, coverProducts, defaultTarget, docLines,
    excitationCover, ffInputNames, guardText, headerLines, mooreValue, outputCover, portNames, variableRefs, zeroCode,
} from './common.js';

export type VerilogDialect = 'verilog' | 'systemverilog';

const range = (w: number, bus = w > 1) => (bus ? `[${w - 1}:0] ` : '');
const literal = (value: number, width: number) => (width === 1 ? `1'b${value & 1}` : `${width}'d${value}`);
const codeLiteral = (code: string) => `${code.length}'b${code}`;

/** Internal names chosen once per module so that no port name is shadowed. */
export interface VerilogNames {
    readonly stateQ: string;
    readonly stateD: string;
    readonly stateType: string;
    readonly unused: string;
    readonly cleared: string;
    readonly codes: readonly string[];
    readonly regNext: readonly string[];
    readonly regQ: readonly string[];
}

export function verilogNames(machine: Machine): VerilogNames {
    const alloc = new NameAllocator(portNames(machine), [machine.name]);
    const stateQ = alloc.take('state_q');
    const stateD = alloc.take('state_d');
    const stateType = alloc.take('state_t');
    const unused = alloc.take('unused_inputs');
    const codes = machine.states.map((s) => alloc.take(s.name));
    const cleared = alloc.take('CLEARED');
    const regNext = machine.outputs.map((o) => alloc.take(`${o.name}_d`));
    const regQ = machine.outputs.map((o) => alloc.take(`${o.name}_q`));
    return { stateQ, stateD, stateType, unused, cleared, codes, regNext, regQ };
}

export function verilogGuard(machine: Machine): Parameters<typeof guardText>[2] {
    const vop = (op: CompareOp) => op;
    return {
        constant: (v) => (v ? "1'b1" : "1'b0"),
        input: (i) => machine.inputs[i]!.name,
        bit: (i, b) => `${machine.inputs[i]!.name}[${b}]`,
        compare: (i, op, v) => `(${machine.inputs[i]!.name} ${vop(op)} ${literal(v, machine.inputs[i]!.width)})`,
        not: (x) => `!(${x})`,
        and: (xs) => `(${xs.join(' && ')})`,
        or: (xs) => `(${xs.join(' || ')})`,
        xor: (xs) => `(${xs.join(' ^ ')})`,
    };
}

function portList(machine: Machine, sv: boolean, statePort: boolean, width: number, outputIsReg: (o: number) => boolean): string[] {
    const net = sv ? 'logic' : 'wire';
    const ports: string[] = [];
    ports.push(`input  ${net} ${machine.clock.name}`);
    if (machine.reset) ports.push(`input  ${net} ${machine.reset.name}`);
    for (const i of machine.inputs) ports.push(`input  ${net} ${range(i.width, i.isBus)}${i.name}`);
    machine.outputs.forEach((o, k) => {
        const kind = sv ? 'logic' : outputIsReg(k) ? 'reg' : 'wire';
        ports.push(`output ${kind} ${range(o.width, o.isBus)}${o.name}`);
    });
    // The state port is always a vector, even one bit wide.
    if (statePort) ports.push(`output ${sv ? 'logic' : 'wire'} [${width - 1}:0] state`);
    return ports.map((p, k) => `    ${p}${k < ports.length - 1 ? ',' : ''}`);
}

function edgeOf(machine: Machine): string {
    return `${machine.clock.edge === 'rising' ? 'posedge' : 'negedge'} ${machine.clock.name}`;
}

/** `always @(…)` sensitivity and the reset condition. */
function registerHead(machine: Machine, sv: boolean): { head: string; cond?: string } {
    const kw = sv ? 'always_ff' : 'always';
    const r = machine.reset;
    if (!r) return { head: `${kw} @(${edgeOf(machine)})` };
    const cond = r.activeHigh ? r.name : `!${r.name}`;
    if (r.async) return { head: `${kw} @(${edgeOf(machine)} or ${r.activeHigh ? 'posedge' : 'negedge'} ${r.name})`, cond };
    return { head: `${kw} @(${edgeOf(machine)})`, cond };
}

function header(machine: Machine, options: ExportOptions, assignment: StateAssignment, dialect: VerilogDialect, style: string): string[] {
    const what = `${dialect === 'verilog' ? 'Verilog-2005' : 'SystemVerilog-2017'} ${style} module`;
    return [
        ...commentBlock('//', headerLines({ machine, what, options, assignment })),
        ...(machine.doc ? ['//', ...commentBlock('//', docLines(machine.doc))] : []),
    ];
}

export function exportVerilog(machine: Machine, options: ExportOptions, dialect: VerilogDialect): ExportFile {
    const style = options.style ?? 'behavioral';
    const assignment = options.assignment ?? options.synthesis?.assignment ?? defaultAssignment(machine);
    const body = style === 'structural'
        ? structuralBody(machine, options, assignment, dialect)
        : behavioralBody(machine, options, assignment, dialect);
    const lines = [...header(machine, options, assignment, dialect, style), ...body, ''];
    return { name: `${machine.name}.${dialect === 'verilog' ? 'v' : 'sv'}`, text: lines.join('\n') };
}

function unusedLine(machine: Machine, names: Pick<VerilogNames, 'unused'>, sv: boolean, extra: readonly string[] = []): string[] {
    // Inputs a guard never reads (or bus bits the equations drop) are still ports; this reduction
    // marks them used on purpose (lint tools ignore signals named *unused*), and synthesis removes it.
    const sigs = ['1\'b0', ...machine.inputs.map((i) => i.name), ...extra, '1\'b0'];
    return [`    ${sv ? 'logic' : 'wire'} ${names.unused};`, `    assign ${names.unused} = &{${sigs.join(', ')}};`];
}

function behavioralBody(machine: Machine, options: ExportOptions, assignment: StateAssignment, dialect: VerilogDialect): string[] {
    const sv = dialect === 'systemverilog';
    const names = verilogNames(machine);
    const w = assignment.width;
    const registered = machine.outputs.map((o) => o.registered);
    const out: string[] = [];
    out.push(`module ${machine.name} (`, ...portList(machine, sv, options.statePort ?? false, w, (k) => !machine.outputs[k]!.registered), ');');
    const zero = zeroCode(assignment);
    const zeroIsState = assignment.codes.includes(zero);
    const codeName = (code: string) => {
        const i = assignment.codes.indexOf(code);
        return i >= 0 ? names.codes[i]! : sv ? names.cleared : codeLiteral(code);
    };
    out.push(`    // State codes (${assignment.encoding}).`);
    if (sv) {
        const members = machine.states.map((s, i) => `${names.codes[i]} = ${codeLiteral(assignment.codes[i]!)}`);
        // A clear reset may load a code that is no state: it gets a name of its own.
        if (machine.reset?.target === 'clear' && !zeroIsState) members.push(`${names.cleared} = ${codeLiteral(zero)}`);
        out.push(`    typedef enum logic [${w - 1}:0] {`, ...members.map((m, k) => `        ${m}${k < members.length - 1 ? ',' : ''}`), `    } ${names.stateType};`);
    } else {
        const params = machine.states.map((s, i) => `${names.codes[i]} = ${codeLiteral(assignment.codes[i]!)}`);
        out.push(`    localparam [${w - 1}:0]`, ...params.map((p, k) => `        ${p}${k < params.length - 1 ? ',' : ';'}`));
    }
    const stateDecl = sv ? names.stateType : `reg [${w - 1}:0]`;
    const initial = typeof machine.reset?.target === 'number' ? machine.reset.target : machine.reset ? undefined : 0;
    // Without a reset, the register starts in the first state (an initial value: FPGA flows honour it).
    out.push(`    ${stateDecl} ${names.stateQ}${machine.reset ? '' : ` = ${names.codes[initial!]}`};`);
    out.push(`    ${stateDecl} ${names.stateD};`);
    out.push(...regDecls(machine, sv, names.regQ, names.regNext, 'reg'));
    out.push('');

    // Next state and combinational outputs.
    const g = verilogGuard(machine);
    out.push(`    // Next state; Moore outputs from the state, Mealy outputs from the state and the inputs.`);
    out.push(`    ${sv ? 'always_comb' : 'always @*'} begin`);
    out.push(`        ${names.stateD} = ${names.stateQ};`);
    machine.outputs.forEach((o, k) => { if (!o.registered) out.push(`        ${o.name} = ${literal(0, o.width)};`); });
    out.push(`        case (${names.stateQ})`);
    machine.states.forEach((s, i) => {
        out.push(...commentBlock('//', docLines(s.doc), '            '));
        out.push(`            ${names.codes[i]}: begin`);
        for (const e of s.emits) {
            if (registered[e.output]) continue;
            const o = machine.outputs[e.output]!;
            out.push(`                ${o.name} = ${literal(e.value, o.width)};`);
        }
        const branch = (target: number, emits: readonly { output: number; value: number }[]) => {
            const lines = [`${names.stateD} = ${names.codes[target]};`];
            for (const e of emits) {
                const o = machine.outputs[e.output]!;
                if (mooreValue(machine, i, e.output) !== undefined) continue;
                lines.push(`${o.name} = ${literal(e.value, o.width)};`);
            }
            return lines;
        };
        let first = true;
        for (const t of s.transitions) {
            out.push(`                ${first ? 'if' : 'else if'} (${guardText(t.guard, machine, g)}) begin`);
            for (const l of branch(t.target, t.emits)) out.push(`                    ${l}`);
            out.push('                end');
            first = false;
        }
        const ow = s.otherwise;
        if (ow?.kind === 'goto') {
            if (first) for (const l of branch(ow.target, ow.emits)) out.push(`                ${l}`);
            else {
                out.push('                else begin');
                for (const l of branch(ow.target, ow.emits)) out.push(`                    ${l}`);
                out.push('                end');
            }
        } else if (ow?.kind === 'dontcare') {
            out.push('                // otherwise dontcare: this export holds the state there');
        }
        out.push('            end');
    });
    const def = defaultTarget(machine, assignment);
    out.push(`            default: begin`);
    out.push(`                // ${machine.recover ? 'unused code: recover' : 'unused code: go to a safe state (no recover declared)'}`);
    out.push(`                ${names.stateD} = ${names.codes[def]};`);
    out.push('            end');
    out.push('        endcase');
    out.push('    end');
    out.push('');

    if (registered.some(Boolean)) {
        out.push('    // Registered outputs load the Moore value of the next state.');
        out.push(`    ${sv ? 'always_comb' : 'always @*'} begin`);
        machine.outputs.forEach((o, k) => { if (o.registered) out.push(`        ${names.regNext[k]} = ${literal(0, o.width)};`); });
        out.push(`        case (${names.stateD})`);
        machine.states.forEach((s, i) => {
            const emits = s.emits.filter((e) => registered[e.output]);
            if (emits.length === 0) return;
            out.push(`            ${names.codes[i]}: begin`);
            for (const e of emits) out.push(`                ${names.regNext[e.output]} = ${literal(e.value, machine.outputs[e.output]!.width)};`);
            out.push('            end');
        });
        out.push(`            default: begin`);
        out.push(`            end`);
        out.push('        endcase');
        out.push('    end');
        out.push('');
    }

    out.push(...registerBlock(machine, assignment, sv, codeName, names.regQ, names.regNext, names.stateQ, names.stateD));
    if (options.statePort) out.push(`    assign state = ${names.stateQ};`);
    out.push(...unusedLine(machine, names, sv));
    out.push('endmodule');
    return out;
}

/** The clocked block: reset exactly as declared, then the state and the registered outputs. */
function registerBlock(
    machine: Machine, assignment: StateAssignment, sv: boolean, codeName: (code: string) => string,
    regQ: readonly string[], regNext: readonly string[], stateQ: string, stateD: string,
): string[] {
    const out: string[] = [];
    const { head, cond } = registerHead(machine, sv);
    const loads = [`${stateQ} <= ${stateD};`];
    machine.outputs.forEach((o, k) => { if (o.registered) loads.push(`${regQ[k]} <= ${regNext[k]};`); });
    out.push(`    ${head} begin`);
    if (cond) {
        const r = machine.reset!;
        const resetCode = typeof r.target === 'number' ? assignment.codes[r.target]! : zeroCode(assignment);
        const resets = [`${stateQ} <= ${codeName(resetCode)};`];
        machine.outputs.forEach((o, k) => {
            if (!o.registered) return;
            // A clear reset clears every flip-flop; a reset to a state loads that state's Moore value.
            const v = typeof r.target === 'number' ? mooreValue(machine, r.target, k) ?? 0 : 0;
            resets.push(`${regQ[k]} <= ${literal(v, o.width)};`);
        });
        out.push(`        if (${cond}) begin`, ...resets.map((l) => `            ${l}`), '        end else begin', ...loads.map((l) => `            ${l}`), '        end');
    } else {
        out.push(...loads.map((l) => `        ${l}`));
    }
    out.push('    end');
    machine.outputs.forEach((o, k) => { if (o.registered) out.push(`    assign ${o.name} = ${regQ[k]};`); });
    return out;
}

/** Registered outputs: the flip-flop (with the first state's Moore value as initial value without a reset) and its D input. */
function regDecls(machine: Machine, sv: boolean, regQ: readonly string[], regNext: readonly string[], dKind: 'reg' | 'wire'): string[] {
    const out: string[] = [];
    machine.outputs.forEach((o, k) => {
        if (!o.registered) return;
        const init = machine.reset ? '' : ` = ${literal(mooreValue(machine, 0, k) ?? 0, o.width)}`;
        out.push(`    ${sv ? 'logic' : 'reg'} ${range(o.width, o.isBus)}${regQ[k]}${init};`);
        out.push(`    ${sv ? 'logic' : dKind} ${range(o.width, o.isBus)}${regNext[k]};`);
    });
    return out;
}

function structuralBody(machine: Machine, options: ExportOptions, assignment: StateAssignment, dialect: VerilogDialect): string[] {
    const synth: SynthesisResult | undefined = options.synthesis;
    if (!synth) throw new Error('structural export needs the synthesis result');
    const sv = dialect === 'systemverilog';
    const net = sv ? 'logic' : 'wire';
    const w = assignment.width;
    const alloc = new NameAllocator(portNames(machine), [machine.name]);
    const stateQ = alloc.take('state_q');
    const stateD = alloc.take('state_d');
    const unused = alloc.take('unused_inputs');
    const regNext = machine.outputs.map((o) => alloc.take(`${o.name}_d`));
    const regQ = machine.outputs.map((o) => alloc.take(`${o.name}_q`));
    const refs = variableRefs(synth, (k, b) => (b === undefined ? machine.inputs[k]!.name : `${machine.inputs[k]!.name}[${b}]`), (i) => `${stateQ}[${i}]`);
    const nvars = refs.length;
    const sop = (cover: Parameters<typeof coverProducts>[0]) => {
        const p = coverProducts(cover, nvars);
        if (p.empty) return "1'b0";
        if (p.one) return "1'b1";
        return p.products.map((lits) => lits.map(([v, pos]) => (pos ? refs[v]! : `~${refs[v]!}`)).join(' & ')).join(' | ');
    };
    const out: string[] = [];
    out.push(`module ${machine.name} (`, ...portList(machine, sv, options.statePort ?? false, w, () => false), ');');
    out.push(`    // State codes (${assignment.encoding}): ${machine.states.map((s, i) => `${s.name} = ${assignment.codes[i]}`).join(', ')}.`);
    for (const s of machine.states) if (s.doc) out.push(...commentBlock('//', docLines(`${s.name}: ${s.doc}`), '    '));
    const initial = typeof machine.reset?.target === 'number' ? machine.reset.target : 0;
    out.push(`    ${sv ? 'logic' : 'reg'} [${w - 1}:0] ${stateQ}${machine.reset ? '' : ` = ${codeLiteral(assignment.codes[initial]!)}`};`);
    out.push(`    ${net} [${w - 1}:0] ${stateD};`);
    out.push(...regDecls(machine, sv, regQ, regNext, 'wire'));
    out.push('');
    out.push(`    // Excitation equations (${synth.flipflop} flip-flops), sums of products over the inputs and ${stateQ}.`);
    const exNames: string[][] = [];
    for (let i = 0; i < w; i++) {
        const ns = ffInputNames(synth.flipflop, i).map((n) => ({ eq: n, hdl: alloc.take(n) }));
        exNames.push(ns.map((n) => n.hdl));
        for (const n of ns) out.push(`    ${net} ${n.hdl};`, `    assign ${n.hdl} = ${sop(excitationCover(synth, n.eq))};`);
    }
    out.push('');
    out.push(`    // Characteristic equations of the flip-flops: the next value of each state bit.`);
    for (let i = 0; i < w; i++) {
        const q = `${stateQ}[${i}]`;
        const [a, b] = exNames[i]!;
        switch (synth.flipflop) {
            case 'D': out.push(`    assign ${stateD}[${i}] = ${a};`); break;
            case 'T': out.push(`    assign ${stateD}[${i}] = ${a} ^ ${q};  // T: toggle when ${a} = 1`); break;
            case 'JK': out.push(`    assign ${stateD}[${i}] = (${a} & ~${q}) | (~${b} & ${q});  // JK: set, reset, toggle, hold`); break;
            case 'SR': out.push(`    assign ${stateD}[${i}] = ${a} | (~${b} & ${q});  // SR: set when s = 1, reset when r = 1 (never both)`); break;
        }
    }
    out.push('');
    out.push('    // Output equations.');
    machine.outputs.forEach((o, k) => {
        const target = o.registered ? regNext[k]! : o.name;
        for (let b = 0; b < o.width; b++) out.push(`    assign ${target}${o.isBus ? `[${b}]` : ''} = ${sop(outputCover(synth, k, b))};`);
    });
    out.push('');
    const zero = zeroCode(assignment);
    out.push(...registerBlock(machine, assignment, sv, (code) => (code === zero ? `{${w}{1'b0}}` : codeLiteral(code)), regQ, regNext, stateQ, stateD));
    if (options.statePort) out.push(`    assign state = ${stateQ};`);
    out.push(...unusedLine(machine, { unused }, sv, [stateQ]));
    out.push('endmodule');
    return out;
}

export { bits };
