/** Cycle-exact simulation and scenarios (issue 4). PLACEHOLDER. */
import type { Machine } from '../model/machine.js';
import type { Finding } from '../model/finding.js';

export function scenarioFindings(machine: Machine): Finding[] {
    void machine;
    return [];
}
