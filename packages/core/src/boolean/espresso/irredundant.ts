/**
 * IRREDUNDANT: drops cubes covered by the rest of the cover and the don't-cares.
 *
 * Cubes not covered by all the others are relatively essential and stay; cubes covered by the
 * essential ones alone are totally redundant and go; among the partially redundant rest, the
 * smallest (most literals) are dropped first while the remainder still covers them.
 */
import type { Cube } from '../cube.js';
import { cubeLiteralCount } from './expand.js';
import { coverHasCube, coverHasCubeExcept } from './unate.js';

export function irredundant(f: readonly Cube[], dc: readonly Cube[], nvars: number): Cube[] {
    const n = f.length;
    if (n === 0) return [];
    const essential = new Uint8Array(n);
    for (let i = 0; i < n; i++) if (!coverHasCubeExcept(f, i, dc, f[i]!, nvars)) essential[i] = 1;
    const base: Cube[] = [...dc];
    for (let i = 0; i < n; i++) if (essential[i]) base.push(f[i]!);
    const partial: number[] = [];
    for (let i = 0; i < n; i++) if (!essential[i] && !coverHasCube(base, f[i]!, nvars)) partial.push(i);
    if (partial.length === 0) return f.filter((_, i) => essential[i] === 1);
    const lits = f.map((c) => cubeLiteralCount(c, nvars));
    const keep = new Uint8Array(n);
    for (const i of partial) keep[i] = 1;
    // Smallest cubes first: removing them costs the most literals.
    partial.sort((a, b) => lits[b]! - lits[a]! || a - b);
    for (const i of partial) {
        const rest: Cube[] = [...base];
        for (const j of partial) if (j !== i && keep[j]) rest.push(f[j]!);
        if (coverHasCube(rest, f[i]!, nvars)) keep[i] = 0;
    }
    return f.filter((_, i) => essential[i] === 1 || keep[i] === 1);
}
