/**
 * Guard expressions → covers over the machine's input variables (see model/variables.ts).
 */
import type { CompareOp, Guard, Machine } from '../model/machine.js';
import { inputOffsets } from '../model/variables.js';
import { type Cube, ONE, ZERO, setVarInPlace, universe } from './cube.js';
import { type Cover, complement, coverIntersect, coverUnion, removeContained } from './cover.js';

export interface GuardContext {
    readonly nvars: number;
    /** First variable of each input. */
    readonly offsets: readonly number[];
    readonly widths: readonly number[];
}

export function guardContext(machine: Machine): GuardContext {
    const offsets = inputOffsets(machine);
    const widths = machine.inputs.map((i) => i.width);
    const nvars = widths.reduce((a, b) => a + b, 0);
    return { nvars, offsets, widths };
}

function literal(ctx: GuardContext, v: number, value: 0 | 1): Cube[] {
    const c = universe(ctx.nvars);
    setVarInPlace(c, v, value === 1 ? ONE : ZERO);
    return [c];
}

/** The set of input assignments that make the guard true. */
export function guardCover(guard: Guard, ctx: GuardContext): Cube[] {
    switch (guard.kind) {
        case 'const':
            return guard.value ? [universe(ctx.nvars)] : [];
        case 'input':
            return literal(ctx, ctx.offsets[guard.input]!, 1);
        case 'bit':
            return literal(ctx, ctx.offsets[guard.input]! + guard.bit, 1);
        case 'compare':
            return compareCover(ctx.offsets[guard.input]!, ctx.widths[guard.input]!, guard.op, guard.value, ctx.nvars);
        case 'not':
            return complement(guardCover(guard.operand, ctx), ctx.nvars);
        case 'and': {
            let acc: Cube[] = [universe(ctx.nvars)];
            for (const op of guard.operands) {
                acc = coverIntersect(acc, guardCover(op, ctx), ctx.nvars);
                if (acc.length === 0) break;
            }
            return acc;
        }
        case 'or': {
            let acc: Cube[] = [];
            for (const op of guard.operands) acc = coverUnion(acc, guardCover(op, ctx));
            return acc;
        }
        case 'xor': {
            let acc: Cube[] = [];
            for (const op of guard.operands) {
                const b = guardCover(op, ctx);
                const na = complement(acc, ctx.nvars);
                const nb = complement(b, ctx.nvars);
                acc = coverUnion(coverIntersect(acc, nb, ctx.nvars), coverIntersect(na, b, ctx.nvars));
            }
            return acc;
        }
    }
}

/**
 * Cubes of `bus < value` for an unsigned bus at variables offset…offset+width-1 (LSB first):
 * for every 1 bit of value, the cube "higher bits equal to value's, this bit 0, lower bits free".
 */
function lessThan(offset: number, width: number, value: number, nvars: number): Cube[] {
    if (value <= 0) return [];
    if (value >= 2 ** width) return [universe(nvars)];
    const r: Cube[] = [];
    for (let bit = width - 1; bit >= 0; bit--) {
        if (((value >>> bit) & 1) === 0) continue;
        const c = universe(nvars);
        for (let hi = width - 1; hi > bit; hi--) setVarInPlace(c, offset + hi, ((value >>> hi) & 1) === 1 ? ONE : ZERO);
        setVarInPlace(c, offset + bit, ZERO);
        r.push(c);
    }
    return r;
}

function equalTo(offset: number, width: number, value: number, nvars: number): Cube[] {
    if (value < 0 || value >= 2 ** width) return [];
    const c = universe(nvars);
    for (let bit = 0; bit < width; bit++) setVarInPlace(c, offset + bit, ((value >>> bit) & 1) === 1 ? ONE : ZERO);
    return [c];
}

export function compareCover(offset: number, width: number, op: CompareOp, value: number, nvars: number): Cube[] {
    switch (op) {
        case '<': return lessThan(offset, width, value, nvars);
        case '<=': return lessThan(offset, width, value + 1, nvars);
        case '>': return complement(lessThan(offset, width, value + 1, nvars), nvars);
        case '>=': return complement(lessThan(offset, width, value, nvars), nvars);
        case '==': return equalTo(offset, width, value, nvars);
        case '!=': return complement(equalTo(offset, width, value, nvars), nvars);
    }
}

export { removeContained, type Cover };

/** Product terms a guard may need before the analyses refuse it (see docs/limits.md). */
export const MAX_GUARD_CUBES = 4096;

/**
 * Like guardCover, but gives up (undefined) as soon as an intermediate cover would exceed
 * maxCubes product terms — a long XOR chain or an AND of many bus comparisons has exponentially
 * many, and every analysis and the synthesizer work on these covers (robustness: no hang).
 */
export function guardCoverBounded(guard: Guard, ctx: GuardContext, maxCubes = MAX_GUARD_CUBES): Cube[] | undefined {
    const within = (c: Cube[] | undefined) => (c !== undefined && c.length <= maxCubes ? c : undefined);
    // the pairwise products of an intersection are built (and containment-checked, quadratic) before they shrink
    const intersectWithin = (a: Cube[], b: Cube[]) => (a.length * b.length > maxCubes ? undefined : within(coverIntersect(a, b, ctx.nvars)));
    switch (guard.kind) {
        case 'const': case 'input': case 'bit': case 'compare':
            return guardCover(guard, ctx);
        case 'not': {
            const inner = guardCoverBounded(guard.operand, ctx, maxCubes);
            return inner && inner.length <= 512 ? within(complement(inner, ctx.nvars)) : undefined;
        }
        case 'and': {
            let acc: Cube[] | undefined = [universe(ctx.nvars)];
            for (const op of guard.operands) {
                const b = guardCoverBounded(op, ctx, maxCubes);
                if (!b) return undefined;
                acc = intersectWithin(acc, b);
                if (!acc) return undefined;
                if (acc.length === 0) break;
            }
            return acc;
        }
        case 'or': {
            let acc: Cube[] = [];
            for (const op of guard.operands) {
                const b = guardCoverBounded(op, ctx, maxCubes);
                if (!b) return undefined;
                const u = within(coverUnion(acc, b));
                if (!u) return undefined;
                acc = u;
            }
            return acc;
        }
        case 'xor': {
            let acc: Cube[] = [];
            for (const op of guard.operands) {
                const b = guardCoverBounded(op, ctx, maxCubes);
                if (!b || acc.length > 512 || b.length > 512) return undefined;
                const na = within(complement(acc, ctx.nvars));
                const nb = within(complement(b, ctx.nvars));
                if (!na || !nb) return undefined;
                const left = intersectWithin(acc, nb);
                const right = intersectWithin(na, b);
                if (!left || !right) return undefined;
                const u = within(coverUnion(left, right));
                if (!u) return undefined;
                acc = u;
            }
            return acc;
        }
    }
}
