/** Design analyses (issue 2): overlap, incomplete, shadowed, never, unreachable, no-return, equivalent, no-reset, unused-*. PLACEHOLDER. */
import type { Machine } from '../model/machine.js';
import type { Finding } from '../model/finding.js';

export function analyzeMachine(machine: Machine): Finding[] {
    void machine;
    return [];
}
