/**
 * Lock-up and recovery of the as-built machine, two ways that must agree:
 * - explicit: tabulate next(code, input) for every code and input (small machines);
 * - symbolic: BDDs over inputs x, state bits q and next-state bits q' (order: x on top, then
 *   q_i, q'_i interleaved), the transition relation kept partitioned per bit,
 *   T_i = (q'_i ↔ f_i(q, x)), and the preimage ∃x ∃q'. Z(q') ∧ Π T_i computed by relational
 *   products that quantify q'_i as soon as T_i is conjoined.
 * Both compute the greatest fixpoint Z = νZ. unused ∧ pre(Z) — the codes that can stay among
 *   unused codes forever (lock-up iff Z ≠ ∅) — and the backward layers R_0 = used,
 *   R_k = R_{k-1} ∪ {u | every input leads into R_{k-1}}: a code's worst-case recovery latency
 *   is the first k with u ∈ R_k (adversarial inputs).
 */
import type { Machine } from '../model/machine.js';
import type { SynthesisResult } from '../synthesis/types.js';
import { FREE, ONE, getVar } from '../boolean/cube.js';
import type { Cube } from '../boolean/cube.js';
import { Bdd, BddLimitError, type BddNode } from './bdd.js';
import { codeText, excitationCovers, inputsByName, packedNextCode } from './next-code.js';

export interface CycleStep {
    /** Code, MSB first. */
    readonly code: string;
    /** The inputs that move this code to the next step's code (the last step returns to the first). */
    readonly inputs: Readonly<Record<string, number>>;
}

export interface SafetyAnalysis {
    readonly method: 'explicit' | 'symbolic';
    readonly width: number;
    readonly usedCodes: number;
    /** 2^width − used codes (a float above 2^53). */
    readonly unusedCodes: number;
    readonly lockup: boolean;
    /** A cycle of unused codes (lock-up witness). */
    readonly cycle?: readonly CycleStep[];
    /** Worst-case clocks from an unused code to a used one, when there is no lock-up. */
    readonly worstLatency?: number;
    readonly worstLatencyCode?: string;
    /** The all-zero code (what `reset … clear` loads). */
    readonly zero: { readonly used: boolean; readonly stuck: boolean; readonly latency?: number };
    /** True when the code can stay among unused codes forever (the fixpoint Z). */
    canStayUnused(code: string): boolean;
    /** Worst-case clocks to a used code (0 for used codes); undefined for codes in Z. */
    latency(code: string): number | undefined;
    /** From a code in Z: steps that stay in Z until a code repeats (the last step's inputs lead back into the walk). */
    walkFrom(code: string): CycleStep[];
    /**
     * A lock-up cycle that does not come from `code`'s own trajectory: a cycle of unused codes none
     * of which can be reached from `code` while staying in Z (undefined when every lock-up cycle is
     * one `code` can run into). Used to avoid reporting `lockup` again for the cycle `reset-code`
     * already reports. Symbolic: may throw BddLimitError.
     */
    independentCycle(code: string): CycleStep[] | undefined;
}

const now = (): number => Date.now();

function usedSet(result: SynthesisResult): Set<string> {
    return new Set(result.assignment.codes);
}

/** Explicit enumeration; needs width + input variables ≤ 30 (callers keep it far smaller). */
export function explicitSafety(result: SynthesisResult, deadline = Infinity): SafetyAnalysis {
    const machine = result.machine;
    const w = result.assignment.width;
    const nI = result.inputCount;
    const N = 2 ** w;
    const X = 2 ** nI;
    const next = packedNextCode(result);
    const table = new Int32Array(N * X);
    for (let u = 0; u < N; u++) {
        if ((u & 0xff) === 0 && now() > deadline) throw new BddLimitError('explicit: time budget exhausted');
        for (let x = 0; x < X; x++) table[u * X + x] = next(u, x);
    }
    const used = new Uint8Array(N);
    for (const c of usedSet(result)) used[parseInt(c, 2)] = 1;
    // Greatest fixpoint: unused codes with some successor in the set.
    const inZ = new Uint8Array(N);
    for (let u = 0; u < N; u++) inZ[u] = used[u] ? 0 : 1;
    for (let changed = true; changed;) {
        changed = false;
        for (let u = 0; u < N; u++) {
            if (!inZ[u]) continue;
            let stays = false;
            for (let x = 0; x < X && !stays; x++) if (inZ[table[u * X + x]!]) stays = true;
            if (!stays) { inZ[u] = 0; changed = true; }
        }
    }
    // Backward layers from the used codes.
    const lat = new Int32Array(N).fill(-1);
    for (let u = 0; u < N; u++) if (used[u]) lat[u] = 0;
    let worst = 0, worstCode = -1;
    for (let k = 1; ; k++) {
        const layer: number[] = [];
        for (let u = 0; u < N; u++) {
            if (lat[u] !== -1) continue;
            let all = true;
            for (let x = 0; x < X && all; x++) { const l = lat[table[u * X + x]!]!; if (l < 0 || l >= k) all = false; }
            if (all) layer.push(u);
        }
        if (layer.length === 0) break;
        for (const u of layer) lat[u] = k;
        worst = k; worstCode = layer[0]!;
    }
    let zLeft = 0;
    for (let u = 0; u < N; u++) if (inZ[u]) zLeft++;
    const lockup = zLeft > 0;
    const walk = (from: number, cycleOnly: boolean, inSet: Uint8Array = inZ): CycleStep[] => {
        let u = from;
        const seen = new Map<number, number>();
        const path: { code: number; x: number }[] = [];
        while (!seen.has(u) && inSet[u]) {
            seen.set(u, path.length);
            let x = 0;
            while (!inSet[table[u * X + x]!]) x++;
            path.push({ code: u, x });
            u = table[u * X + x]!;
        }
        return path.slice(cycleOnly ? seen.get(u) ?? 0 : 0).map((p) => ({
            code: codeText((i) => (p.code >> i) & 1, w),
            inputs: inputsByName(machine, (v) => (p.x >> v) & 1),
        }));
    };
    const cycle = lockup ? walk(inZ.indexOf(1), true) : undefined;
    const zeroLat = lat[0]!;
    const independentCycle = (code: string): CycleStep[] | undefined => {
        // Codes `code` can reach inside Z (closed under Z-successors, so every cycle lies wholly inside or outside).
        const from = parseInt(code, 2);
        const reach = new Uint8Array(N);
        const stack: number[] = [];
        if (inZ[from]) { reach[from] = 1; stack.push(from); }
        while (stack.length > 0) {
            const u = stack.pop()!;
            for (let x = 0; x < X; x++) {
                const v = table[u * X + x]!;
                if (inZ[v] && !reach[v]) { reach[v] = 1; stack.push(v); }
            }
        }
        // Greatest fixpoint again, on Z without that trajectory.
        const rest = new Uint8Array(N);
        let any = false;
        for (let u = 0; u < N; u++) if (inZ[u] && !reach[u]) { rest[u] = 1; any = true; }
        for (let changed = any; changed;) {
            changed = false;
            for (let u = 0; u < N; u++) {
                if (!rest[u]) continue;
                let stays = false;
                for (let x = 0; x < X && !stays; x++) if (rest[table[u * X + x]!]) stays = true;
                if (!stays) { rest[u] = 0; changed = true; }
            }
        }
        const start = rest.indexOf(1);
        return start < 0 ? undefined : walk(start, true, rest);
    };
    return {
        method: 'explicit',
        width: w,
        usedCodes: usedSet(result).size,
        unusedCodes: N - usedSet(result).size,
        lockup,
        cycle,
        worstLatency: lockup ? undefined : worst,
        worstLatencyCode: lockup || worstCode < 0 ? undefined : codeText((i) => (worstCode >> i) & 1, w),
        zero: { used: used[0] === 1, stuck: inZ[0] === 1, latency: zeroLat >= 0 ? zeroLat : undefined },
        canStayUnused: (code) => inZ[parseInt(code, 2)] === 1,
        latency: (code) => { const l = lat[parseInt(code, 2)]!; return l >= 0 ? l : undefined; },
        walkFrom: (code) => walk(parseInt(code, 2), false),
        independentCycle,
    };
}

export interface SymbolicOptions {
    readonly deadline?: number;
    readonly maxNodes?: number;
}

/** Symbolic analysis with the BDD package (any width the node budget allows). */
export function symbolicSafety(result: SynthesisResult, options: SymbolicOptions = {}): SafetyAnalysis {
    const machine: Machine = result.machine;
    const w = result.assignment.width;
    const nI = result.inputCount;
    const nvars = result.variables.length;
    const bdd = new Bdd(nI + 2 * w, { deadline: options.deadline, maxNodes: options.maxNodes });
    const qLevel = (i: number) => nI + 2 * i;
    const pLevel = (i: number) => nI + 2 * i + 1;
    const levelOfVar = (v: number) => (v < nI ? v : qLevel(v - nI));
    const cubeBdd = (c: Cube): BddNode => {
        const lits: [number, boolean][] = [];
        for (let v = 0; v < nvars; v++) {
            const f = getVar(c, v);
            if (f !== FREE) lits.push([levelOfVar(v), f === ONE]);
        }
        lits.sort((a, b) => b[0] - a[0]);
        let acc = Bdd.TRUE;
        for (const [level, positive] of lits) acc = positive ? bdd.mk(level, Bdd.FALSE, acc) : bdd.mk(level, acc, Bdd.FALSE);
        return acc;
    };
    const coverBdd = (cover: readonly Cube[]): BddNode => cover.reduce((acc, c) => bdd.or(acc, cubeBdd(c)), Bdd.FALSE);
    const covers = excitationCovers(result);
    const f = covers.map((ports, i) => {
        const p = ports.map(coverBdd);
        const q = bdd.variable(qLevel(i));
        switch (result.flipflop) {
            case 'D': return p[0]!;
            case 'T': return bdd.xor(q, p[0]!);
            case 'JK': return bdd.ite(q, bdd.not(p[1]!), p[0]!);
            case 'SR': return bdd.ite(q, bdd.or(p[0]!, bdd.not(p[1]!)), p[0]!);
        }
    });
    const relation = f.map((fi, i) => bdd.xnor(bdd.variable(pLevel(i)), fi));
    const codes = [...usedSet(result)];
    const codeBdd = (code: string, level: (i: number) => number): BddNode => {
        let acc = Bdd.TRUE;
        for (let i = w - 1; i >= 0; i--) {
            const bit = code[code.length - 1 - i] === '1';
            acc = bit ? bdd.mk(level(i), Bdd.FALSE, acc) : bdd.mk(level(i), acc, Bdd.FALSE);
        }
        return acc;
    };
    const used = codes.reduce((acc, c) => bdd.or(acc, codeBdd(c, qLevel)), Bdd.FALSE);
    const toPrimed = new Int32Array(nI + 2 * w);
    for (let l = 0; l < toPrimed.length; l++) toPrimed[l] = l;
    for (let i = 0; i < w; i++) toPrimed[qLevel(i)] = pLevel(i);
    const primedMasks = Array.from({ length: w }, (_, i) => { const m = new Uint8Array(nI + 2 * w); m[pLevel(i)] = 1; return m; });
    const inputMask = new Uint8Array(nI + 2 * w);
    for (let v = 0; v < nI; v++) inputMask[v] = 1;
    /** Codes with some input leading into S: ∃x ∃q'. S(q') ∧ Π_i (q'_i ↔ f_i). */
    const pre = (s: BddNode): BddNode => {
        let acc = bdd.rename(s, toPrimed);
        for (let i = w - 1; i >= 0; i--) acc = bdd.andExists(acc, relation[i]!, primedMasks[i]!);
        return bdd.exists(acc, inputMask);
    };
    // Greatest fixpoint of "unused with a successor in the set".
    let z = bdd.not(used);
    for (;;) {
        const next = bdd.and(z, pre(z));
        if (next === z) break;
        z = next;
    }
    // Backward layers.
    const layers: BddNode[] = [used];
    for (;;) {
        const r = layers[layers.length - 1]!;
        const escapes = pre(bdd.not(r));
        const grown = bdd.or(r, bdd.not(escapes));
        if (grown === r) break;
        layers.push(grown);
    }
    const lockup = z !== Bdd.FALSE;
    const bitsOf = (code: string): Uint8Array => {
        const bits = new Uint8Array(nI + 2 * w);
        for (let i = 0; i < w; i++) bits[qLevel(i)] = code[code.length - 1 - i] === '1' ? 1 : 0;
        return bits;
    };
    const latencyOf = (code: string): number | undefined => {
        const bits = bitsOf(code);
        for (let k = 0; k < layers.length; k++) if (bdd.evaluate(layers[k]!, bits)) return k;
        return undefined;
    };
    const zPrimed = bdd.rename(z, toPrimed);
    const walk = (from: string, cycleOnly: boolean, set: BddNode = z, setPrimed: BddNode = zPrimed): CycleStep[] => {
        let u = from;
        const seen = new Map<string, number>();
        const path: CycleStep[] = [];
        while (!seen.has(u) && path.length < 4096 && bdd.evaluate(set, bitsOf(u))) {
            seen.set(u, path.length);
            const values = new Int8Array(nI + 2 * w).fill(-1);
            for (let i = 0; i < w; i++) values[qLevel(i)] = u[u.length - 1 - i] === '1' ? 1 : 0;
            let rel = setPrimed;
            for (let i = 0; i < w; i++) rel = bdd.and(rel, bdd.restrict(relation[i]!, values));
            const sat = bdd.satOne(rel)!;
            path.push({ code: u, inputs: inputsByName(machine, (v) => sat[v]!) });
            u = codeText((i) => sat[pLevel(i)]!, w);
        }
        return cycleOnly && seen.has(u) ? path.slice(seen.get(u)) : path;
    };
    let cycle: CycleStep[] | undefined;
    if (lockup) {
        const start = bdd.satOne(z)!;
        cycle = walk(codeText((i) => start[qLevel(i)]!, w), true);
    }
    const last = layers.length - 1;
    let worstLatencyCode: string | undefined;
    if (!lockup && last > 0) {
        const sat = bdd.satOne(bdd.and(layers[last]!, bdd.not(layers[last - 1]!)))!;
        worstLatencyCode = codeText((i) => sat[qLevel(i)]!, w);
    }
    const zero = '0'.repeat(w);
    const zeroBits = bitsOf(zero);
    // Image of a set of codes: ∃q ∃x. S(q) ∧ Π_i (q'_i ↔ f_i), renamed back to q.
    const fromPrimed = new Int32Array(nI + 2 * w);
    for (let l = 0; l < fromPrimed.length; l++) fromPrimed[l] = l;
    for (let i = 0; i < w; i++) fromPrimed[pLevel(i)] = qLevel(i);
    const presentMask = new Uint8Array(nI + 2 * w);
    for (let v = 0; v < nI; v++) presentMask[v] = 1;
    for (let i = 0; i < w; i++) presentMask[qLevel(i)] = 1;
    const post = (s: BddNode): BddNode => {
        let acc = s;
        for (let i = 0; i < w - 1; i++) acc = bdd.and(acc, relation[i]!);
        return bdd.rename(bdd.andExists(acc, relation[w - 1]!, presentMask), fromPrimed);
    };
    const independentCycle = (code: string): CycleStep[] | undefined => {
        if (!bdd.evaluate(z, bitsOf(code))) return cycle;
        let reach = bdd.and(z, codeBdd(code, qLevel));
        for (;;) {
            const grown = bdd.or(reach, bdd.and(z, post(reach)));
            if (grown === reach) break;
            reach = grown;
        }
        let rest = bdd.and(z, bdd.not(reach));
        for (;;) {
            const next = bdd.and(rest, pre(rest));
            if (next === rest) break;
            rest = next;
        }
        if (rest === Bdd.FALSE) return undefined;
        const start = bdd.satOne(rest)!;
        return walk(codeText((i) => start[qLevel(i)]!, w), true, rest, bdd.rename(rest, toPrimed));
    };
    return {
        method: 'symbolic',
        width: w,
        usedCodes: codes.length,
        unusedCodes: 2 ** w - codes.length,
        lockup,
        cycle,
        worstLatency: lockup ? undefined : last,
        worstLatencyCode,
        zero: { used: bdd.evaluate(used, zeroBits), stuck: bdd.evaluate(z, zeroBits), latency: latencyOf(zero) },
        canStayUnused: (code) => bdd.evaluate(z, bitsOf(code)),
        latency: latencyOf,
        walkFrom: (code) => walk(code, false),
        independentCycle,
    };
}
