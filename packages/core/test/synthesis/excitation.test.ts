import { describe, expect, it } from 'vitest';
import type { FlipFlopKind } from '../../src/model/machine.js';
import { characteristic, excitationInputs, excitationValue } from '../../src/synthesis/excitation.js';
import { characteristicOracle } from './oracle.js';

/**
 * Flip-flop excitation tables as printed in M. Morris Mano, "Digital Design" (flip-flop
 * excitation tables, chapter on synchronous sequential logic) — written down from memory.
 * Rows: Q(t), Q(t+1), then the required inputs; 'x' = don't-care.
 */
const HANDBOOK: Record<FlipFlopKind, readonly (readonly [number, number, ...(0 | 1 | 'x')[]])[]> = {
    D: [[0, 0, 0], [0, 1, 1], [1, 0, 0], [1, 1, 1]],
    T: [[0, 0, 0], [0, 1, 1], [1, 0, 1], [1, 1, 0]],
    JK: [[0, 0, 0, 'x'], [0, 1, 1, 'x'], [1, 0, 'x', 1], [1, 1, 'x', 0]],
    SR: [[0, 0, 0, 'x'], [0, 1, 1, 0], [1, 0, 0, 1], [1, 1, 'x', 0]],
};

describe('excitation tables', () => {
    it('match the handbook tables (Mano, Digital Design; from memory)', () => {
        for (const kind of ['D', 'T', 'JK', 'SR'] as const) {
            for (const [q, next, ...inputs] of HANDBOOK[kind]) {
                inputs.forEach((want, port) => {
                    expect(excitationValue(kind, port, q as 0 | 1, next as 0 | 1), `${kind} ${q}→${next} port ${port}`).toBe(want);
                });
            }
        }
    });

    it('every row, with each don\'t-care taken both ways, reaches Q(t+1) by the characteristic equation', () => {
        // Characteristic equations written independently in oracle.ts (from memory: Q+=D, Q⊕T, JQ'+K'Q, S+R'Q).
        for (const kind of ['D', 'T', 'JK', 'SR'] as const) {
            const ports = excitationInputs(kind).length;
            for (const q of [0, 1] as const) for (const next of [0, 1] as const) {
                const values = Array.from({ length: ports }, (_, p) => excitationValue(kind, p, q, next));
                for (let fill = 0; fill < 1 << ports; fill++) {
                    const concrete = values.map((v, p) => (v === 'x' ? ((fill >> p) & 1) as 0 | 1 : v));
                    if (kind === 'SR' && concrete[0] === 1 && concrete[1] === 1) continue; // S·R = 1 is not allowed
                    expect(characteristicOracle(kind, q, concrete[0]!, concrete[1] ?? 0), `${kind} ${q}→${next} ${concrete}`).toBe(next);
                    expect(characteristic(kind, q, concrete)).toBe(next);
                }
            }
        }
    });

    it('a specified S and R are never both 1', () => {
        for (const q of [0, 1] as const) for (const next of [0, 1] as const) {
            expect(excitationValue('SR', 0, q, next) === 1 && excitationValue('SR', 1, q, next) === 1).toBe(false);
        }
    });
});
