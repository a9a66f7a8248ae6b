/**
 * Size limits on a lowered machine, checked before any analysis or synthesis runs: beyond them
 * the exhaustive work (covers, next-state tables, one flip-flop per state for one-hot) would take
 * minutes or exhaust memory, so the machine is reported with a `limit` error and not analysed.
 * Documented in docs/limits.md.
 */
import { type Finding, type Machine, MAX_GUARD_CUBES, finding, guardContext, guardCoverBounded } from '@detent/core';

/** States of one machine. */
export const MAX_STATES = 1024;
/** Input variables of one machine (1-bit inputs plus every bus bit). */
export const MAX_INPUT_BITS = 256;
/** Output bits of one machine. */
export const MAX_OUTPUT_BITS = 256;
/** `when` lines of one state (the next-state table subtracts each guard from what is left; its cost grows quadratically). */
export const MAX_TRANSITIONS_PER_STATE = 256;

export function modelLimitFindings(machine: Machine): Finding[] {
    const out: Finding[] = [];
    const limit = (message: string, range = machine.nameRange) => out.push(finding('limit', message, range, { severity: 'error' }));
    if (machine.states.length > MAX_STATES) {
        limit(`machine '${machine.name}' has ${machine.states.length} states; Detent analyses and synthesizes up to ${MAX_STATES} (split it into cooperating machines)`);
    }
    const inputBits = machine.inputs.reduce((n, i) => n + i.width, 0);
    if (inputBits > MAX_INPUT_BITS) limit(`machine '${machine.name}' has ${inputBits} input bits; Detent analyses up to ${MAX_INPUT_BITS}`);
    const outputBits = machine.outputs.reduce((n, o) => n + o.width, 0);
    if (outputBits > MAX_OUTPUT_BITS) limit(`machine '${machine.name}' has ${outputBits} output bits; Detent synthesizes up to ${MAX_OUTPUT_BITS}`);
    for (const state of machine.states) {
        if (state.transitions.length > MAX_TRANSITIONS_PER_STATE) {
            limit(`state '${state.name}' has ${state.transitions.length} transitions; Detent synthesizes up to ${MAX_TRANSITIONS_PER_STATE} per state (decode the input outside the machine or split the state)`, state.nameRange);
        }
    }
    if (out.length > 0) return out;
    const ctx = guardContext(machine);
    for (const state of machine.states) {
        for (const t of state.transitions) {
            if (guardCoverBounded(t.guard, ctx) === undefined) {
                limit(`guard needs more than ${MAX_GUARD_CUBES} product terms as a sum of products (e.g. a long XOR chain); Detent's analyses and two-level synthesis cannot handle it — split the condition over states or compute it outside the machine`, t.guard.range);
            }
        }
    }
    return out;
}
