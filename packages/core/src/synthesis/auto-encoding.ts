/**
 * `encoding auto`: a search for the cheapest state assignment of minimum width ⌈log2 n⌉.
 *
 * Small machines: exhaustive over assignments up to symmetry. Permuting the state bits never
 * changes the cost, so only assignments whose bit columns are in non-decreasing order are tried.
 * For T, JK and SR flip-flops complementing a state bit does not change the cost either (T = Q⊕Q+
 * is unchanged, J/K and S/R swap roles), so one state is pinned to code 0; for D it is not a
 * symmetry (D = Q+ would be complemented) and no state is pinned — except with `reset … clear`,
 * where the initial state must sit on code 0 so that clearing lands in it.
 * Larger machines: a greedy adjacency-driven start (states that share targets or sources get
 * neighbouring codes) and the binary and gray codes, improved by swap/move local search, all
 * within the time budget.
 */
import type { FlipFlopKind, Machine } from '../model/machine.js';
import { initialState } from '../model/machine.js';
import { type StateAssignment, binaryCodes, ceilLog2, grayCodes, toBits } from './encoding.js';
import { compareCost } from './cost.js';
import { type CodesOptions, type SynthesisContext, synthesisContext, synthesizeWithAssignment } from './synthesize.js';
import type { Cost, SynthesisResult } from './types.js';

export interface AutoOptions extends CodesOptions {
    readonly budgetMs?: number;
}

interface Candidate {
    readonly codes: readonly number[];
    readonly result: SynthesisResult;
}

/** Largest number of canonical assignments tried exhaustively (8 states on 3 bits: 840 with T/JK/SR, 6720 with D). */
const EXHAUSTIVE_MAX = 1500;
/** Moves of the swap search. */
const MAX_MOVES = 600;

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

function costText(c: Cost): string {
    return `${c.gateInputs} gate inputs, ${c.literals} literals`;
}

/** Number of injective code assignments n → 2^w, or Infinity when above `cap`. */
function injections(n: number, codes: number, cap: number): number {
    let r = 1;
    for (let i = 0; i < n; i++) {
        r *= codes - i;
        if (r > cap) return Infinity;
    }
    return r;
}

export function autoSynthesize(machine: Machine, flipflop: FlipFlopKind, options: AutoOptions = {}): SynthesisResult {
    const n = machine.states.length;
    const width = Math.max(1, ceilLog2(n));
    const ctx = synthesisContext(machine, width);
    const budget = options.budgetMs ?? 1000;
    const start = now();
    const clear = machine.reset?.target === 'clear';
    const pinned = clear ? initialState(machine) : flipflop !== 'D' ? 0 : -1;
    // Candidates are priced with a short minimizer budget; the winner is synthesized again with the full one.
    const searchOptions: CodesOptions = { ...options, minimizeBudgetMs: Math.min(options.minimizeBudgetMs ?? 50, 50) };
    const evaluate = (codes: readonly number[]): Candidate => {
        const assignment: StateAssignment = { encoding: 'auto', width, codes: codes.map((c) => toBits(c, width)) };
        return { codes, result: synthesizeWithAssignment(ctx, assignment, flipflop, searchOptions) };
    };
    const ranked: Candidate[] = [];
    const seen = new Set<string>();
    // Runners-up that are only a bit permutation (or, for T/JK/SR, complement) of a listed one are noise.
    const complementSymmetric = pinned >= 0 && !clear;
    const canonicalKey = (codes: readonly number[]): string => {
        const columns: string[] = [];
        for (let j = 0; j < width; j++) {
            const flip = complementSymmetric ? (codes[0]! >> j) & 1 : 0;
            columns.push(codes.map((c) => ((c >> j) & 1) ^ flip).join(''));
        }
        return columns.sort().join('|');
    };
    const consider = (c: Candidate) => {
        const key = canonicalKey(c.codes);
        if (seen.has(key)) return;
        seen.add(key);
        ranked.push(c);
        ranked.sort((a, b) => compareCost(a.result.cost, b.result.cost));
        if (ranked.length > 4) ranked.length = 4;
    };
    // Binary (with the pinned state swapped onto 0) is the baseline, and times one evaluation.
    const base = binaryCodes(n).map((c) => parseInt(c, 2));
    if (pinned > 0) { base[base.indexOf(0)] = base[pinned]!; base[pinned] = 0; }
    const t0 = now();
    consider(evaluate(base));
    const perEval = Math.max(0.05, now() - t0);
    // Gray is a baseline too, so that a search cut short by the budget is never worse than it.
    const gray = grayCodes(n).map((c) => parseInt(c, 2));
    if (pinned > 0) { const z = gray.indexOf(0); gray[z] = gray[pinned]!; gray[pinned] = 0; }
    consider(evaluate(gray));
    let method: string;

    const raw = injections(n - (pinned >= 0 ? 1 : 0), 2 ** width - (pinned >= 0 ? 1 : 0), 2e6);
    const canonical = raw === Infinity ? Infinity : countCanonical(n, width, pinned);
    // Reproducible by default: the choice of method and the search length depend on counts, not on
    // the host's speed; the time budget is only a safety net (and the keystroke path's limit).
    if (canonical <= EXHAUSTIVE_MAX && (canonical * perEval <= budget * 3 || budget >= 1000)) {
        let tried = 0;
        enumerateCanonical(n, width, pinned, (codes) => {
            tried++;
            consider(evaluate(codes));
            return now() - start < (budget >= 1000 ? budget * 5 : budget * 1.5);
        });
        method = `exhaustive over ${tried} of ${canonical} assignments (up to bit permutation${pinned >= 0 && !clear ? ' and complement' : ''})`;
    } else {
        method = localSearch(ctx, machine, width, pinned, evaluate, consider, ranked, start, budget);
    }
    const best = ranked[0]!;
    const names = machine.states.map((s) => s.name);
    const codesText = (c: Candidate) => c.codes.map((x, i) => `${names[i]}=${toBits(x, width)}`).join(' ');
    const runnersUp = ranked.slice(1, 4).map((c) => `${codesText(c)} (${costText(c.result.cost)})`);
    const note = `auto: ${method}; chosen ${codesText(best)} (${costText(best.result.cost)})`
        + (runnersUp.length ? `; runners-up: ${runnersUp.join('; ')}` : '')
        + (clear ? `; ${names[pinned]} kept on code 0 for reset clear` : '');
    const final = synthesizeWithAssignment(ctx, best.result.assignment, flipflop, options);
    const chosen = compareCost(final.cost, best.result.cost) <= 0 ? final : best.result;
    return { ...chosen, assignment: { ...chosen.assignment, note } };
}

/** Calls visit for each assignment whose bit columns are non-decreasing; stops when visit returns false. */
function enumerateCanonical(n: number, width: number, pinned: number, visit: (codes: number[]) => boolean): void {
    const codes = new Array<number>(n).fill(-1);
    const used = new Uint8Array(2 ** width);
    if (pinned >= 0) { codes[pinned] = 0; used[0] = 1; }
    let go = true;
    // Column j of the prefix, read with state 0 as the most significant digit.
    const prefixOrdered = (k: number): boolean => {
        for (let j = 0; j + 1 < width; j++) {
            for (let s = 0; s <= k; s++) {
                const a = (codes[s]! >> j) & 1;
                const b = (codes[s]! >> (j + 1)) & 1;
                if (a < b) break; // column j < column j+1 already
                if (a > b) return false;
            }
        }
        return true;
    };
    const rec = (s: number) => {
        if (!go) return;
        if (s === n) { go = visit([...codes]); return; }
        if (s === pinned) { if (prefixOrdered(s)) rec(s + 1); return; }
        for (let c = 0; c < used.length && go; c++) {
            if (used[c]) continue;
            used[c] = 1;
            codes[s] = c;
            if (prefixOrdered(s)) rec(s + 1);
            used[c] = 0;
            codes[s] = -1;
        }
    };
    rec(0);
}

function countCanonical(n: number, width: number, pinned: number): number {
    let count = 0;
    enumerateCanonical(n, width, pinned, () => { count++; return true; });
    return count;
}

function hamming(a: number, b: number): number {
    let x = a ^ b, d = 0;
    while (x) { x &= x - 1; d++; }
    return d;
}

/** Affinity of state pairs: transitions between them, shared targets, shared sources, equal Moore outputs. */
function affinity(machine: Machine): number[][] {
    const n = machine.states.length;
    const w = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    const targets = machine.states.map((s) => new Set([...s.transitions.map((t) => t.target), ...(s.otherwise?.kind === 'goto' ? [s.otherwise.target] : [])]));
    const add = (a: number, b: number, v: number) => { if (a !== b) { w[a]![b]! += v; w[b]![a]! += v; } };
    machine.states.forEach((s, i) => {
        for (const t of targets[i]!) add(i, t, 1);
        for (let j = i + 1; j < n; j++) {
            for (const t of targets[i]!) if (targets[j]!.has(t)) add(i, j, 2);
            const mi = s.emits.map((e) => `${e.output}=${e.value}`).sort().join(',');
            const mj = machine.states[j]!.emits.map((e) => `${e.output}=${e.value}`).sort().join(',');
            if (mi === mj) add(i, j, 1);
        }
    });
    machine.states.forEach((_, i) => machine.states.forEach((_, j) => {
        if (i < j) for (let k = 0; k < n; k++) if (targets[k]!.has(i) && targets[k]!.has(j)) add(i, j, 1);
    }));
    return w;
}

function greedyCodes(machine: Machine, width: number, pinned: number): number[] {
    const n = machine.states.length;
    const w = affinity(machine);
    const codes = new Array<number>(n).fill(-1);
    const used = new Uint8Array(2 ** width);
    const order = [...Array(n).keys()].sort((a, b) => w[b]!.reduce((x, y) => x + y, 0) - w[a]!.reduce((x, y) => x + y, 0));
    if (pinned >= 0) { codes[pinned] = 0; used[0] = 1; }
    for (const s of order) {
        if (codes[s]! >= 0) continue;
        let best = -1, bestScore = Infinity;
        for (let c = 0; c < used.length; c++) {
            if (used[c]) continue;
            let score = 0;
            for (let t = 0; t < n; t++) if (codes[t]! >= 0) score += w[s]![t]! * hamming(c, codes[t]!);
            if (score < bestScore) { bestScore = score; best = c; }
        }
        codes[s] = best;
        used[best] = 1;
    }
    return codes;
}

function localSearch(
    ctx: SynthesisContext, machine: Machine, width: number, pinned: number,
    evaluate: (codes: readonly number[]) => Candidate, consider: (c: Candidate) => void, ranked: Candidate[],
    start: number, budget: number,
): string {
    void ctx;
    const n = machine.states.length;
    if (now() - start <= budget) consider(evaluate(greedyCodes(machine, width, pinned)));
    let moves = 0;
    let current = ranked[0]!;
    let improved = true;
    outer: while (improved) {
        improved = false;
        const codes = current.codes;
        const free = [...Array(2 ** width).keys()].filter((c) => !codes.includes(c));
        for (let a = 0; a < n; a++) {
            if (a === pinned) continue;
            const options: number[][] = [];
            for (let b = a + 1; b < n; b++) {
                if (b === pinned) continue;
                const next = [...codes]; next[a] = codes[b]!; next[b] = codes[a]!; options.push(next);
            }
            for (const c of free) { const next = [...codes]; next[a] = c; options.push(next); }
            for (const next of options) {
                if (now() - start > budget || moves >= MAX_MOVES) break outer;
                moves++;
                const cand = evaluate(next);
                consider(cand);
                if (compareCost(cand.result.cost, current.result.cost) < 0) {
                    current = cand;
                    improved = true;
                    continue outer;
                }
            }
        }
    }
    const why = moves >= MAX_MOVES ? `stopped at ${MAX_MOVES} moves` : now() - start > budget ? 'stopped at the time budget' : 'local optimum';
    return `binary, gray and adjacency-driven starts, then swap search (${moves} moves, ${why})`;
}
