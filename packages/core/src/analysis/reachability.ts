/**
 * Reachability over the transitions that can actually fire (see space.ts): `unreachable` and
 * `no-return`, both relative to the reset state.
 */
import type { Machine } from '../model/machine.js';
import { type Finding, finding } from '../model/finding.js';
import { clearResetState, fixedAssignment } from '../synthesis/encoding.js';
import type { MachineSpace } from './space.js';

export interface StartState {
    readonly index: number;
    /** How it was chosen, for messages. */
    readonly role: 'reset state' | 'initial state';
    readonly why: string;
}

/**
 * The state analyses start from. `reset -> S`: S. `reset … clear`: the state whose code is all
 * zeros under the machine's fixed encoding; when no state has that code the register holds an
 * unused code after reset, which `recover -> R` leaves for R on the next clock (so R), and
 * otherwise (a `reset-code` error elsewhere) or under `auto` encoding, the first state.
 * No reset: the first state.
 */
export function startState(machine: Machine): StartState {
    const reset = machine.reset;
    if (!reset) return { index: 0, role: 'initial state', why: 'the machine has no reset, so analyses start from the first state' };
    if (typeof reset.target === 'number') return { index: reset.target, role: 'reset state', why: `reset -> ${machine.states[reset.target]?.name}` };
    if (machine.encoding === 'auto') return { index: 0, role: 'reset state', why: 'reset clear under auto encoding: analyses start from the first state' };
    const assignment = fixedAssignment(machine, machine.encoding);
    const zero = assignment ? clearResetState(assignment) : undefined;
    if (zero !== undefined) return { index: zero, role: 'reset state', why: 'reset clear: the state with the all-zeros code' };
    if (machine.recover && assignment) return { index: machine.recover.target, role: 'reset state', why: 'reset clear gives an unused code, which recovers to this state' };
    return { index: 0, role: 'reset state', why: 'reset clear gives no state code: analyses start from the first state' };
}

/** Successor lists of the effective transition relation (no duplicates, self-loops kept). */
export function successors(machine: Machine, space: MachineSpace): number[][] {
    return machine.states.map((_, s) => {
        const next = new Set<number>();
        for (const r of space.states[s]!.regions) next.add(r.target);
        return [...next];
    });
}

/** Breadth-first search; `parent[v]` is the predecessor on a shortest path (−1 at the root, −2 unreached). */
function bfs(adj: readonly (readonly number[])[], root: number): Int32Array {
    const parent = new Int32Array(adj.length).fill(-2);
    if (root < 0 || root >= adj.length) return parent;
    parent[root] = -1;
    const queue = [root];
    for (let h = 0; h < queue.length; h++) {
        const u = queue[h]!;
        for (const v of adj[u]!) if (parent[v] === -2) { parent[v] = u; queue.push(v); }
    }
    return parent;
}

export interface Reachability {
    readonly start: StartState;
    readonly reachable: readonly boolean[];
    /** Can reach the start state (itself included). */
    readonly returns: readonly boolean[];
    readonly findings: Finding[];
}

export function reachability(machine: Machine, space: MachineSpace): Reachability {
    const n = machine.states.length;
    const start = startState(machine);
    const adj = successors(machine, space);
    const parent = bfs(adj, start.index);
    const rev: number[][] = Array.from({ length: n }, () => []);
    adj.forEach((vs, u) => { for (const v of vs) rev[v]!.push(u); });
    const back = bfs(rev, start.index);
    const startName = machine.states[start.index]?.name ?? '?';
    const findings: Finding[] = [];
    const reachable = Array.from(parent, (p) => p !== -2);
    const returns = Array.from(back, (p) => p !== -2);
    machine.states.forEach((state, s) => {
        if (!reachable[s]) {
            findings.push(finding('unreachable',
                `no sequence of inputs leads from the ${start.role} '${startName}' to state '${state.name}'`,
                state.nameRange, { state: state.name, related: [{ message: `${start.role} '${startName}' (${start.why})`, range: machine.states[start.index]!.nameRange }] }));
        } else if (!returns[s]) {
            const path: string[] = [];
            for (let v = s; v >= 0; v = parent[v]!) path.push(machine.states[v]!.name);
            path.reverse();
            findings.push(finding('no-return',
                `once in state '${state.name}' the machine can never get back to the ${start.role} '${startName}'${machine.reset ? ' without a reset' : ''} (reached by ${path.join(' → ')})`,
                state.nameRange, { state: state.name, witness: { path }, related: [{ message: `${start.role} '${startName}'`, range: machine.states[start.index]!.nameRange }] }));
        }
    });
    return { start, reachable, returns, findings };
}
