/**
 * Public synthesis entry points: `synthesize` and `compareEncodings`.
 */
import type { EncodingKind, FlipFlopKind, Machine } from '../model/machine.js';
import { FLIPFLOP_KINDS } from '../model/machine.js';
import { explicitCodes, fixedAssignment } from './encoding.js';
import { autoSynthesize } from './auto-encoding.js';
import { type SynthesisOptions, synthesisContext, synthesizeWithAssignment } from './synthesize.js';
import { compareCost } from './cost.js';
import type { Cost, SynthesisResult } from './types.js';

/** The machine cannot be synthesized as written (its errors are reported by `detent check`). */
export class SynthesisError extends Error {}

/** Why a machine cannot be synthesized, or undefined when it can. */
export function synthesisBlocker(machine: Machine, encoding: EncodingKind = machine.encoding): string | undefined {
    if (machine.states.length === 0) return 'the machine has no states';
    const n = machine.states.length;
    const badTarget = machine.states.some((s) => s.transitions.some((t) => t.target < 0 || t.target >= n)
        || (s.otherwise?.kind === 'goto' && (s.otherwise.target < 0 || s.otherwise.target >= n)));
    if (badTarget) return 'a transition targets an unknown state';
    if (machine.recover && (machine.recover.target < 0 || machine.recover.target >= n)) return 'recover targets an unknown state';
    if (encoding === 'explicit') {
        const codes = explicitCodes(machine);
        if (!codes) return 'encoding explicit needs a code for every state';
        const width = codes[0]!.length;
        if (codes.some((c) => c.length !== width || !/^[01]+$/.test(c))) return 'explicit codes must all have the same width';
        if (new Set(codes).size !== codes.length) return 'explicit codes must be distinct';
    }
    return undefined;
}

export function synthesize(machine: Machine, options: SynthesisOptions = {}): SynthesisResult {
    const encoding = options.encoding ?? machine.encoding;
    const flipflop = options.flipflop ?? machine.flipflop;
    const blocker = synthesisBlocker(machine, encoding);
    if (blocker) throw new SynthesisError(`${machine.name}: ${blocker}`);
    const codeOptions = { share: options.share, minimizeBudgetMs: options.minimizeBudgetMs, ignoreRecover: options.ignoreRecover, quick: options.quick, deadline: options.deadline };
    if (encoding === 'auto') return autoSynthesize(machine, flipflop, { ...codeOptions, budgetMs: options.budgetMs });
    const assignment = fixedAssignment(machine, encoding)!;
    return synthesizeWithAssignment(synthesisContext(machine, assignment.width), assignment, flipflop, { ...codeOptions, equations: options.equations, functionOnly: options.functionOnly });
}

export interface EncodingComparisonRow {
    readonly encoding: EncodingKind;
    readonly flipflop: FlipFlopKind;
    readonly width: number;
    readonly cost: Cost;
    /** The cheapest row (gate inputs, then literals, then flip-flops); ties all marked. */
    readonly best: boolean;
    /** The auto search's note. */
    readonly note?: string;
}

/** Every encoding (explicit only when codes exist) × flip-flop type, with costs; the cheapest marked. */
export function compareEncodings(machine: Machine, options: Pick<SynthesisOptions, 'share' | 'budgetMs' | 'minimizeBudgetMs'> = {}): EncodingComparisonRow[] {
    const encodings: EncodingKind[] = ['binary', 'gray', 'onehot', 'onecold', 'johnson'];
    if (!synthesisBlocker(machine, 'explicit')) encodings.push('explicit');
    encodings.push('auto');
    const rows: Omit<EncodingComparisonRow, 'best'>[] = [];
    for (const encoding of encodings) {
        for (const flipflop of FLIPFLOP_KINDS) {
            const r = synthesize(machine, { encoding, flipflop, share: options.share, budgetMs: options.budgetMs ?? 300, minimizeBudgetMs: options.minimizeBudgetMs });
            rows.push({ encoding, flipflop, width: r.assignment.width, cost: r.cost, note: r.assignment.note });
        }
    }
    let best = rows[0]!.cost;
    for (const r of rows) if (compareCost(r.cost, best) < 0) best = r.cost;
    return rows.map((r) => ({ ...r, best: compareCost(r.cost, best) === 0 }));
}
