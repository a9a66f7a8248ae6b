/** As-built analyses from the synthesized logic (issue 3): lockup, reset-code, async-input. PLACEHOLDER. */
import type { Machine } from '../model/machine.js';
import type { Finding } from '../model/finding.js';

export function analyzeAsBuilt(machine: Machine): Finding[] {
    void machine;
    return [];
}
