/** Cycle-exact simulation, scenarios, stimulus files and VCD (issue 4). */
import type { Machine } from '../model/machine.js';
import type { Finding } from '../model/finding.js';
import { scenarioFindingsOf } from './scenario.js';

export * from './simulator.js';
export * from './scenario.js';
export * from './stimulus.js';
export * from './vcd.js';
export * from './asbuilt.js';

/** `scenario` errors of a machine (range = the failing expect). */
export function scenarioFindings(machine: Machine): Finding[] {
    return scenarioFindingsOf(machine);
}
