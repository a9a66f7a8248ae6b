/**
 * Guard AST → core `Guard`. Returns undefined when the guard cannot be lowered (the finding is
 * reported); the caller then skips the transition.
 */
import type { CompareOp, Guard, Input } from '@detent/core';
import * as ast from '../generated/ast.js';
import { type LoweringContext, parseNumber, propertyRange, rangeOf, referenceRange } from './context.js';
import type { MachineSymbols } from './symbols.js';

export function lowerGuard(node: ast.Guard | undefined, ctx: LoweringContext, symbols: MachineSymbols, inputs: readonly Input[]): Guard | undefined {
    if (!node) return undefined;
    const range = rangeOf(node);
    switch (node.$type) {
        case 'ParenGuard':
            return lowerGuard(node.inner, ctx, symbols, inputs);
        case 'NotGuard': {
            const operand = lowerGuard(node.operand, ctx, symbols, inputs);
            return operand ? { kind: 'not', operand, range } : undefined;
        }
        case 'AndGuard':
        case 'OrGuard':
        case 'XorGuard': {
            const operands: Guard[] = [];
            let ok = true;
            for (const op of node.operands) {
                const g = lowerGuard(op, ctx, symbols, inputs);
                if (g) operands.push(g);
                else ok = false;
            }
            if (!ok) return undefined;
            const kind = node.$type === 'AndGuard' ? 'and' : node.$type === 'OrGuard' ? 'or' : 'xor';
            return { kind, operands, range };
        }
        case 'ConstGuard': {
            const { value } = parseNumber(node.value);
            if (value !== 0 && value !== 1) {
                ctx.report('width', `the constant ${node.value} is no guard; use 0 or 1`, range);
                return undefined;
            }
            return { kind: 'const', value: value === 1, range };
        }
        case 'SignalGuard':
            return lowerSignalGuard(node, ctx, symbols, inputs);
    }
}

function lowerSignalGuard(node: ast.SignalGuard, ctx: LoweringContext, symbols: MachineSymbols, inputs: readonly Input[]): Guard | undefined {
    const range = rangeOf(node);
    const name = node.signal?.$refText ?? '';
    const index = symbols.inputs.get(name);
    if (index === undefined) {
        ctx.report('unknown-name', symbols.unknown(name, 'input', 'a guard reads inputs'), referenceRange(node.signal, node), { signal: name });
        return undefined;
    }
    const input = inputs[index]!;
    if (node.bit !== undefined) {
        if (!input.isBus) {
            ctx.report('width', `'${name}' is a single-bit input, not a bus; write '${name}' instead of '${name}[${node.bit}]'`, range, { signal: name });
            return undefined;
        }
        const { value } = parseNumber(node.bit);
        if (value >= input.width) {
            ctx.report('width', `bit ${node.bit} does not exist: '${name}' has bits ${input.width - 1}..0`, propertyRange(node, 'bit'), { signal: name });
            return undefined;
        }
        return { kind: 'bit', input: index, bit: value, range };
    }
    if (node.op !== undefined && node.value !== undefined) {
        const { value } = parseNumber(node.value);
        const max = 2 ** input.width - 1;
        if (value > max) {
            ctx.report('width', `${node.value} does not fit '${name}' (${input.width} bit${input.width === 1 ? '' : 's'}, at most ${max})`, propertyRange(node, 'value'), { signal: name });
            return undefined;
        }
        return { kind: 'compare', input: index, op: node.op as CompareOp, value, range };
    }
    if (input.isBus) {
        ctx.report('width', `'${name}' is a ${input.width}-bit bus; a bus alone is no guard: compare it (${name} == 3) or select a bit (${name}[0])`, range, { signal: name });
        return undefined;
    }
    return { kind: 'input', input: index, range };
}
