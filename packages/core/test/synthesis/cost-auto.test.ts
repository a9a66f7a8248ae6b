import { describe, expect, it } from 'vitest';
import type { FlipFlopKind, Guard, Machine, SourceRange, State } from '../../src/model/machine.js';
import { NO_RANGE } from '../../src/model/machine.js';
import { compareEncodings, synthesize } from '../../src/synthesis/run.js';
import type { SynthesisResult } from '../../src/synthesis/types.js';
import { symbolicSafety, explicitSafety } from '../../src/asbuilt/safety.js';
import { asBuiltFindings } from '../../src/asbuilt/report.js';
import { mulberry32, randomMachine } from '../support/random-machine.js';
import { verify } from './verify.js';

const FLIPFLOPS: readonly FlipFlopKind[] = ['D', 'T', 'JK', 'SR'];

/** Literals of a cube, read from its bits (a field 01 or 10 is a literal, 11 is free). */
function cubeLiterals(cube: Uint32Array, nvars: number): number {
    let n = 0;
    for (let v = 0; v < nvars; v++) {
        const f = (cube[v >>> 4]! >>> ((v & 15) * 2)) & 3;
        if (f === 1 || f === 2) n++;
    }
    return n;
}

/** LANGUAGE.md "Synthesis": literals and gate inputs, written independently; a constant 1 costs nothing. */
function languageCost(r: SynthesisResult): { literals: number; gateInputs: number } {
    const nvars = r.variables.length;
    let literals = 0, gateInputs = 0;
    for (const e of r.equations) {
        const lits = e.cover.map((c) => cubeLiterals(c, nvars));
        if (lits.includes(0)) continue; // constant 1
        literals += lits.reduce((a, b) => a + b, 0);
        gateInputs += lits.filter((l) => l >= 2).reduce((a, b) => a + b, 0) + (lits.length >= 2 ? lits.length : 0);
    }
    return { literals, gateInputs };
}

describe('cost', () => {
    it('follows the LANGUAGE.md definition; flip-flops = state bits + registered output bits', () => {
        const rng = mulberry32(31337);
        for (let m = 0; m < 40; m++) {
            const machine = randomMachine(rng, { maxStates: 6 }, `K${m}`);
            for (const encoding of ['binary', 'onehot', 'johnson'] as const) for (const flipflop of FLIPFLOPS) {
                const r = synthesize(machine, { encoding, flipflop });
                const want = languageCost(r);
                expect(r.cost.literals).toBe(want.literals);
                expect(r.cost.gateInputs).toBe(want.gateInputs);
                const registeredBits = machine.outputs.filter((o) => o.registered).reduce((a, o) => a + o.width, 0);
                expect(r.cost.flipflops).toBe(r.assignment.width + registeredBits);
                const shared = synthesize(machine, { encoding, flipflop, share: true });
                verify(machine, shared);
                // With sharing, a product used by several equations is one AND gate (counted once).
                const distinct = new Set(shared.equations.flatMap((e) => e.cover.filter((c) => cubeLiterals(c, shared.variables.length) >= 2).map((c) => Array.from(c).join(','))));
                expect(shared.cost.products).toBeLessThanOrEqual(distinct.size + shared.equations.reduce((a, e) => a + e.cover.filter((c) => cubeLiterals(c, shared.variables.length) === 1).length, 0));
                if (flipflop !== 'SR') expect(shared.cost.gateInputs).toBeLessThanOrEqual(r.cost.gateInputs);
            }
        }
    });
});

/** All injective assignments of n states into `width`-bit codes (brute force, no symmetry reduction). */
function* allAssignments(n: number, width: number): Generator<number[]> {
    const codes: number[] = [];
    const used = new Set<number>();
    function* rec(s: number): Generator<number[]> {
        if (s === n) { yield [...codes]; return; }
        for (let c = 0; c < 2 ** width; c++) {
            if (used.has(c)) continue;
            used.add(c); codes.push(c);
            yield* rec(s + 1);
            used.delete(c); codes.pop();
        }
    }
    yield* rec(0);
}

function withCodes(machine: Machine, codes: readonly number[], width: number): Machine {
    return {
        ...machine,
        encoding: 'explicit',
        states: machine.states.map((s, i) => ({ ...s, code: { bits: codes[i]!.toString(2).padStart(width, '0'), range: NO_RANGE } })),
    };
}

describe('encoding auto', () => {
    it('finds the cheapest assignment of minimum width (brute force over every assignment, 3–4 states)', () => {
        const rng = mulberry32(8080);
        for (let m = 0; m < 12; m++) {
            const machine = randomMachine(rng, { minStates: 3, maxStates: 4, maxBitInputs: 2, maxBuses: 0, resets: ['none', 'target'] }, `U${m}`);
            for (const flipflop of FLIPFLOPS) {
                const auto = synthesize(machine, { encoding: 'auto', flipflop, budgetMs: 5000 });
                expect(auto.assignment.note).toMatch(/exhaustive/);
                let best = Infinity;
                for (const codes of allAssignments(machine.states.length, 2)) {
                    const r = synthesize(withCodes(machine, codes, 2), { encoding: 'explicit', flipflop });
                    best = Math.min(best, r.cost.gateInputs);
                }
                expect(auto.cost.gateInputs, `${machine.name} ${flipflop}`).toBe(best);
                verify(machine, auto);
            }
        }
    });

    it('is never worse than binary or gray, and keeps the initial state on code 0 for reset clear', () => {
        const rng = mulberry32(1234);
        for (let m = 0; m < 14; m++) {
            const machine = randomMachine(rng, { minStates: 3, maxStates: 8, maxBitInputs: 2, maxBuses: 1, resets: ['clear', 'target'] }, `G${m}`);
            for (const flipflop of FLIPFLOPS) {
                const auto = synthesize(machine, { encoding: 'auto', flipflop, budgetMs: 100 });
                for (const encoding of ['binary', 'gray'] as const) {
                    const fixed = synthesize(machine, { encoding, flipflop });
                    if (machine.reset?.target !== 'clear' || encoding === 'binary') {
                        expect(auto.cost.gateInputs, `${machine.name} ${flipflop} vs ${encoding}`).toBeLessThanOrEqual(fixed.cost.gateInputs);
                    }
                }
                if (machine.reset?.target === 'clear') expect(/^0+$/.test(auto.assignment.codes[0]!)).toBe(true);
                expect(auto.assignment.note).toMatch(/chosen/);
                verify(machine, auto);
            }
        }
    });
});

describe('compareEncodings', () => {
    it('lists every encoding × flip-flop type with the costs synthesis gives, the cheapest marked', () => {
        const rng = mulberry32(555);
        for (let m = 0; m < 6; m++) {
            const machine = randomMachine(rng, { minStates: 2, maxStates: 5 }, `E${m}`);
            const rows = compareEncodings(machine, { budgetMs: 50 });
            const encodings = ['binary', 'gray', 'onehot', 'onecold', 'johnson', ...(machine.encoding === 'explicit' ? ['explicit'] : []), 'auto'];
            expect(rows.map((r) => `${r.encoding}/${r.flipflop}`)).toEqual(encodings.flatMap((e) => FLIPFLOPS.map((f) => `${e}/${f}`)));
            for (const row of rows) {
                if (row.encoding !== 'auto') expect(row.cost).toEqual(synthesize(machine, { encoding: row.encoding, flipflop: row.flipflop }).cost);
            }
            const min = Math.min(...rows.map((r) => r.cost.gateInputs));
            expect(rows.filter((r) => r.best).length).toBeGreaterThan(0);
            for (const r of rows) if (r.best) expect(r.cost.gateInputs).toBe(min);
        }
    });
});

const R: SourceRange = NO_RANGE;
const inp = (i: number): Guard => ({ kind: 'input', input: i, range: R });

/** A rotary indexing table with n stations (our own scenario): step, skip two, abort home. */
function indexingTable(n: number, flipflop: FlipFlopKind): Machine {
    const states: State[] = Array.from({ length: n }, (_, i) => ({
        name: `Station${i}`, index: i, priority: true,
        emits: i % 3 === 0 ? [{ output: 0, value: 1, range: R }] : [],
        transitions: [
            { guard: inp(0), target: 0, emits: [{ output: 1, value: 1, range: R }], range: R, targetRange: R },
            { guard: { kind: 'and', operands: [inp(1), inp(2)], range: R }, target: (i + 2) % n, emits: [], range: R, targetRange: R },
            { guard: { kind: 'and', operands: [inp(1), { kind: 'not', operand: inp(3), range: R }], range: R }, target: (i + 1) % n, emits: [], range: R, targetRange: R },
        ],
        otherwise: { kind: 'stay', range: R }, range: R, nameRange: R,
    }));
    return {
        name: `Table${n}`, clock: { name: 'clk', edge: 'rising', range: R },
        inputs: ['abort', 'step', 'skip', 'hold'].map((name) => ({ name, width: 1, isBus: false, async: false, range: R, nameRange: R })),
        outputs: ['busy', 'fault'].map((name) => ({ name, width: 1, isBus: false, registered: false, range: R, nameRange: R })),
        states, encoding: 'onehot', encodingRange: R, flipflop, flipflopRange: R, scenarios: [], range: R, nameRange: R,
    };
}

describe('one-hot at 64 states', () => {
    it('synthesizes well under a second and reproduces the model on every state and input', () => {
        for (const flipflop of FLIPFLOPS) {
            const machine = indexingTable(64, flipflop);
            const t = performance.now();
            const r = synthesize(machine);
            const elapsed = performance.now() - t;
            expect(elapsed, `${flipflop}: ${elapsed.toFixed(0)} ms`).toBeLessThan(4000); // target < 1 s (bench-lockup.ts reports it); slack for a loaded 2-core CI host
            verify(machine, r);
            // The state part of every excitation product is the hot-bit literal (SR: plus q_i / q_i').
            for (const e of r.equations) for (const c of e.cover) {
                let stateLits = 0;
                for (let i = 0; i < 64; i++) { const v = r.inputCount + i; if (((c[v >>> 4]! >>> ((v & 15) * 2)) & 3) !== 3) stateLits++; }
                expect(stateLits).toBeLessThanOrEqual(flipflop === 'SR' ? 2 : 1);
            }
            if (flipflop === 'SR') {
                // S·R = 0 on every code, legal or not: each s_i product has q_i = 0 and each r_i product q_i = 1 (read from the cube bits).
                for (let i = 0; i < 64; i++) {
                    const v = r.inputCount + i;
                    const field = (c: Uint32Array) => (c[v >>> 4]! >>> ((v & 15) * 2)) & 3;
                    for (const c of r.equations.find((e) => e.name === `s${i}`)!.cover) expect(field(c)).toBe(1);
                    for (const c of r.equations.find((e) => e.name === `r${i}`)!.cover) expect(field(c)).toBe(2);
                }
            }
            const t2 = performance.now();
            const a = symbolicSafety(r);
            expect(performance.now() - t2).toBeLessThan(4000); // target < 1 s, see bench-lockup.ts
            // All-zero code: every product has a positive hot-bit literal, so every excitation input is 0 there
            // and D (loads 0), T, JK and SR (hold) all keep the code at zero — the as-built meaning of an empty one-hot code.
            expect(a.lockup).toBe(true);
            expect(a.canStayUnused('0'.repeat(64))).toBe(true);
            expect(a.cycle!.length).toBeGreaterThan(0);
        }
    });

    it('symbolic agrees with explicit on the same structure at 12 states', () => {
        for (const flipflop of FLIPFLOPS) for (const recover of [false, true]) {
            const machine = indexingTable(12, flipflop);
            const r = synthesize(recover ? { ...machine, recover: { target: 0, range: R } } : machine);
            const e = explicitSafety(r), s = symbolicSafety(r);
            if (recover) { expect(e.lockup).toBe(false); expect(e.worstLatency).toBe(1); }
            expect(s.lockup).toBe(e.lockup);
            expect(s.worstLatency).toBe(e.worstLatency);
            for (let u = 0; u < 4096; u += 7) {
                const code = u.toString(2).padStart(12, '0');
                expect(s.canStayUnused(code)).toBe(e.canStayUnused(code));
                expect(s.latency(code)).toBe(e.latency(code));
            }
        }
    });
});

describe('limit', () => {
    it('reports a skipped lock-up analysis as `limit`', () => {
        // With `reset … clear` the fixpoint analysis must run (reset-code asks about code 0…0); without
        // it, the one-hot none-hot code holding itself proves the lock-up before any BDD is built.
        const base = indexingTable(20, 'D');
        const machine = { ...base, reset: { ...base.reset!, target: 'clear' as const } };
        const findings = asBuiltFindings(machine, { method: 'symbolic', maxNodes: 50 });
        const limit = findings.filter((f) => f.code === 'limit');
        expect(limit).toHaveLength(1);
        expect(limit[0]!.severity).toBe('warning');
        expect(limit[0]!.message).toMatch(/lock-up and reset-code analysis skipped: .*nodes/);
    });
});
