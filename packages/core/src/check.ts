/**
 * Every finding core can compute for one lowered machine: design analyses, as-built (synthesized
 * logic) analyses and scenario runs. The language package adds parse and lowering findings.
 */
import type { Machine } from './model/machine.js';
import type { Finding } from './model/finding.js';
import { analyzeMachine } from './analysis/index.js';
import { analyzeAsBuilt } from './asbuilt/index.js';
import { scenarioFindings } from './simulation/index.js';

export interface CheckOptions {
    /** Skip the synthesis-based analyses (lockup, reset-code, async-input), e.g. while typing fast. */
    readonly skipAsBuilt?: boolean;
    readonly skipScenarios?: boolean;
}

export function checkMachine(machine: Machine, options: CheckOptions = {}): Finding[] {
    const findings = [...analyzeMachine(machine)];
    if (!options.skipAsBuilt) findings.push(...analyzeAsBuilt(machine));
    if (!options.skipScenarios) findings.push(...scenarioFindings(machine));
    return findings;
}
