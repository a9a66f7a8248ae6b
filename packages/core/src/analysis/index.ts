/**
 * Design analyses (LANGUAGE.md "Diagnostics"): overlap, incomplete, shadowed, never,
 * unreachable, no-return, equivalent, no-reset, unused-input, unused-output.
 * Everything is computed on covers (boolean/), never by enumerating input combinations.
 */
import type { Machine } from '../model/machine.js';
import type { Finding } from '../model/finding.js';
import { buildSpace } from './space.js';
import { guardFindings } from './guards.js';
import { reachability } from './reachability.js';
import { equivalenceFindings } from './equivalence.js';
import { signalFindings } from './signals.js';

// Re-exported under names that say where they come from (core's index re-exports every module).
export { buildSpace as buildAnalysisSpace, type MachineSpace, type StateSpace, type Region, type RegionKind } from './space.js';
export { startState as analysisStartState, successors as effectiveSuccessors, type StartState, type Reachability } from './reachability.js';
export { equivalenceClasses } from './equivalence.js';
export { formatGuard as guardToDetentText } from './format.js';
export { inputsRead, outputsAssigned } from './signals.js';

export function analyzeMachine(machine: Machine): Finding[] {
    const findings = signalFindings(machine);
    if (machine.states.length === 0) return findings;
    const space = buildSpace(machine);
    findings.push(...guardFindings(machine, space));
    findings.push(...reachability(machine, space).findings);
    findings.push(...equivalenceFindings(machine, space));
    return findings;
}
