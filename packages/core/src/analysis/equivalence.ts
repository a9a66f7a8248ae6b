/**
 * `equivalent`: states no input sequence can tell apart, by partition refinement.
 *
 * Observable behaviour of a state for one input: the output vector (Moore overlaid with Mealy)
 * and the class of the next state. Each state's regions (space.ts) partition the input space,
 * so two states behave alike for the current partition exactly when every pair of
 * intersecting regions agrees on both — a containment (tautology) test, no enumeration. To avoid
 * comparing every pair, states are first bucketed by a fingerprint: their behaviour at a fixed
 * set of sample inputs (all inputs when there are at most 64), which equal behaviours share.
 *
 * A state whose `otherwise dontcare` covers some input is incompletely specified; it is kept in
 * a class of its own, so every reported pair is equivalent under any completion.
 */
import type { Machine } from '../model/machine.js';
import { type Finding, finding } from '../model/finding.js';
import { type Cube, mintermCube } from '../boolean/cube.js';
import { type MachineSpace, regionHas, regionsIntersect } from './space.js';

const MAX_SAMPLES = 64;

/** Deterministic sample minterms: every minterm for small spaces, otherwise a fixed pseudo-random set. */
function sampleMinterms(nvars: number): { cubes: Cube[]; exhaustive: boolean } {
    if (nvars <= 6) {
        const cubes: Cube[] = [];
        for (let m = 0; m < 2 ** nvars; m++) cubes.push(mintermCube(nvars, (v) => ((m >>> v) & 1) as 0 | 1));
        return { cubes, exhaustive: true };
    }
    let seed = 0x9e3779b9;
    const next = () => { seed = (Math.imul(seed ^ (seed >>> 15), 0x2c1b3c6d) + 0x6d2b79f5) >>> 0; return seed; };
    const cubes: Cube[] = [mintermCube(nvars, () => 0), mintermCube(nvars, () => 1)];
    while (cubes.length < MAX_SAMPLES) {
        const words = Array.from({ length: Math.ceil(nvars / 32) }, next);
        cubes.push(mintermCube(nvars, (v) => ((words[v >>> 5]! >>> (v & 31)) & 1) as 0 | 1));
    }
    return { cubes, exhaustive: false };
}

/** Final class of every state (class ids numbered by first member in declaration order). */
export function equivalenceClasses(machine: Machine, space: MachineSpace): Int32Array {
    const n = machine.states.length;
    const nvars = space.ctx.nvars;
    const { cubes: samples, exhaustive } = sampleMinterms(nvars);
    // Region index of every state at every sample.
    const at: Int32Array[] = space.states.map((st) => {
        const idx = new Int32Array(samples.length);
        samples.forEach((m, k) => {
            idx[k] = st.regions.findIndex((r) => regionHas(r, m, nvars));
        });
        return idx;
    });
    let cls = new Int32Array(n);
    let special = 0;
    space.states.forEach((st, s) => { if (st.dontcare) { cls[s] = -1 - special++; } });
    let count = special + (space.states.some((st) => !st.dontcare) ? 1 : 0);

    const sameStep = (a: number, b: number, c: Int32Array): boolean => {
        for (const ra of space.states[a]!.regions) for (const rb of space.states[b]!.regions) {
            if (ra.outputs === rb.outputs && c[ra.target] === c[rb.target]) continue;
            if (regionsIntersect(ra, rb, nvars)) return false;
        }
        return true;
    };

    const width = 1 + 2 * samples.length;
    const sig = new Int32Array(n * width);
    const hashes = new Uint32Array(n);
    const sameSig = (a: number, b: number): boolean => {
        for (let k = 0; k < width; k++) if (sig[a * width + k] !== sig[b * width + k]) return false;
        return true;
    };
    for (;;) {
        // Signature: own class, then (outputs, next class) at every sample; hashed (FNV-1a) for bucketing.
        const buckets = new Map<number, number[]>();
        for (let s = 0; s < n; s++) {
            const regions = space.states[s]!.regions;
            const idx = at[s]!;
            const base = s * width;
            sig[base] = cls[s]!;
            let h = (0x811c9dc5 ^ cls[s]!) >>> 0;
            for (let k = 0; k < idx.length; k++) {
                const r = regions[idx[k]!]!;
                const o = r.outputs;
                const t = cls[r.target]!;
                sig[base + 1 + 2 * k] = o;
                sig[base + 2 + 2 * k] = t;
                h = Math.imul(h ^ o, 0x01000193) >>> 0;
                h = Math.imul(h ^ t, 0x01000193) >>> 0;
            }
            hashes[s] = h;
            const bucket = buckets.get(h);
            if (bucket) bucket.push(s); else buckets.set(h, [s]);
        }
        // Class ids are handed out in order of each class's first member, i.e. declaration order.
        const next = new Int32Array(n).fill(-1);
        const reps: number[] = [];
        let fresh = 0;
        for (let s = 0; s < n; s++) {
            if (next[s] !== -1) continue;
            next[s] = fresh;
            reps.push(s);
            for (const t of buckets.get(hashes[s]!)!) {
                if (t <= s || next[t] !== -1) continue;
                if (sameSig(s, t) && (exhaustive || sameStep(s, t, cls))) next[t] = fresh;
            }
            fresh++;
        }
        cls = next;
        if (fresh === count) break;
        count = fresh;
    }
    return cls;
}

export function equivalenceFindings(machine: Machine, space: MachineSpace): Finding[] {
    const cls = equivalenceClasses(machine, space);
    const first = new Map<number, number>();
    const out: Finding[] = [];
    machine.states.forEach((state, s) => {
        const c = cls[s]!;
        const p = first.get(c);
        if (p === undefined) { first.set(c, s); return; }
        const partner = machine.states[p]!;
        out.push(finding('equivalent',
            `state '${state.name}' cannot be told apart from state '${partner.name}' by any input sequence (same outputs, equivalent next states); the two can be merged`,
            state.nameRange, { state: state.name, related: [{ message: `equivalent state '${partner.name}'`, range: partner.nameRange }] }));
    });
    return out;
}
