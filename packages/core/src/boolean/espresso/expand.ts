/**
 * EXPAND: grows every cube of a cover into a prime implicant of ON ∪ DC, preferring directions
 * that swallow other cubes of the cover (which IRREDUNDANT can then drop).
 *
 * Two ways to know how far a cube may grow:
 *  - against the OFF-set (complement of ON ∪ DC, computed once): the "blocking matrix" of the
 *    cube, one row per OFF cube listing the variables that keep them apart;
 *  - by containment checks in ON ∪ DC (tautology of a cofactor), when the OFF-set would be
 *    too large to compute — one-hot style covers have exponentially large complements.
 */
import { cpuNow } from '../clock.js';
import { type Cube, wordMask, wordsFor } from '../cube.js';
import { coverHasCube, literalBits, popcount32 } from './unate.js';

const LOW = 0x55555555;

export interface ExpandTarget {
    /** OFF-set cover, or null to expand by containment checks in `care`. */
    readonly off: readonly Cube[] | null;
    /** ON ∪ DC. */
    readonly care: readonly Cube[];
}

export function cubeLiteralCount(c: Cube, nvars: number): number {
    let n = 0;
    for (let w = 0; w < c.length; w++) n += popcount32(literalBits(c[w]!, wordMask(nvars, w)));
    return n;
}

/**
 * Expands every cube of f to a prime; cubes swallowed by an earlier prime disappear. Past the
 * (CPU) deadline the remaining cubes are kept as they are: still implicants, so the cover stays
 * valid, only less minimized — a budget must bound the slowest call, not just the loop around it.
 */
export function expand(f: readonly Cube[], nvars: number, target: ExpandTarget, deadline = Infinity): Cube[] {
    const words = wordsFor(nvars);
    const masks = new Uint32Array(words);
    for (let w = 0; w < words; w++) masks[w] = wordMask(nvars, w) & LOW;
    const lits = f.map((c) => cubeLiteralCount(c, nvars));
    // Largest cubes first: they are the most likely to become primes that cover others.
    const order = f.map((_, i) => i).sort((a, b) => lits[a]! - lits[b]! || a - b);
    const covered = new Uint8Array(f.length);
    const primes: Cube[] = [];
    const rowMasks = target.off ? new Uint32Array(target.off.length * words) : null;
    const scratch = target.off ? { active: new Int32Array(target.off.length), hits: new Int32Array(target.off.length) } : null;
    // One-word OFF cubes as one flat array: read for every cube expanded.
    const offWords = target.off && words === 1 ? Uint32Array.from(target.off, (o) => o[0]!) : null;
    let expired = false;
    for (const i of order) {
        if (covered[i]) continue;
        covered[i] = 1;
        if (!expired && deadline !== Infinity && cpuNow() > deadline) expired = true;
        if (expired) { primes.push(f[i]!); continue; }
        const p = target.off
            ? words === 1
                ? expandAgainstOffWord(i, f, covered, offWords!, rowMasks!, scratch!, masks)
                : expandAgainstOff(i, f, covered, target.off, rowMasks!, scratch!, masks, nvars)
            : expandByContainment(i, f, covered, target.care, masks, nvars, deadline);
        for (let j = 0; j < f.length; j++) {
            if (covered[j]) continue;
            const d = f[j]!;
            let inside = true;
            for (let w = 0; w < words; w++) if (((p[w]! & d[w]!) >>> 0) !== d[w]) { inside = false; break; }
            if (inside) covered[j] = 1;
        }
        primes.push(p);
    }
    return primes;
}

/** Low bits of the fields where d has a value the current cube lacks (what supercube raises). */
function needBits(cur: Cube, d: Cube, w: number, mask: number): number {
    const diff = d[w]! & ~cur[w]!;
    return (diff | (diff >>> 1)) & mask;
}

/** Uncovered cubes other than i, nearest to cur first (fewest raises to reach them). */
function candidatesByDistance(i: number, f: readonly Cube[], covered: Uint8Array, cur: Cube, masks: Uint32Array): Float64Array {
    const words = masks.length;
    const keys = new Float64Array(f.length);
    let k = 0;
    for (let j = 0; j < f.length; j++) {
        if (covered[j] || j === i) continue;
        const d = f[j]!;
        let n = 0;
        for (let w = 0; w < words; w++) n += popcount32(needBits(cur, d, w, masks[w]!));
        keys[k++] = n * 4194304 + j;
    }
    return keys.subarray(0, k).sort();
}

/** candidatesByDistance for one-word cubes (same keys, same order), without a cube per call. */
function candidatesByDistanceWord(i: number, f: readonly Cube[], covered: Uint8Array, cur: number, mask: number): Float64Array {
    const keys = new Float64Array(f.length);
    let k = 0;
    for (let j = 0; j < f.length; j++) {
        if (covered[j] || j === i) continue;
        const diff = f[j]![0]! & ~cur;
        keys[k++] = popcount32((diff | (diff >>> 1)) & mask) * 4194304 + j;
    }
    return keys.subarray(0, k).sort();
}

function expandAgainstOff(
    i: number, f: readonly Cube[], covered: Uint8Array, off: readonly Cube[], rowMask: Uint32Array,
    scratch: { readonly active: Int32Array; readonly hits: Int32Array }, masks: Uint32Array, nvars: number,
): Cube {
    void nvars;
    const words = masks.length;
    const c = f[i]!;
    const cur = c.slice();
    const free = new Uint32Array(words);
    const lowered = new Uint32Array(words);
    for (let w = 0; w < words; w++) free[w] = (c[w]! ^ (c[w]! >>> 1)) & masks[w]!;
    const nRows = off.length;
    const active = scratch.active;
    let nActive = 0;
    for (let r = 0; r < nRows; r++) {
        const o = off[r]!;
        let any = 0;
        for (let w = 0; w < words; w++) {
            const x = c[w]! & o[w]!;
            const m = ~(x | (x >>> 1)) & masks[w]!;
            rowMask[r * words + w] = m;
            any |= m;
        }
        if (any === 0) throw new Error('expand: a cube of the cover meets the OFF-set');
        active[nActive++] = r;
    }

    // Drops rows already kept apart by a lowered variable; a row with one raisable variable left
    // forces that variable to stay (it becomes lowered). One pass suffices: lowering a variable
    // satisfies every row holding it and leaves the others as they were.
    const settleRows = (): void => {
        let k = 0;
        let loweredSome = false;
        for (let a = 0; a < nActive; a++) {
            const r = active[a]!;
            const base = r * words;
            let hit = false;
            for (let w = 0; w < words; w++) if ((rowMask[base + w]! & lowered[w]!) !== 0) { hit = true; break; }
            if (hit) continue;
            let count = 0;
            let bw = -1;
            let bit = 0;
            for (let w = 0; w < words && count < 2; w++) {
                const y = rowMask[base + w]! & free[w]!;
                if (y !== 0) {
                    count += (y & (y - 1)) === 0 ? 1 : 2;
                    bw = w;
                    bit = y;
                }
            }
            if (count === 0) throw new Error('expand: expansion met the OFF-set');
            if (count === 1) {
                lowered[bw] = (lowered[bw]! | bit) >>> 0;
                free[bw] = (free[bw]! & ~bit) >>> 0;
                loweredSome = true;
                continue;
            }
            active[k++] = r;
        }
        nActive = k;
        if (!loweredSome) return;
        // Rows kept earlier in the pass may hold a variable lowered later: drop those too.
        k = 0;
        for (let a = 0; a < nActive; a++) {
            const base = active[a]! * words;
            let hit = false;
            for (let w = 0; w < words; w++) if ((rowMask[base + w]! & lowered[w]!) !== 0) { hit = true; break; }
            if (!hit) active[k++] = active[a]!;
        }
        nActive = k;
    };
    settleRows();

    // Raise towards other cubes of the cover, nearest first, while the result stays off the OFF-set.
    if (nActive > 0) {
        const need = new Uint32Array(words);
        for (const key of candidatesByDistance(i, f, covered, cur, masks)) {
            if (nActive === 0) break;
            const d = f[key % 4194304]!;
            let blocked = false;
            let any = 0;
            for (let w = 0; w < words; w++) {
                need[w] = needBits(cur, d, w, masks[w]!);
                if ((need[w]! & lowered[w]!) !== 0) blocked = true;
                any |= need[w]!;
            }
            if (blocked || any === 0) continue;
            let feasible = true;
            for (let a = 0; a < nActive; a++) {
                const base = active[a]! * words;
                let ok = false;
                for (let w = 0; w < words; w++) if ((rowMask[base + w]! & free[w]! & ~need[w]!) !== 0) { ok = true; break; }
                if (!ok) {
                    feasible = false;
                    // Move the blocking row to the front: it tends to block the next candidates too.
                    if (a > 0) { const r = active[a]!; active[a] = active[0]!; active[0] = r; }
                    break;
                }
            }
            if (!feasible) continue;
            for (let w = 0; w < words; w++) {
                free[w] = (free[w]! & ~need[w]!) >>> 0;
                cur[w] = (cur[w]! | need[w]! | (need[w]! << 1)) >>> 0;
            }
            settleRows();
        }
    }

    // What is left: keep a small set of variables that separates every remaining OFF cube
    // (greedy column cover of the blocking matrix), raise everything else.
    const counts = new Int32Array(words * 16);
    while (nActive > 0) {
        counts.fill(0);
        for (let a = 0; a < nActive; a++) {
            const base = active[a]! * words;
            for (let w = 0; w < words; w++) {
                let y = rowMask[base + w]! & free[w]!;
                while (y !== 0) {
                    const b = y & -y;
                    counts[w * 16 + ((31 - Math.clz32(b)) >>> 1)]!++;
                    y ^= b;
                }
            }
        }
        let best = 0;
        for (let v = 1; v < counts.length; v++) if (counts[v]! > counts[best]!) best = v;
        const bw = best >>> 4;
        const bit = 1 << ((best & 15) << 1);
        lowered[bw] = (lowered[bw]! | bit) >>> 0;
        free[bw] = (free[bw]! & ~bit) >>> 0;
        settleRows();
    }
    for (let w = 0; w < words; w++) cur[w] = (cur[w]! | free[w]! | (free[w]! << 1)) >>> 0;

    // Make it prime: drop any kept variable whose every OFF row is also separated by another one.
    const hits = scratch.hits;
    for (let r = 0; r < nRows; r++) {
        let n = 0;
        for (let w = 0; w < words; w++) n += popcount32(rowMask[r * words + w]! & lowered[w]!);
        hits[r] = n;
    }
    for (let w = 0; w < words; w++) {
        let y = lowered[w]!;
        while (y !== 0) {
            const b = y & -y;
            y ^= b;
            let needed = false;
            for (let r = 0; r < nRows; r++) if ((rowMask[r * words + w]! & b) !== 0 && hits[r] === 1) { needed = true; break; }
            if (needed) continue;
            for (let r = 0; r < nRows; r++) if ((rowMask[r * words + w]! & b) !== 0) hits[r]!--;
            lowered[w] = (lowered[w]! & ~b) >>> 0;
            cur[w] = (cur[w]! | b | (b << 1)) >>> 0;
        }
    }
    return cur;
}

/** Containment checks made per cube while trying to swallow neighbours (bounds the cost). */
const MAX_NEIGHBOUR_CHECKS = 8;

function expandByContainment(
    i: number, f: readonly Cube[], covered: Uint8Array, care: readonly Cube[], masks: Uint32Array, nvars: number, deadline: number,
): Cube {
    const words = masks.length;
    let cur = f[i]!.slice();
    let checks = 0;
    for (const key of candidatesByDistance(i, f, covered, cur, masks)) {
        if (checks >= MAX_NEIGHBOUR_CHECKS) break;
        const d = f[key % 4194304]!;
        const s = new Uint32Array(words);
        let grows = false;
        for (let w = 0; w < words; w++) { s[w] = (cur[w]! | d[w]!) >>> 0; if (s[w] !== cur[w]) grows = true; }
        if (!grows) continue;
        checks++;
        if (coverHasCube(care, s, nvars)) cur = s;
    }
    // Raise each remaining literal that can go; one pass yields a prime (a literal that cannot
    // be raised now cannot be raised after other raises either).
    for (let w = 0; w < words; w++) {
        let y = (cur[w]! ^ (cur[w]! >>> 1)) & masks[w]!;
        while (y !== 0) {
            // Each check is a tautology over ON ∪ DC; past the deadline, stop raising (cur is an implicant).
            if (deadline !== Infinity && cpuNow() > deadline) return cur;
            const b = y & -y;
            y ^= b;
            const s = cur.slice();
            s[w] = (s[w]! | b | (b << 1)) >>> 0;
            if (coverHasCube(care, s, nvars)) cur = s;
        }
    }
    return cur;
}

/** expandAgainstOff for one-word cubes (up to 16 variables): the same steps on plain numbers. */
function expandAgainstOffWord(
    i: number, f: readonly Cube[], covered: Uint8Array, off: Uint32Array, rowMask: Uint32Array,
    scratch: { readonly active: Int32Array; readonly hits: Int32Array }, masks: Uint32Array,
): Cube {
    const mask = masks[0]!;
    const c = f[i]![0]!;
    let cur = c;
    let free = (c ^ (c >>> 1)) & mask;
    let lowered = 0;
    const active = scratch.active;
    const nRows = off.length;
    let nActive = 0;
    for (let r = 0; r < nRows; r++) {
        const x = c & off[r]!;
        const m = ~(x | (x >>> 1)) & mask;
        if (m === 0) throw new Error('expand: a cube of the cover meets the OFF-set');
        rowMask[r] = m;
        active[nActive++] = r;
    }
    const settleRows = (): void => {
        let k = 0;
        let loweredSome = false;
        for (let a = 0; a < nActive; a++) {
            const r = active[a]!;
            const m = rowMask[r]!;
            if ((m & lowered) !== 0) continue;
            const y = m & free;
            if (y === 0) throw new Error('expand: expansion met the OFF-set');
            if ((y & (y - 1)) === 0) { lowered |= y; free &= ~y; loweredSome = true; continue; }
            active[k++] = r;
        }
        nActive = k;
        if (!loweredSome) return;
        k = 0;
        for (let a = 0; a < nActive; a++) if ((rowMask[active[a]!]! & lowered) === 0) active[k++] = active[a]!;
        nActive = k;
    };
    settleRows();
    if (nActive > 0) {
        for (const key of candidatesByDistanceWord(i, f, covered, cur, mask)) {
            if (nActive === 0) break;
            const d = f[key % 4194304]![0]!;
            const diff = d & ~cur;
            const need = (diff | (diff >>> 1)) & mask;
            if (need === 0 || (need & lowered) !== 0) continue;
            const keep = free & ~need;
            let feasible = true;
            for (let a = 0; a < nActive; a++) {
                if ((rowMask[active[a]!]! & keep) === 0) {
                    feasible = false;
                    if (a > 0) { const r = active[a]!; active[a] = active[0]!; active[0] = r; }
                    break;
                }
            }
            if (!feasible) continue;
            free = keep;
            cur = (cur | need | (need << 1)) >>> 0;
            settleRows();
        }
    }
    const counts = new Int32Array(16);
    while (nActive > 0) {
        counts.fill(0);
        for (let a = 0; a < nActive; a++) {
            let y = rowMask[active[a]!]! & free;
            while (y !== 0) {
                const b = y & -y;
                counts[(31 - Math.clz32(b)) >>> 1]!++;
                y ^= b;
            }
        }
        let best = 0;
        for (let v = 1; v < 16; v++) if (counts[v]! > counts[best]!) best = v;
        const bit = 1 << (best << 1);
        lowered |= bit;
        free &= ~bit;
        settleRows();
    }
    cur = (cur | free | (free << 1)) >>> 0;
    // Make it prime (as in expandAgainstOff).
    const hits = scratch.hits;
    // Common case first: every kept variable is the only separator of some OFF cube.
    let needed = 0;
    for (let r = 0; r < nRows; r++) {
        const h = rowMask[r]! & lowered;
        hits[r] = popcount32(h);
        if ((h & (h - 1)) === 0) needed |= h;
    }
    let y = lowered & ~needed;
    while (y !== 0) {
        const b = y & -y;
        y ^= b;
        let needed = false;
        for (let r = 0; r < nRows; r++) if ((rowMask[r]! & b) !== 0 && hits[r] === 1) { needed = true; break; }
        if (needed) continue;
        for (let r = 0; r < nRows; r++) if ((rowMask[r]! & b) !== 0) hits[r]!--;
        lowered &= ~b;
        cur = (cur | b | (b << 1)) >>> 0;
    }
    return Uint32Array.of(cur);
}
