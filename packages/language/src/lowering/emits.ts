/**
 * `emit` lists → core `Emit`s, and the `output-conflict` rules between Moore and Mealy values.
 */
import type { Emit, Output, SourceRange } from '@detent/core';
import type * as ast from '../generated/ast.js';
import { type LoweringContext, parseNumber, rangeOf, referenceRange } from './context.js';
import type { MachineSymbols } from './symbols.js';

/** Lowers one emit list; an output named twice in it is reported. */
export function lowerEmits(
    items: readonly ast.EmitItem[], ctx: LoweringContext, symbols: MachineSymbols, outputs: readonly Output[], state: string,
    seen: Map<number, Emit> = new Map(),
): Emit[] {
    const emits: Emit[] = [];
    for (const item of items) {
        const name = item.output?.$refText ?? '';
        const index = symbols.outputs.get(name);
        const range = rangeOf(item);
        if (index === undefined) {
            ctx.report('unknown-name', symbols.unknown(name, 'output', 'emit sets outputs'), referenceRange(item.output, item), { signal: name, state });
            continue;
        }
        const output = outputs[index]!;
        const value = item.value === undefined ? 1 : parseNumber(item.value).value;
        if (!fits(value, output.width)) {
            ctx.report('width', `${item.value} does not fit output '${name}' (${output.width} bit${output.width === 1 ? '' : 's'}, at most ${2 ** output.width - 1})`, range, { signal: name, state });
            continue;
        }
        const before = seen.get(index);
        if (before) {
            if (before.value !== value) {
                ctx.report('output-conflict', `'${name}' is set to ${before.value} and to ${value} at once`, range, {
                    signal: name, state, related: [{ message: `'${name}' = ${before.value} here`, range: before.range }],
                });
            } else {
                ctx.report('duplicate-name', `'${name}' is emitted twice`, range, { signal: name, state, related: [{ message: 'first emitted here', range: before.range }] });
            }
            continue;
        }
        const emit: Emit = { output: index, value, range };
        seen.set(index, emit);
        emits.push(emit);
    }
    return emits;
}

/**
 * Mealy emits of one transition against the state's Moore emits: a registered output may only be
 * a Moore output, and a Mealy value that differs from the state's Moore value is a conflict.
 */
export function checkMealy(
    mealy: readonly Emit[], moore: readonly Emit[], outputs: readonly Output[], ctx: LoweringContext, state: string, transitionRange: SourceRange,
): Emit[] {
    const kept: Emit[] = [];
    for (const e of mealy) {
        const output = outputs[e.output]!;
        if (output.registered) {
            ctx.report('output-conflict', `'${output.name}' is registered, so it can only be a Moore output: emit it in the state, not on a transition`, e.range, {
                signal: output.name, state, related: [{ message: `'${output.name}' declared registered here`, range: output.range }],
            });
            continue;
        }
        const m = moore.find((x) => x.output === e.output);
        if (m && m.value !== e.value) {
            ctx.report('output-conflict', `state '${state}' sets '${output.name}' = ${m.value} (Moore) but this transition sets it to ${e.value} (Mealy)`, e.range, {
                signal: output.name, state, related: [{ message: `Moore value of '${output.name}'`, range: m.range }, { message: 'the transition', range: transitionRange }],
            });
            continue;
        }
        kept.push(e);
    }
    return kept;
}

function fits(value: number, width: number): boolean {
    return Number.isFinite(value) && value >= 0 && value <= 2 ** width - 1;
}
