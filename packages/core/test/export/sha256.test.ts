import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { sha256Hex } from '../../src/export/sha256.js';
import { mulberry32 } from '../support/random-machine.js';

describe('sha256', () => {
    // Source: FIPS 180-4 example vectors (NIST "SHA256.pdf" examples: one block "abc", two blocks 448-bit message).
    it('matches the FIPS 180-4 examples', () => {
        expect(sha256Hex('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
        expect(sha256Hex('abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq')).toBe('248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1');
        expect(sha256Hex('')).toBe('e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855');
    });
    // Reference library: Node's OpenSSL-backed node:crypto, on random lengths around the block boundaries.
    it('matches node:crypto on 300 random byte strings', () => {
        const rng = mulberry32(7);
        for (let n = 0; n < 300; n++) {
            const len = n < 140 ? n : Math.floor(rng() * 3000);
            const bytes = Uint8Array.from({ length: len }, () => Math.floor(rng() * 256));
            expect(sha256Hex(bytes)).toBe(createHash('sha256').update(bytes).digest('hex'));
        }
    });
});
