/**
 * The recovery report (what the CLI and the editor show) and the as-built findings:
 * `lockup`, `reset-code`, `async-input`, and `limit` when an analysis was skipped.
 */
import type { Guard, Machine, SourceRange } from '../model/machine.js';
import { ceilLog2, fixedAssignment } from '../synthesis/encoding.js';
import { type Finding, type Witness, finding } from '../model/finding.js';
import { inputOffsets } from '../model/variables.js';
import { FREE, getVar } from '../boolean/cube.js';
import { type SynthesisOptions, SynthesisBudgetError } from '../synthesis/synthesize.js';
import { synthesisBlocker, synthesize } from '../synthesis/run.js';
import type { SynthesisResult } from '../synthesis/types.js';
import { BddLimitError } from './bdd.js';
import { codeText, inputsByName, nextCodeAt } from './next-code.js';
import { type CycleStep, type SafetyAnalysis, explicitSafety, symbolicSafety } from './safety.js';

export interface RecoveryReport {
    readonly width: number;
    /** 2^width − used codes (a float above 2^53). */
    readonly unusedCodes: number;
    readonly lockup: boolean;
    /** Lock-up witness: a cycle of unused codes with the inputs that move each to the next. */
    readonly witness?: Witness;
    /** Worst-case clocks from any unused code to a used one under adversarial inputs (no lock-up). */
    readonly worstLatency?: number;
    readonly worstLatencyCode?: string;
    readonly method: 'explicit' | 'symbolic' | 'skipped';
    /**
     * For `reset … clear`: 'state' (all-zero code is a state), 'recovers' (unused, reaches a state
     * within `resetCodeLatency` clocks), 'stuck' (unused and can stay unused forever: `reset-code`).
     * 'no-clear-reset' otherwise.
     */
    readonly resetCode: 'no-clear-reset' | 'state' | 'recovers' | 'stuck';
    readonly resetCodeLatency?: number;
    /** The `recover` target, when declared. */
    readonly recover?: string;
    /** What `recover` costs: this synthesis minus the same synthesis with unused codes as don't-cares. */
    readonly recoverCostDelta?: { readonly flipflops: number; readonly literals: number; readonly gateInputs: number; readonly products: number };
    /** Why the analysis was skipped (method 'skipped'). */
    readonly skipped?: string;
    /** For resetCode 'stuck': the walk from the all-zero code until it repeats a code. */
    readonly resetWitness?: Witness;
    /**
     * For resetCode 'stuck': whether some lock-up cycle lies outside the cleared code's own
     * trajectory (codes 0…0 can reach while staying unused). false: every lock-up cycle is one the
     * cleared code runs into, so `reset-code` already reports it; undefined: not decided (budget).
     */
    readonly lockupBesidesResetCode?: boolean;
    /** When lockupBesidesResetCode: a lock-up cycle 0…0 cannot reach. */
    readonly independentWitness?: Witness;
    readonly elapsedMs: number;
}

export interface AsBuiltOptions {
    /** 'auto' (default): explicit when 2^(width + input bits) ≤ 2^explicitLimitBits, symbolic beyond. */
    readonly method?: 'auto' | 'explicit' | 'symbolic';
    readonly explicitLimitBits?: number;
    /** Wall-clock budget of the lock-up analysis, in milliseconds. */
    readonly budgetMs?: number;
    readonly maxNodes?: number;
    /** Compute recoverCostDelta (a second synthesis). Default true. */
    readonly recoverCost?: boolean;
    /** Options for the synthesis run (encoding, flip-flop, auto budget). */
    readonly synthesis?: SynthesisOptions;
    /** asBuiltFindings: give up synthesis after this many milliseconds (default 400). */
    readonly synthesisBudgetMs?: number;
}

const DEFAULT_EXPLICIT_BITS = 16;

/** Lock-up analysis of one synthesis result, explicit or symbolic. Throws BddLimitError past the budget. */
export function safetyAnalysis(result: SynthesisResult, options: AsBuiltOptions = {}): SafetyAnalysis {
    const bits = result.assignment.width + result.inputCount;
    const method = options.method ?? 'auto';
    const deadline = options.budgetMs === undefined ? undefined : Date.now() + options.budgetMs;
    const explicit = method === 'explicit' || (method === 'auto' && bits <= (options.explicitLimitBits ?? DEFAULT_EXPLICIT_BITS));
    if (explicit) {
        if (bits > 26) throw new BddLimitError(`explicit enumeration of 2^${bits} code/input combinations`);
        return explicitSafety(result, deadline);
    }
    return symbolicSafety(result, { deadline, maxNodes: options.maxNodes });
}

function costDelta(a: SynthesisResult, b: SynthesisResult): RecoveryReport['recoverCostDelta'] {
    return {
        flipflops: a.cost.flipflops - b.cost.flipflops,
        literals: a.cost.literals - b.cost.literals,
        gateInputs: a.cost.gateInputs - b.cost.gateInputs,
        products: a.cost.products - b.cost.products,
    };
}

function stepsWitness(steps: readonly CycleStep[] | undefined): Witness | undefined {
    return steps ? { cycle: steps.map((s) => ({ code: s.code, inputs: { ...s.inputs } })) } : undefined;
}

function cycleWitness(a: SafetyAnalysis): Witness | undefined {
    return stepsWitness(a.cycle);
}

/** Lock-up cycles besides the cleared code's trajectory (undefined when the budget ran out deciding it). */
function besidesResetCode(a: SafetyAnalysis, zero: string): { lockupBesidesResetCode?: boolean; independentWitness?: Witness } {
    try {
        const steps = a.independentCycle(zero);
        return steps ? { lockupBesidesResetCode: true, independentWitness: stepsWitness(steps) } : { lockupBesidesResetCode: false };
    } catch (err) {
        if (err instanceof BddLimitError) return {};
        throw err;
    }
}

/** The recovery report of a machine (synthesized here) or of a synthesis result. */
export function recoveryReport(subject: Machine | SynthesisResult, options: AsBuiltOptions = {}): RecoveryReport {
    const start = Date.now();
    const result = 'equations' in subject ? subject : synthesize(subject, options.synthesis);
    const machine = result.machine;
    const clear = machine.reset?.target === 'clear';
    const recover = machine.recover ? machine.states[machine.recover.target]?.name : undefined;
    let recoverCostDelta: RecoveryReport['recoverCostDelta'];
    if (machine.recover && (options.recoverCost ?? true)) {
        const without = synthesize(machine, {
            ...options.synthesis, encoding: result.assignment.encoding,
            flipflop: result.flipflop, ignoreRecover: true,
        });
        recoverCostDelta = costDelta(result, without);
    }
    const width = result.assignment.width;
    const unusedCodes = 2 ** width - new Set(result.assignment.codes).size;
    try {
        const a = safetyAnalysis(result, options);
        return {
            width,
            unusedCodes,
            lockup: a.lockup,
            witness: cycleWitness(a),
            worstLatency: a.worstLatency,
            worstLatencyCode: a.worstLatencyCode,
            method: a.method,
            resetCode: !clear ? 'no-clear-reset' : a.zero.used ? 'state' : a.zero.stuck ? 'stuck' : 'recovers',
            resetCodeLatency: clear && !a.zero.used && !a.zero.stuck ? a.zero.latency : undefined,
            recover,
            recoverCostDelta,
            elapsedMs: Date.now() - start,
            ...(clear && a.zero.stuck ? { resetWitness: stepsWitness(a.walkFrom('0'.repeat(width))), ...besidesResetCode(a, '0'.repeat(width)) } : {}),
        };
    } catch (err) {
        if (!(err instanceof BddLimitError)) throw err;
        return {
            width, unusedCodes, lockup: false, method: 'skipped', resetCode: clear ? 'recovers' : 'no-clear-reset',
            recover, recoverCostDelta, skipped: err.message, elapsedMs: Date.now() - start,
        };
    }
}

function isNoRange(r: SourceRange): boolean {
    return r.start.line === 0 && r.start.character === 0 && r.end.line === 0 && r.end.character === 0;
}

function machineRange(machine: Machine): SourceRange {
    return isNoRange(machine.encodingRange) ? machine.nameRange : machine.encodingRange;
}

function cycleText(w: Witness | undefined): string {
    const cycle = w?.cycle ?? [];
    if (cycle.length === 0) return '';
    const steps = cycle.map((s) => {
        const ins = Object.entries(s.inputs).map(([k, v]) => `${k}=${v}`).join(',');
        return ins ? `${s.code} (${ins})` : s.code;
    });
    return `${steps.join(' → ')} → ${cycle[0]!.code}`;
}

/**
 * `async-input`: an asynchronous input that appears in the input logic of more than one flip-flop
 * (state bits and registered output bits). Common practice: synchronize it first (two flip-flops
 * in series) so that every flip-flop sees the same sampled value.
 */
export function asyncInputFindings(result: SynthesisResult): Finding[] {
    const machine = result.machine;
    const offsets = inputOffsets(machine);
    const nvars = result.variables.length;
    const findings: Finding[] = [];
    machine.inputs.forEach((input, index) => {
        if (!input.async) return;
        const vars = Array.from({ length: input.width }, (_, b) => offsets[index]! + b);
        const flipflops = new Set<string>();
        for (const e of result.equations) {
            if (e.role === 'output') continue;
            const reads = e.cover.some((c) => vars.some((v) => v < nvars && getVar(c, v) !== FREE));
            if (reads) flipflops.add(e.role === 'excitation' ? `q${e.stateBit}` : e.name);
        }
        if (flipflops.size > 1) {
            const list = [...flipflops].sort();
            findings.push(finding('async-input',
                `asynchronous input '${input.name}' reaches the excitation of ${list.length} flip-flops (${list.join(', ')}); `
                + 'they can sample it differently on the same edge — synchronize it first with two flip-flops in series',
                input.nameRange, { signal: input.name }));
        }
    });
    return findings;
}

function guardInputs(g: Guard, into: Set<number>): void {
    switch (g.kind) {
        case 'const': return;
        case 'input': case 'bit': case 'compare': into.add(g.input); return;
        case 'not': guardInputs(g.operand, into); return;
        default: for (const o of g.operands) guardInputs(o, into);
    }
}

/**
 * What the as-built analyses can possibly find, decided before any synthesis:
 * - lock-up (and with it reset-code) needs unused codes left to the logic — more codes than states
 *   and no `recover` (with `recover` every unused code is specified to go to the target on the next
 *   clock, which the minimizer guard enforces; the latency is the recovery report's business, no finding);
 * - async-input needs an `async` input that some guard reads and at least two flip-flops.
 */
export function asBuiltNeeds(machine: Machine, options: AsBuiltOptions = {}): { lockup: boolean; asyncInput: boolean } {
    const encoding = options.synthesis?.encoding ?? machine.encoding;
    const n = machine.states.length;
    const fixed = encoding === 'auto' ? undefined : fixedAssignment(machine, encoding);
    const width = fixed ? fixed.width : Math.max(1, ceilLog2(n));
    const distinct = fixed ? new Set(fixed.codes).size : n;
    const recover = machine.recover !== undefined && !options.synthesis?.ignoreRecover;
    const lockup = 2 ** width > distinct && !recover;
    const read = new Set<number>();
    for (const s of machine.states) for (const t of s.transitions) guardInputs(t.guard, read);
    const registeredBits = machine.outputs.reduce((a, o) => a + (o.registered ? o.width : 0), 0);
    const asyncInput = width + registeredBits >= 2 && machine.inputs.some((input, i) => input.async && read.has(i));
    return { lockup, asyncInput };
}

function lockupFinding(machine: Machine, ff: string, witness: Witness | undefined): Finding {
    return finding('lockup',
        `as built (${ff}) an unused code can stay among unused codes forever: ${cycleText(witness)}; add 'recover -> S;' to send unused codes to a state`,
        machineRange(machine), { witness });
}

/**
 * An unused code among 0…0 and 1…1 that the as-built logic keeps with all inputs 0 (a one-step
 * lock-up cycle), as a witness; undefined when neither does.
 */
export function selfHoldingCode(result: SynthesisResult): Witness | undefined {
    const width = result.assignment.width;
    const used = new Set(result.assignment.codes);
    const zeroInputs = new Array<0 | 1>(result.inputCount).fill(0);
    for (const bit of [0, 1] as const) {
        const code = new Array<0 | 1>(width).fill(bit);
        const text = codeText((i) => code[i]!, width);
        if (used.has(text)) continue;
        const next = nextCodeAt(result, code, zeroInputs);
        if (next.every((b) => b === bit)) return { cycle: [{ code: text, inputs: inputsByName(result.machine, () => 0) }] };
    }
    return undefined;
}

/** Input variables (cube positions) of each `async` input. */
function asyncVariables(machine: Machine): number[][] {
    const offsets = inputOffsets(machine);
    const groups: number[][] = [];
    machine.inputs.forEach((input, i) => { if (input.async) groups.push(Array.from({ length: input.width }, (_, b) => offsets[i]! + b)); });
    return groups;
}

/** Findings for one machine from its synthesized logic. */
export function asBuiltFindings(machine: Machine, options: AsBuiltOptions = {}): Finding[] {
    if (synthesisBlocker(machine)) return []; // the model errors are reported by the design analyses / lowering
    const needs = asBuiltNeeds(machine, options);
    if (!needs.lockup && !needs.asyncInput) return []; // nothing as built can differ from the design: no synthesis
    // Keystroke budget: a short auto search and short minimizer runs (the as-built meaning is exact for
    // whatever covers come out; only their cost is less polished than `detent synth`'s).
    // Only the equations an analysis reads are built (combinational outputs never; registered-output
    // D inputs only for async-input); each equation is minimized alone, so these are the same covers.
    const synthesisBudget = options.synthesisBudgetMs ?? 400;
    const synthesisOptions: SynthesisOptions = {
        budgetMs: 100, minimizeBudgetMs: 10, quick: true, deadline: Date.now() + synthesisBudget,
        equations: needs.asyncInput ? 'flipflops' : 'state',
        functionOnly: { dontCares: needs.lockup, literalInputs: needs.asyncInput ? asyncVariables(machine) : [] },
        ...options.synthesis,
    };
    let result: SynthesisResult;
    try {
        result = synthesize(machine, synthesisOptions);
    } catch (err) {
        if (!(err instanceof SynthesisBudgetError)) throw err;
        return [finding('limit', `as-built analyses (lockup, reset-code, async-input) skipped: synthesis took longer than ${synthesisBudget} ms; \`detent synth\` runs them without this limit`, machineRange(machine))];
    }
    const findings: Finding[] = needs.asyncInput ? [...asyncInputFindings(result)] : [];
    if (!needs.lockup) return findings;
    const ff = `${result.flipflop} flip-flops, ${result.assignment.encoding} encoding`;
    const zeroCode = '0'.repeat(result.assignment.width);
    const resetQuestion = machine.reset?.target === 'clear' && !result.assignment.codes.includes(zeroCode);
    if (!resetQuestion) {
        // Lock-up exists iff some unused code can stay unused forever; an unused code that holds itself
        // under some input proves it at once (one-hot/one-cold logic holds its none-hot code: every
        // product carries a hot literal). The fixpoint analysis is only needed when no such code is found.
        const holding = selfHoldingCode(result);
        if (holding) {
            findings.push(lockupFinding(machine, ff, holding));
            return findings;
        }
    }
    const report = recoveryReport(result, { budgetMs: 300, recoverCost: false, ...options, synthesis: synthesisOptions });
    if (report.method === 'skipped') {
        findings.push(finding('limit', `lock-up and reset-code analysis skipped: ${report.skipped}`, machineRange(machine)));
        return findings;
    }
    // One finding per defect: when `reset-code` reports that the cleared code does not recover, a
    // lock-up cycle the cleared code runs into is that same defect; only a cycle outside its
    // trajectory is a `lockup` of its own (undecided within the budget: both are reported).
    const resetStuck = report.resetCode === 'stuck' && machine.reset !== undefined;
    const lockupWitness = resetStuck && report.lockupBesidesResetCode === true ? report.independentWitness : report.witness;
    if (report.lockup && !(resetStuck && report.lockupBesidesResetCode === false)) findings.push(lockupFinding(machine, ff, lockupWitness));
    if (report.resetCode === 'stuck' && machine.reset) {
        findings.push(finding('reset-code',
            `'reset … clear' loads code ${'0'.repeat(report.width)}, which is no state, and as built (${ff}) it does not recover`
            + (report.resetWitness ? `: ${cycleText(report.resetWitness)}` : ''),
            machine.reset.range, { witness: report.resetWitness }));
    }
    return findings;
}
