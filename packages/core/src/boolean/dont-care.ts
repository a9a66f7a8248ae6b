/**
 * The don't-care set as the minimizer uses it: DC minus ON. A minterm in both is ON (the
 * result must contain it); left in the DC cover it would let IRREDUNDANT drop the ON cube
 * that covers it.
 */
import type { Cube } from './cube.js';
import { intersects, wordMask, wordsFor } from './cube.js';

/**
 * dc # on as disjoint pieces; past `maxCubes` pieces it falls back to the DC cubes that miss
 * ON altogether (fewer don't-cares: still sound, less freedom).
 */
export function dontCaresOutside(dc: readonly Cube[], on: readonly Cube[], nvars: number, maxCubes = 4000): Cube[] {
    const words = wordsFor(nvars);
    let cur: Cube[] = [...dc];
    for (const o of on) {
        if (!cur.some((d) => intersects(d, o, nvars))) continue;
        const next: Cube[] = [];
        for (const d of cur) {
            if (!intersects(d, o, nvars)) { next.push(d); continue; }
            // d − o: one piece per literal of o where d is free, fixing the earlier ones to o.
            let prefix = d.slice();
            for (let w = 0; w < words; w++) {
                const ol = (o[w]! ^ (o[w]! >>> 1)) & wordMask(nvars, w) & 0x55555555;
                let y = ol & prefix[w]! & (prefix[w]! >>> 1);
                while (y !== 0) {
                    const b = y & -y;
                    y ^= b;
                    const field = (b | (b << 1)) >>> 0;
                    const ov = o[w]! & field;
                    const piece = prefix.slice();
                    piece[w] = ((piece[w]! & ~field) | (~ov & field)) >>> 0;
                    next.push(piece);
                    prefix = prefix.slice();
                    prefix[w] = ((prefix[w]! & ~field) | ov) >>> 0;
                }
            }
            // what is left of d (prefix) lies inside o: dropped.
        }
        if (next.length > maxCubes) return dc.filter((d) => !on.some((x) => intersects(d, x, nvars)));
        cur = next;
    }
    return cur;
}
