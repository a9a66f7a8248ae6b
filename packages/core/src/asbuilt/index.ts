/**
 * As-built analyses (issue 3): the machine the synthesized logic really implements — lock-up and
 * recovery latency (explicit or BDD-based), reset-code, async-input.
 */
import type { Machine } from '../model/machine.js';
import type { Finding } from '../model/finding.js';
import { asBuiltFindings } from './report.js';

export * from './bdd.js';
export * from './next-code.js';
export * from './safety.js';
export * from './report.js';

/**
 * lockup / reset-code / async-input findings (and `limit` when an analysis had to be skipped).
 * Runs on every keystroke in the editor: synthesis of `auto` and the lock-up analysis are
 * time-bounded (about 100 ms and 300 ms).
 */
export function analyzeAsBuilt(machine: Machine): Finding[] {
    return asBuiltFindings(machine);
}
