/** Exporters: Verilog, SystemVerilog, VHDL, C, DOT, and scenario testbenches (issue 4). */
import type { Machine } from '../model/machine.js';
import type { ExportFile, ExportLanguage, ExportOptions } from './common.js';
import { exportVerilog } from './verilog.js';
import { exportVhdl } from './vhdl.js';
import { exportC } from './c.js';

export * from './common.js';
export { sha256Hex } from './sha256.js';
export { exportVerilog } from './verilog.js';
export { exportVhdl } from './vhdl.js';
export { exportC, cField, cNames } from './c.js';

/** Every file one export produces (the design, plus the testbench with `testbench`). */
export function exportMachine(machine: Machine, language: ExportLanguage, options: ExportOptions): ExportFile[] {
    switch (language) {
        case 'verilog': return [exportVerilog(machine, options, 'verilog')];
        case 'systemverilog': return [exportVerilog(machine, options, 'systemverilog')];
        case 'vhdl': return [exportVhdl(machine, options)];
        case 'c': return exportC(machine, options);
        default: throw new Error(`export to ${language}: not built yet`);
    }
}
