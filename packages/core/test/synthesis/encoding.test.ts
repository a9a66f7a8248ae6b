import { describe, expect, it } from 'vitest';
import { binaryCodes, grayCodes, johnsonCodes, oneColdCodes, oneHotCodes } from '../../src/synthesis/encoding.js';

describe('fixed encodings', () => {
    it('gray matches the reflected binary code sequence', () => {
        // OEIS A003188 (Gray code for n: a(n) = n XOR floor(n/2)), first 32 terms copied from the published sequence.
        const a003188 = [0, 1, 3, 2, 6, 7, 5, 4, 12, 13, 15, 14, 10, 11, 9, 8, 24, 25, 27, 26, 30, 31, 29, 28, 20, 21, 23, 22, 18, 19, 17, 16];
        expect(grayCodes(32).map((c) => parseInt(c, 2))).toEqual(a003188);
        // Reflected-code property: successive codes differ in exactly one bit (Gray's patent, US 2,632,058).
        const codes = grayCodes(16);
        for (let i = 1; i < codes.length; i++) {
            const diff = [...codes[i]!].filter((b, k) => b !== codes[i - 1]![k]).length;
            expect(diff).toBe(1);
        }
    });
    it('binary, one-hot and one-cold widths and codes', () => {
        expect(binaryCodes(5)).toEqual(['000', '001', '010', '011', '100']);
        expect(binaryCodes(1)).toEqual(['0']);
        expect(oneHotCodes(3)).toEqual(['001', '010', '100']);
        expect(oneColdCodes(3)).toEqual(['110', '101', '011']);
    });
    it('johnson follows the twisted-ring counter sequence', () => {
        // Twisted-ring (Johnson) counter: shift left, feeding the complement of the MSB into q0 (common practice).
        for (const n of [1, 2, 3, 5, 6, 8, 11]) {
            const codes = johnsonCodes(n);
            const k = Math.max(1, Math.ceil(n / 2));
            let reg = '0'.repeat(k);
            for (let i = 0; i < n; i++) {
                expect(codes[i], `n=${n} i=${i}`).toBe(reg);
                reg = reg.slice(1) + (reg[0] === '1' ? '0' : '1');
            }
            expect(new Set(codes).size).toBe(n);
        }
    });
});
