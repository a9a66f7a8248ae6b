/**
 * REDUCE: shrinks every cube to the smallest cube that still covers what only it covers
 * (its intersection with the complement of the rest of the cover and the don't-cares), so
 * that the next EXPAND can grow it in a different direction.
 */
import type { Cube } from '../cube.js';
import { cubeLiteralCount } from './expand.js';
import { complementSupercube, cubeCofactor, masksFor } from './unate.js';
import { scccWordFill } from './word.js';

/** The maximal reduction of f[i] against the other cubes of f and dc, or null when redundant. */
export function reduceCube(f: readonly Cube[], i: number, dc: readonly Cube[], nvars: number): Cube | null {
    const c = f[i]!;
    const masks = masksFor(nvars);
    if (masks.length === 1) {
        // One word: cofactor into plain numbers and take the complement's supercube there.
        const mask = masks[0]!;
        const m = mask & 0x55555555;
        const p0 = c[0]!;
        const lit = (p0 ^ (p0 >>> 1)) & m;
        const litMask = (lit | (lit << 1)) >>> 0;
        const sw = scccWordFill(f.length + dc.length, mask, (out, start) => {
            let k = start;
            for (let j = 0; j < f.length; j++) {
                if (j === i) continue;
                const x0 = f[j]![0]!;
                const x = x0 & p0;
                if (((x | (x >>> 1)) & m) === m) out[k++] = (x0 | litMask) >>> 0;
            }
            for (let j = 0; j < dc.length; j++) {
                const x0 = dc[j]![0]!;
                const x = x0 & p0;
                if (((x | (x >>> 1)) & m) === m) out[k++] = (x0 | litMask) >>> 0;
            }
            return k - start;
        });
        return sw === -1 ? null : Uint32Array.of((p0 & sw) >>> 0);
    }
    const cof: Cube[] = [];
    cubeCofactor(i === 0 ? f.slice(1) : i === f.length - 1 ? f.slice(0, i) : [...f.slice(0, i), ...f.slice(i + 1)], c, nvars, cof);
    cubeCofactor(dc, c, nvars, cof);
    const s = complementSupercube(cof, nvars);
    if (s === null) return null;
    const r = new Uint32Array(c.length);
    for (let w = 0; w < c.length; w++) r[w] = c[w]! & s[w]!;
    return r;
}

/** Reduces the cubes one after another (largest first), each against the current others. */
export function reduce(f: readonly Cube[], dc: readonly Cube[], nvars: number): Cube[] {
    const cur: Cube[] = [...f];
    const lits = f.map((c) => cubeLiteralCount(c, nvars));
    const order = f.map((_, i) => i).sort((a, b) => lits[a]! - lits[b]! || a - b);
    const dropped = new Uint8Array(f.length);
    for (const i of order) {
        const live: Cube[] = [];
        let self = -1;
        for (let j = 0; j < cur.length; j++) {
            if (dropped[j]) continue;
            if (j === i) self = live.length;
            live.push(cur[j]!);
        }
        const r = reduceCube(live, self, dc, nvars);
        if (r === null) dropped[i] = 1;
        else cur[i] = r;
    }
    return cur.filter((_, i) => !dropped[i]);
}
