/**
 * Scenario testbenches (Verilog-2005, also used for SystemVerilog; VHDL-2008).
 *
 * Each scenario drives its own instance of the design (fresh power-up state) through the
 * design's `state` port, so `--testbench` always exports the design with the state port.
 * With a reset, every scenario starts with one reset clock (the state `detent test` starts in);
 * `reset;` holds the reset for one clock; `step … * n` applies the inputs (others 0) for n clocks;
 * `expect` checks one time unit after the last clock's idle edge, inputs still applied.
 * One clock: inputs change, 5 ns later the active edge, 5 ns later the idle edge.
 * Prints `PASS name` / `FAIL name` per scenario, the failing expects with expected and actual
 * values, and ends with a non-zero exit when any scenario failed (`$fatal(1, …)` in Icarus,
 * `assert … severity failure` in GHDL).
 */
import type { Machine, Scenario } from '../model/machine.js';
import type { StateAssignment } from '../synthesis/encoding.js';
import { type ExportFile, type ExportOptions, bits, commentBlock, headerLines } from './common.js';

interface Check {
    readonly line: number;
    readonly state?: { code: string; name: string };
    readonly outputs: readonly { output: number; value: number }[];
}

type Action = { kind: 'clock'; reset: boolean; inputs: number[] } | { kind: 'check'; check: Check };

function actions(machine: Machine, scenario: Scenario, assignment: StateAssignment): Action[] {
    const out: Action[] = [];
    if (machine.reset) out.push({ kind: 'clock', reset: true, inputs: machine.inputs.map(() => 0) });
    for (const step of scenario.steps) {
        if (step.kind === 'reset') out.push({ kind: 'clock', reset: true, inputs: machine.inputs.map(() => 0) });
        else if (step.kind === 'step') {
            const inputs = machine.inputs.map(() => 0);
            for (const a of step.assignments) inputs[a.input] = a.value;
            for (let n = 0; n < step.repeat; n++) out.push({ kind: 'clock', reset: false, inputs });
        } else {
            out.push({
                kind: 'check',
                check: {
                    line: step.range.start.line + 1,
                    state: step.state === undefined ? undefined : { code: assignment.codes[step.state]!, name: machine.states[step.state]!.name },
                    outputs: step.outputs.map((o) => ({ output: o.output, value: o.value })),
                },
            });
        }
    }
    return out;
}

/** Verilog string literal contents (names are identifiers; file names may need escapes). */
const vstr = (s: string) => s.replace(/[\\"]/g, (c) => `\\${c}`).replace(/[^\x20-\x7e]/g, '?');

export function verilogTestbench(machine: Machine, options: ExportOptions, assignment: StateAssignment, dialect: 'verilog' | 'systemverilog'): ExportFile {
    const w = assignment.width;
    const idle = machine.clock.edge === 'rising' ? 0 : 1;
    const rst = machine.reset;
    const level = (asserted: boolean) => (rst ? (asserted === rst.activeHigh ? 1 : 0) : 0);
    const tb = `${machine.name}_tb`;
    const L: string[] = [...commentBlock('//', headerLines({ machine, what: `scenario testbench (${dialect === 'verilog' ? 'Verilog-2005' : 'SystemVerilog-2017'}, runs in Icarus: vvp exits non-zero on a failure)`, options, assignment }))];
    L.push('`timescale 1ns / 1ps', `module ${tb};`, '    integer failures = 0;', '    integer failed_expects = 0;');
    const longest = Math.max(1, ...machine.states.map((s) => s.name.length), 6);
    L.push(`    function [${8 * longest - 1}:0] state_name(input [${w - 1}:0] code);`, '        begin', '            case (code)');
    machine.states.forEach((s, i) => L.push(`                ${w}'b${assignment.codes[i]}: state_name = "${s.name}";`));
    L.push('                default: state_name = "(none)";', '            endcase', '        end', '    endfunction');
    machine.scenarios.forEach((sc, k) => {
        const p = `s${k}_`;
        L.push(`    // scenario ${sc.name}`, `    reg ${p}clk = 1'b${idle};`);
        if (rst) L.push(`    reg ${p}rst = 1'b${level(false)};`);
        machine.inputs.forEach((inp, j) => L.push(`    reg ${inp.isBus ? `[${inp.width - 1}:0] ` : ''}${p}i${j} = ${inp.width}'d0;`));
        machine.outputs.forEach((o, j) => L.push(`    wire ${o.isBus ? `[${o.width - 1}:0] ` : ''}${p}o${j};`));
        L.push(`    wire [${w - 1}:0] ${p}state;`);
        const conns = [
            `.${machine.clock.name}(${p}clk)`, ...(rst ? [`.${rst.name}(${p}rst)`] : []),
            ...machine.inputs.map((inp, j) => `.${inp.name}(${p}i${j})`), ...machine.outputs.map((o, j) => `.${o.name}(${p}o${j})`), `.state(${p}state)`,
        ];
        L.push(`    ${machine.name} u${k} (${conns.join(', ')});`);
    });
    L.push('    integer ok;', '    initial begin');
    machine.scenarios.forEach((sc, k) => {
        const p = `s${k}_`;
        L.push('        ok = 1;');
        for (const a of actions(machine, sc, assignment)) {
            if (a.kind === 'clock') {
                if (rst) L.push(`        ${p}rst = 1'b${level(a.reset)};`);
                a.inputs.forEach((v, j) => L.push(`        ${p}i${j} = ${machine.inputs[j]!.width}'d${v};`));
                L.push(`        #5 ${p}clk = 1'b${1 - idle};`, `        #5 ${p}clk = 1'b${idle};`);
            } else {
                const c = a.check;
                L.push('        #1;');
                const where = `${vstr(options.sourceName)}:${c.line}`;
                if (c.state) {
                    L.push(`        if (${p}state !== ${w}'b${c.state.code}) begin`, '            ok = 0; failed_expects = failed_expects + 1;',
                        `            $display("  ${where}: expect: state expected ${c.state.name}, got %0s (%b)", state_name(${p}state), ${p}state);`, '        end');
                }
                for (const o of c.outputs) {
                    const out = machine.outputs[o.output]!;
                    L.push(`        if (${p}o${o.output} !== ${out.width}'d${o.value}) begin`, '            ok = 0; failed_expects = failed_expects + 1;',
                        `            $display("  ${where}: expect: ${out.name} expected ${o.value}, got %0d", ${p}o${o.output});`, '        end');
                }
            }
        }
        L.push(`        if (ok) $display("PASS ${vstr(sc.name)}"); else begin $display("FAIL ${vstr(sc.name)}"); failures = failures + 1; end`);
    });
    L.push(`        if (failures > 0) $fatal(1, "%0d of ${machine.scenarios.length} scenarios failed", failures);`);
    L.push(`        $display("all ${machine.scenarios.length} scenarios passed");`, '        $finish;', '    end', 'endmodule', '');
    return { name: `${tb}.${dialect === 'verilog' ? 'v' : 'sv'}`, text: L.join('\n') };
}

const vhstr = (s: string) => s.replace(/"/g, '""').replace(/[^\x20-\x7e]/g, '?');

export function vhdlTestbench(machine: Machine, options: ExportOptions, assignment: StateAssignment): ExportFile {
    const w = assignment.width;
    const idle = machine.clock.edge === 'rising' ? 0 : 1;
    const rst = machine.reset;
    const level = (asserted: boolean) => (rst ? (asserted === rst.activeHigh ? 1 : 0) : 0);
    const tb = `${machine.name}_tb`;
    const slv = (n: number) => `std_logic_vector(${n - 1} downto 0)`;
    const lit = (v: number, width: number, bus: boolean) => (bus ? `"${bits(v, width)}"` : `'${v & 1}'`);
    const L: string[] = [...commentBlock('--', headerLines({ machine, what: 'scenario testbench (VHDL-2008; GHDL exits non-zero on a failure)', options, assignment }))];
    L.push('library ieee;', 'use ieee.std_logic_1164.all;', 'use ieee.numeric_std.all;', '', `entity ${tb} is`, `end entity ${tb};`, '', `architecture scenarios of ${tb} is`);
    machine.scenarios.forEach((sc, k) => {
        const p = `s${k}_`;
        L.push(`    -- scenario ${sc.name}`, `    signal ${p}clk : std_logic := '${idle}';`);
        if (rst) L.push(`    signal ${p}rst : std_logic := '${level(false)}';`);
        machine.inputs.forEach((inp, j) => L.push(`    signal ${p}i${j} : ${inp.isBus ? `${slv(inp.width)} := (others => '0')` : "std_logic := '0'"};`));
        machine.outputs.forEach((o, j) => L.push(`    signal ${p}o${j} : ${o.isBus ? slv(o.width) : 'std_logic'};`));
        L.push(`    signal ${p}state : ${slv(w)};`);
    });
    L.push(`    function state_name(code : std_logic_vector(${w - 1} downto 0)) return string is`, '    begin');
    machine.states.forEach((s, i) => L.push(`        if code = "${assignment.codes[i]}" then return "${s.name}"; end if;`));
    L.push('        return "(none)";', '    end function;', 'begin');
    machine.scenarios.forEach((sc, k) => {
        const p = `s${k}_`;
        const conns = [
            `${machine.clock.name} => ${p}clk`, ...(rst ? [`${rst.name} => ${p}rst`] : []),
            ...machine.inputs.map((inp, j) => `${inp.name} => ${p}i${j}`), ...machine.outputs.map((o, j) => `${o.name} => ${p}o${j}`), `state => ${p}state`,
        ];
        L.push(`    u${k} : entity work.${machine.name} port map (${conns.join(', ')});`);
    });
    L.push('    run : process', '        variable ok : boolean;', '        variable failures : natural := 0;', '    begin');
    machine.scenarios.forEach((sc, k) => {
        const p = `s${k}_`;
        L.push('        ok := true;');
        for (const a of actions(machine, sc, assignment)) {
            if (a.kind === 'clock') {
                if (rst) L.push(`        ${p}rst <= '${level(a.reset)}';`);
                a.inputs.forEach((v, j) => L.push(`        ${p}i${j} <= ${lit(v, machine.inputs[j]!.width, machine.inputs[j]!.isBus)};`));
                L.push(`        wait for 5 ns; ${p}clk <= '${1 - idle}';`, `        wait for 5 ns; ${p}clk <= '${idle}';`);
            } else {
                const c = a.check;
                const where = `${vhstr(options.sourceName)}:${c.line}`;
                L.push('        wait for 1 ns;');
                if (c.state) {
                    L.push(`        if ${p}state /= "${c.state.code}" then`, '            ok := false;',
                        `            report "  ${where}: expect: state expected ${c.state.name}, got " & state_name(${p}state) & " (" & to_string(${p}state) & ")";`, '        end if;');
                }
                for (const o of c.outputs) {
                    const out = machine.outputs[o.output]!;
                    const actual = out.isBus ? `to_string(to_integer(unsigned(${p}o${o.output})))` : `to_string(${p}o${o.output})`;
                    L.push(`        if ${p}o${o.output} /= ${lit(o.value, out.width, out.isBus)} then`, '            ok := false;',
                        `            report "  ${where}: expect: ${out.name} expected ${o.value}, got " & ${actual};`, '        end if;');
                }
            }
        }
        L.push(`        if ok then report "PASS ${vhstr(sc.name)}"; else report "FAIL ${vhstr(sc.name)}"; failures := failures + 1; end if;`);
    });
    L.push(`        assert failures = 0 report integer'image(failures) & " of ${machine.scenarios.length} scenarios failed" severity failure;`);
    L.push(`        report "all ${machine.scenarios.length} scenarios passed";`, '        wait;', '    end process;', 'end architecture scenarios;', '');
    return { name: `${tb}.vhd`, text: L.join('\n') };
}
