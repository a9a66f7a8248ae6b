/**
 * VHDL-2008 (IEEE 1076-2008) entity + architecture; std_logic / std_logic_vector ports.
 * behavioral: codes as constants, a `case` on the state register in a `process (all)`.
 * structural: the synthesized equations and the flip-flops' characteristic equations.
 */
import type { CompareOp, Machine } from '../model/machine.js';
import type { StateAssignment } from '../synthesis/encoding.js';
import { defaultAssignment } from '../simulation/simulator.js';
import {
    type ExportFile, type ExportOptions, NameAllocator, bits, commentBlock, coverProducts, defaultTarget, docLines,
    excitationCover, ffInputNames, guardText, headerLines, mooreValue, outputCover, portNames, variableRefs, zeroCode,
} from './common.js';

const vtype = (w: number, bus: boolean) => (bus ? `std_logic_vector(${w - 1} downto 0)` : 'std_logic');
/** A value of an output/port as a VHDL literal of its type. */
export const vhdlValue = (value: number, width: number, bus: boolean) => (bus ? `"${bits(value, width)}"` : `'${value & 1}'`);

const VHDL_OP: Readonly<Record<CompareOp, string>> = { '==': '=', '!=': '/=', '<': '<', '<=': '<=', '>': '>', '>=': '>=' };

export function vhdlGuard(machine: Machine): Parameters<typeof guardText>[2] {
    return {
        constant: (v) => (v ? 'true' : 'false'),
        input: (i) => `(${machine.inputs[i]!.name} = '1')`,
        bit: (i, b) => `(${machine.inputs[i]!.name}(${b}) = '1')`,
        compare: (i, op, v) => `(unsigned(${machine.inputs[i]!.name}) ${VHDL_OP[op]} ${v})`,
        not: (x) => `(not ${x})`,
        // VHDL needs parentheses whenever and/or/xor mix: every operation is parenthesized.
        and: (xs) => `(${xs.join(' and ')})`,
        or: (xs) => `(${xs.join(' or ')})`,
        xor: (xs) => `(${xs.join(' xor ')})`,
    };
}

function entity(machine: Machine, statePort: boolean, width: number): string[] {
    const ports: string[] = [];
    ports.push(`${machine.clock.name} : in std_logic`);
    if (machine.reset) ports.push(`${machine.reset.name} : in std_logic`);
    for (const i of machine.inputs) ports.push(`${i.name} : in ${vtype(i.width, i.isBus)}`);
    for (const o of machine.outputs) ports.push(`${o.name} : out ${vtype(o.width, o.isBus)}`);
    if (statePort) ports.push(`state : out std_logic_vector(${width - 1} downto 0)`);
    const out = ['library ieee;', 'use ieee.std_logic_1164.all;', 'use ieee.numeric_std.all;', '', `entity ${machine.name} is`];
    if (ports.length) out.push('    port (', ...ports.map((p, k) => `        ${p}${k < ports.length - 1 ? ';' : ''}`), '    );');
    out.push(`end entity ${machine.name};`, '');
    return out;
}

function header(machine: Machine, options: ExportOptions, assignment: StateAssignment, style: string): string[] {
    return [
        ...commentBlock('--', headerLines({ machine, what: `VHDL-2008 ${style} entity`, options, assignment })),
        ...(machine.doc ? ['--', ...commentBlock('--', docLines(machine.doc))] : []),
    ];
}

export function exportVhdl(machine: Machine, options: ExportOptions): ExportFile {
    const style = options.style ?? 'behavioral';
    const assignment = options.assignment ?? options.synthesis?.assignment ?? defaultAssignment(machine);
    const body = style === 'structural' ? structural(machine, options, assignment) : behavioral(machine, options, assignment);
    return { name: `${machine.name}.vhd`, text: [...header(machine, options, assignment, style), ...entity(machine, options.statePort ?? false, assignment.width), ...body, ''].join('\n') };
}

interface Regs {
    readonly stateQ: string;
    readonly stateD: string;
    readonly regQ: readonly string[];
    readonly regD: readonly string[];
}

/** The clocked process: reset exactly as declared; registered outputs beside the state. */
function registerProcess(machine: Machine, assignment: StateAssignment, r: Regs, code: (c: string) => string): string[] {
    const clk = machine.clock.name;
    const edge = `${machine.clock.edge === 'rising' ? 'rising_edge' : 'falling_edge'}(${clk})`;
    const loads = [`${r.stateQ} <= ${r.stateD};`];
    machine.outputs.forEach((o, k) => { if (o.registered) loads.push(`${r.regQ[k]} <= ${r.regD[k]};`); });
    const rst = machine.reset;
    const out: string[] = [];
    if (!rst) {
        out.push(`    registers : process (${clk})`, '    begin', `        if ${edge} then`, ...loads.map((l) => `            ${l}`), '        end if;', '    end process;');
        return out;
    }
    const resetCode = typeof rst.target === 'number' ? assignment.codes[rst.target]! : zeroCode(assignment);
    const resets = [`${r.stateQ} <= ${code(resetCode)};`];
    machine.outputs.forEach((o, k) => {
        if (!o.registered) return;
        const v = typeof rst.target === 'number' ? mooreValue(machine, rst.target, k) ?? 0 : 0;
        resets.push(`${r.regQ[k]} <= ${vhdlValue(v, o.width, o.isBus)};`);
    });
    const active = `${rst.name} = '${rst.activeHigh ? 1 : 0}'`;
    if (rst.async) {
        out.push(`    registers : process (${clk}, ${rst.name})`, '    begin', `        if ${active} then`, ...resets.map((l) => `            ${l}`),
            `        elsif ${edge} then`, ...loads.map((l) => `            ${l}`), '        end if;', '    end process;');
    } else {
        out.push(`    registers : process (${clk})`, '    begin', `        if ${edge} then`, `            if ${active} then`, ...resets.map((l) => `                ${l}`),
            '            else', ...loads.map((l) => `                ${l}`), '            end if;', '        end if;', '    end process;');
    }
    return out;
}

function signalNames(machine: Machine): { alloc: NameAllocator; regs: Regs } {
    const alloc = new NameAllocator(portNames(machine), [machine.name]);
    const stateQ = alloc.take('state_q');
    const stateD = alloc.take('state_d');
    const regQ = machine.outputs.map((o) => (o.registered ? alloc.take(`${o.name}_q`) : ''));
    const regD = machine.outputs.map((o) => (o.registered ? alloc.take(`${o.name}_d`) : ''));
    return { alloc, regs: { stateQ, stateD, regQ, regD } };
}

function initialValue(machine: Machine, assignment: StateAssignment, code: (c: string) => string): string {
    // Without a reset, the register starts in the first state (an initial value: FPGA flows honour it).
    return machine.reset ? '' : ` := ${code(assignment.codes[0]!)}`;
}

function regOutputDecls(machine: Machine, regs: Regs, withInit: boolean): string[] {
    const out: string[] = [];
    machine.outputs.forEach((o, k) => {
        if (!o.registered) return;
        const init = withInit ? ` := ${vhdlValue(mooreValue(machine, 0, k) ?? 0, o.width, o.isBus)}` : '';
        out.push(`    signal ${regs.regQ[k]} : ${vtype(o.width, o.isBus)}${init};`, `    signal ${regs.regD[k]} : ${vtype(o.width, o.isBus)};`);
    });
    return out;
}

function tail(machine: Machine, options: ExportOptions, regs: Regs): string[] {
    const out: string[] = [];
    machine.outputs.forEach((o, k) => { if (o.registered) out.push(`    ${o.name} <= ${regs.regQ[k]};`); });
    if (options.statePort) out.push(`    state <= ${regs.stateQ};`);
    return out;
}

function behavioral(machine: Machine, options: ExportOptions, assignment: StateAssignment): string[] {
    const { alloc, regs } = signalNames(machine);
    const w = assignment.width;
    const codeNames = machine.states.map((s) => alloc.take(s.name));
    const vec = `std_logic_vector(${w - 1} downto 0)`;
    const byCode = (c: string) => {
        const i = assignment.codes.indexOf(c);
        return i >= 0 ? codeNames[i]! : `"${c}"`;
    };
    const out: string[] = [`architecture behavioral of ${machine.name} is`, `    -- State codes (${assignment.encoding}).`];
    machine.states.forEach((s, i) => out.push(`    constant ${codeNames[i]} : ${vec} := "${assignment.codes[i]}";`));
    out.push(`    signal ${regs.stateQ} : ${vec}${initialValue(machine, assignment, byCode)};`, `    signal ${regs.stateD} : ${vec};`);
    out.push(...regOutputDecls(machine, regs, !machine.reset));
    out.push('begin');
    const g = vhdlGuard(machine);
    out.push('    -- Next state; Moore outputs from the state, Mealy outputs from the state and the inputs.');
    out.push('    next_state : process (all)', '    begin', `        ${regs.stateD} <= ${regs.stateQ};`);
    machine.outputs.forEach((o) => { if (!o.registered) out.push(`        ${o.name} <= ${vhdlValue(0, o.width, o.isBus)};`); });
    out.push(`        case ${regs.stateQ} is`);
    machine.states.forEach((s, i) => {
        out.push(...commentBlock('--', docLines(s.doc), '            '));
        out.push(`            when ${codeNames[i]} =>`);
        for (const e of s.emits) {
            const o = machine.outputs[e.output]!;
            if (!o.registered) out.push(`                ${o.name} <= ${vhdlValue(e.value, o.width, o.isBus)};`);
        }
        const branch = (target: number, emits: readonly { output: number; value: number }[]) => {
            const lines = [`${regs.stateD} <= ${codeNames[target]};`];
            for (const e of emits) {
                if (mooreValue(machine, i, e.output) !== undefined) continue;
                const o = machine.outputs[e.output]!;
                lines.push(`${o.name} <= ${vhdlValue(e.value, o.width, o.isBus)};`);
            }
            return lines;
        };
        let first = true;
        for (const t of s.transitions) {
            out.push(`                ${first ? 'if' : 'elsif'} ${guardText(t.guard, machine, g)} then`);
            for (const l of branch(t.target, t.emits)) out.push(`                    ${l}`);
            first = false;
        }
        const ow = s.otherwise;
        if (ow?.kind === 'goto') {
            if (first) for (const l of branch(ow.target, ow.emits)) out.push(`                ${l}`);
            else {
                out.push('                else');
                for (const l of branch(ow.target, ow.emits)) out.push(`                    ${l}`);
            }
        }
        if (!first) out.push('                end if;');
        if (ow?.kind === 'dontcare') out.push('                -- otherwise dontcare: this export holds the state there');
        if (first && ow?.kind !== 'goto') out.push('                null;');
    });
    out.push('            when others =>');
    out.push(`                -- ${machine.recover ? 'unused code: recover' : 'unused code: go to a safe state (no recover declared)'}`);
    out.push(`                ${regs.stateD} <= ${codeNames[defaultTarget(machine, assignment)]};`);
    out.push('        end case;', '    end process;', '');
    if (machine.outputs.some((o) => o.registered)) {
        out.push('    -- Registered outputs load the Moore value of the next state.');
        out.push('    registered_next : process (all)', '    begin');
        machine.outputs.forEach((o, k) => { if (o.registered) out.push(`        ${regs.regD[k]} <= ${vhdlValue(0, o.width, o.isBus)};`); });
        out.push(`        case ${regs.stateD} is`);
        machine.states.forEach((s, i) => {
            const emits = s.emits.filter((e) => machine.outputs[e.output]!.registered);
            if (emits.length === 0) return;
            out.push(`            when ${codeNames[i]} =>`);
            for (const e of emits) {
                const o = machine.outputs[e.output]!;
                out.push(`                ${regs.regD[e.output]} <= ${vhdlValue(e.value, o.width, o.isBus)};`);
            }
        });
        out.push('            when others =>', '                null;', '        end case;', '    end process;', '');
    }
    out.push(...registerProcess(machine, assignment, regs, byCode));
    out.push(...tail(machine, options, regs));
    out.push('end architecture behavioral;');
    return out;
}

function structural(machine: Machine, options: ExportOptions, assignment: StateAssignment): string[] {
    const synth = options.synthesis;
    if (!synth) throw new Error('structural export needs the synthesis result');
    const { alloc, regs } = signalNames(machine);
    const w = assignment.width;
    const vec = `std_logic_vector(${w - 1} downto 0)`;
    const refs = variableRefs(synth, (k, b) => (b === undefined ? machine.inputs[k]!.name : `${machine.inputs[k]!.name}(${b})`), (i) => `${regs.stateQ}(${i})`);
    const sop = (cover: Parameters<typeof coverProducts>[0]) => {
        const p = coverProducts(cover, refs.length);
        if (p.empty) return "'0'";
        if (p.one) return "'1'";
        return p.products.map((lits) => `(${lits.map(([v, pos]) => (pos ? refs[v]! : `(not ${refs[v]!})`)).join(' and ')})`).join(' or ');
    };
    const code = (c: string) => `"${c}"`;
    const out: string[] = [`architecture structural of ${machine.name} is`];
    out.push(`    -- State codes (${assignment.encoding}): ${machine.states.map((s, i) => `${s.name} = ${assignment.codes[i]}`).join(', ')}.`);
    for (const s of machine.states) if (s.doc) out.push(...commentBlock('--', docLines(`${s.name}: ${s.doc}`), '    '));
    out.push(`    signal ${regs.stateQ} : ${vec}${initialValue(machine, assignment, code)};`, `    signal ${regs.stateD} : ${vec};`);
    out.push(...regOutputDecls(machine, regs, !machine.reset));
    const ex: { eq: string; hdl: string }[][] = [];
    for (let i = 0; i < w; i++) ex.push(ffInputNames(synth.flipflop, i).map((n) => ({ eq: n, hdl: alloc.take(n) })));
    for (const row of ex) for (const n of row) out.push(`    signal ${n.hdl} : std_logic;`);
    out.push('begin');
    out.push(`    -- Excitation equations (${synth.flipflop} flip-flops), sums of products over the inputs and ${regs.stateQ}.`);
    for (const row of ex) for (const n of row) out.push(`    ${n.hdl} <= ${sop(excitationCover(synth, n.eq))};`);
    out.push('', '    -- Characteristic equations of the flip-flops: the next value of each state bit.');
    ex.forEach((row, i) => {
        const q = `${regs.stateQ}(${i})`;
        const a = row[0]!.hdl;
        const b = row[1]?.hdl;
        switch (synth.flipflop) {
            case 'D': out.push(`    ${regs.stateD}(${i}) <= ${a};`); break;
            case 'T': out.push(`    ${regs.stateD}(${i}) <= ${a} xor ${q};  -- T: toggle when ${a} = '1'`); break;
            case 'JK': out.push(`    ${regs.stateD}(${i}) <= (${a} and (not ${q})) or ((not ${b}) and ${q});  -- JK: set, reset, toggle, hold`); break;
            case 'SR': out.push(`    ${regs.stateD}(${i}) <= ${a} or ((not ${b}) and ${q});  -- SR: set when s = '1', reset when r = '1' (never both)`); break;
        }
    });
    out.push('', '    -- Output equations.');
    machine.outputs.forEach((o, k) => {
        const target = o.registered ? regs.regD[k]! : o.name;
        for (let b = 0; b < o.width; b++) out.push(`    ${target}${o.isBus ? `(${b})` : ''} <= ${sop(outputCover(synth, k, b))};`);
    });
    out.push('');
    out.push(...registerProcess(machine, assignment, regs, code));
    out.push(...tail(machine, options, regs));
    out.push('end architecture structural;');
    return out;
}
