/** Exporters: Verilog, SystemVerilog, VHDL, C, DOT, and scenario testbenches (issue 4). */
import type { Machine } from '../model/machine.js';
import type { ExportFile, ExportLanguage, ExportOptions } from './common.js';
import { exportVerilog } from './verilog.js';
import { exportVhdl } from './vhdl.js';
import { exportC } from './c.js';
import { verilogTestbench, vhdlTestbench } from './testbench.js';
import { exportDot } from './dot.js';
import { defaultAssignment } from '../simulation/simulator.js';

export * from './common.js';
export { sha256Hex } from './sha256.js';
export { exportVerilog } from './verilog.js';
export { exportVhdl } from './vhdl.js';
export { exportC, cField, cNames } from './c.js';
export { verilogTestbench, vhdlTestbench } from './testbench.js';
export { exportDot, guardSource } from './dot.js';

/** Every file one export produces (the design, plus the testbench with `testbench`). */
export function exportMachine(machine: Machine, language: ExportLanguage, options: ExportOptions): ExportFile[] {
    // The testbench checks the state through the design's state port.
    const opts: ExportOptions = options.testbench ? { ...options, statePort: true } : options;
    const assignment = opts.assignment ?? opts.synthesis?.assignment ?? defaultAssignment(machine);
    const bench = (f: ExportFile) => (opts.testbench && (language === 'verilog' || language === 'systemverilog' || language === 'vhdl') ? [f,
        language === 'vhdl' ? vhdlTestbench(machine, opts, assignment) : verilogTestbench(machine, opts, assignment, language)] : [f]);
    switch (language) {
        case 'verilog': return bench(exportVerilog(machine, opts, 'verilog'));
        case 'systemverilog': return bench(exportVerilog(machine, opts, 'systemverilog'));
        case 'vhdl': return bench(exportVhdl(machine, opts));
        case 'c': return exportC(machine, options);
        case 'dot': return [exportDot(machine, opts)];
    }
}
