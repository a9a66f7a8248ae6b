/**
 * Flip-flop excitation and characteristic equations.
 *
 * Excitation (what the inputs must be to go from Q to Q+), 'x' = don't-care:
 *   D:  D = Q+
 *   T:  T = Q ⊕ Q+
 *   JK: 0→0 J=0 K=x   0→1 J=1 K=x   1→0 J=x K=1   1→1 J=x K=0
 *   SR: 0→0 S=0 R=x   0→1 S=1 R=0   1→0 S=0 R=1   1→1 S=x R=0
 * Characteristic (what the flip-flop does with its inputs):
 *   D: Q+ = D;  T: Q+ = Q ⊕ T;  JK: Q+ = J·Q' + K'·Q;  SR: Q+ = S + R'·Q (S·R = 0 required)
 */
import type { FlipFlopKind } from '../model/machine.js';
import type { BitValue } from './behaviour.js';

/** Names of the excitation inputs of one flip-flop kind, in equation order. */
export function excitationInputs(kind: FlipFlopKind): readonly string[] {
    switch (kind) {
        case 'D': return ['d'];
        case 'T': return ['t'];
        case 'JK': return ['j', 'k'];
        case 'SR': return ['s', 'r'];
    }
}

/** Equation names of state bit i, in order (`d0`; `j0`, `k0`; …). */
export function excitationNames(kind: FlipFlopKind, bit: number): string[] {
    return excitationInputs(kind).map((p) => `${p}${bit}`);
}

/** Value of excitation input `port` (index into excitationInputs) for the move q → next. */
export function excitationValue(kind: FlipFlopKind, port: number, q: 0 | 1, next: 0 | 1): BitValue {
    switch (kind) {
        case 'D': return next;
        case 'T': return (q ^ next) as 0 | 1;
        case 'JK':
            if (port === 0) return q === 0 ? next : 'x';
            return q === 1 ? ((1 - next) as 0 | 1) : 'x';
        case 'SR':
            if (port === 0) return q === 0 ? next : next === 1 ? 'x' : 0;
            return q === 1 ? ((1 - next) as 0 | 1) : next === 0 ? 'x' : 0;
    }
}

/** The flip-flop's next value from its current value and excitation inputs (ports in excitationInputs order). */
export function characteristic(kind: FlipFlopKind, q: 0 | 1, ports: readonly (0 | 1)[]): 0 | 1 {
    const a = ports[0]!;
    switch (kind) {
        case 'D': return a;
        case 'T': return (q ^ a) as 0 | 1;
        case 'JK': { const k = ports[1]!; return ((a & (1 - q)) | ((1 - k) & q)) as 0 | 1; }
        case 'SR': { const r = ports[1]!; return (a | ((1 - r) & q)) as 0 | 1; }
    }
}
