/**
 * Fixed state assignments of LANGUAGE.md ("State assignment"). Codes are strings MSB first;
 * bit q0 is the last character. `auto` is a search and lives in auto-encoding.ts.
 */
import type { EncodingKind, Machine } from '../model/machine.js';

export interface StateAssignment {
    /** The encoding requested; `auto` stays `auto` (the chosen codes say what it found). */
    readonly encoding: EncodingKind;
    readonly width: number;
    /** Code of each state by state index, MSB first. */
    readonly codes: readonly string[];
    /** For `auto`: how the assignment was chosen and what the runners-up cost. */
    readonly note?: string;
}

export function ceilLog2(n: number): number {
    let w = 0;
    while (2 ** w < n) w++;
    return w;
}

export function toBits(value: number, width: number): string {
    let s = '';
    for (let b = width - 1; b >= 0; b--) s += Math.floor(value / 2 ** b) % 2 === 1 ? '1' : '0';
    return s;
}

export function binaryCodes(n: number): string[] {
    const w = Math.max(1, ceilLog2(n));
    return Array.from({ length: n }, (_, i) => toBits(i, w));
}

export function grayCodes(n: number): string[] {
    const w = Math.max(1, ceilLog2(n));
    return Array.from({ length: n }, (_, i) => toBits(i ^ (i >>> 1), w));
}

export function oneHotCodes(n: number): string[] {
    const w = Math.max(1, n);
    return Array.from({ length: n }, (_, i) => toBits(0, w).split('').map((_, p) => (w - 1 - p === i ? '1' : '0')).join(''));
}

export function oneColdCodes(n: number): string[] {
    return oneHotCodes(n).map((c) => c.split('').map((b) => (b === '1' ? '0' : '1')).join(''));
}

export function johnsonCodes(n: number): string[] {
    const k = Math.max(1, Math.ceil(n / 2));
    const ones = (m: number) => '1'.repeat(m);
    return Array.from({ length: n }, (_, i) => {
        if (i <= k) return (ones(i)).padStart(k, '0');
        // ((2^k − 1) << (i − k)) masked to k bits: ones shifted left, zeros fill from the right.
        const shift = i - k;
        return (ones(k - shift) + '0'.repeat(shift));
    });
}

/** Codes from `code S = …` lines; the lowering has already reported missing or unequal ones. */
export function explicitCodes(machine: Machine): string[] | undefined {
    const codes = machine.states.map((s) => s.code?.bits);
    if (codes.some((c) => c === undefined)) return undefined;
    return codes as string[];
}

/** The assignment of a fixed encoding (everything but `auto`), or undefined when explicit codes are incomplete. */
export function fixedAssignment(machine: Machine, encoding: Exclude<EncodingKind, 'auto'>): StateAssignment | undefined {
    const n = machine.states.length;
    let codes: string[] | undefined;
    switch (encoding) {
        case 'binary': codes = binaryCodes(n); break;
        case 'gray': codes = grayCodes(n); break;
        case 'onehot': codes = oneHotCodes(n); break;
        case 'onecold': codes = oneColdCodes(n); break;
        case 'johnson': codes = johnsonCodes(n); break;
        case 'explicit': codes = explicitCodes(machine); break;
    }
    if (!codes) return undefined;
    return { encoding, width: codes[0]?.length ?? 1, codes };
}

/**
 * The state a `reset … clear` lands in under an assignment: the state whose code is all zeros,
 * or undefined when no state has that code (then `reset-code` applies unless `recover`).
 */
export function clearResetState(assignment: StateAssignment): number | undefined {
    const zero = '0'.repeat(assignment.width);
    const i = assignment.codes.indexOf(zero);
    return i < 0 ? undefined : i;
}
