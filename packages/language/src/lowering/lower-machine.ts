/**
 * One machine's AST → core `Machine`, with every lowering finding. Broken elements are skipped
 * (a transition with an unknown target, an emit of an unknown output, …) so the rest still lowers.
 */
import {
    type Clock, type EncodingKind, type FlipFlopKind, type Input, type Machine, type Otherwise, type Output, type Reset,
    type Scenario, type SourceRange, type State, type StateCode, type Transition, type Emit, FLIPFLOP_KINDS, NO_RANGE,
} from '@detent/core';
import * as ast from '../generated/ast.js';
import { LoweringContext, bitsFor, parseNumber, propertyRange, rangeOf, referenceRange } from './context.js';
import { MachineSymbols, checkReserved } from './symbols.js';
import { lowerGuard } from './guards.js';
import { checkMealy, lowerEmits } from './emits.js';
import { lowerScenario } from './scenarios.js';
import { docBefore } from './docs.js';

export const MIN_BUS_WIDTH = 1;
export const MAX_BUS_WIDTH = 16;

export interface MachineLowering {
    readonly machine: Machine;
    readonly ctx: LoweringContext;
}

export function lowerMachine(node: ast.Machine, text: string): MachineLowering {
    const ctx = new LoweringContext();
    const symbols = new MachineSymbols(ctx);
    const name = node.name ?? '';
    const members = node.members;

    // ---- clock and reset -------------------------------------------------------------
    let clock: Clock | undefined;
    for (const m of members.filter(ast.isClockDecl)) {
        if (clock) {
            ctx.report('duplicate-name', 'a machine has one clock; this is a second `clock` declaration', rangeOf(m), {
                signal: m.name, related: [{ message: 'the first clock', range: clock.range }],
            });
            continue;
        }
        if (m.name === undefined) continue;
        symbols.declare(m.name, 'clock', propertyRange(m, 'name'));
        clock = { name: m.name, edge: m.edge === 'falling' ? 'falling' : 'rising', range: rangeOf(m) };
    }
    if (!clock) {
        clock = { name: 'clk', edge: 'rising', range: NO_RANGE };
        symbols.declare('clk', 'clock', NO_RANGE, true);
    }

    const resetDecls = members.filter(ast.isResetDecl);
    for (const extra of resetDecls.slice(1)) {
        ctx.report('duplicate-name', 'a machine has one reset; this is a second `reset` declaration', rangeOf(extra), {
            signal: extra.name, related: [{ message: 'the first reset', range: rangeOf(resetDecls[0]) }],
        });
    }
    const resetDecl = resetDecls[0];
    if (resetDecl?.name !== undefined) symbols.declare(resetDecl.name, 'reset', propertyRange(resetDecl, 'name'));

    // ---- inputs and outputs ------------------------------------------------------------
    const inputs: Input[] = [];
    const outputs: Output[] = [];
    for (const m of members) {
        if (!ast.isInputDecl(m) && !ast.isOutputDecl(m)) continue;
        const width = declaredWidth(m, ctx);
        for (const s of m.signals) {
            if (s.name === undefined) continue;
            const nameRange = propertyRange(s, 'name');
            if (ast.isInputDecl(m)) {
                if (!symbols.declare(s.name, 'input', nameRange)) continue;
                symbols.inputs.set(s.name, inputs.length);
                inputs.push({ name: s.name, width: width ?? 1, isBus: width !== undefined, async: m.async, range: rangeOf(m), nameRange });
            } else {
                if (!symbols.declare(s.name, 'output', nameRange)) continue;
                symbols.outputs.set(s.name, outputs.length);
                outputs.push({ name: s.name, width: width ?? 1, isBus: width !== undefined, registered: m.registered, range: rangeOf(m), nameRange });
            }
        }
    }

    // ---- states (names first: transitions may refer forward) ------------------------------
    const stateNodes = members.filter(ast.isState);
    stateNodes.forEach((s, index) => {
        if (s.name === undefined) return;
        symbols.declare(s.name, 'state', propertyRange(s, 'name'));
        // a duplicate still resolves (to the first state of that name), so it causes no unknown-name cascade
        if (!symbols.states.has(s.name)) symbols.states.set(s.name, index);
    });
    const stateIndex = (ref: { $refText: string } | undefined, rangeRef: SourceRange, use: string): number | undefined => {
        const target = ref?.$refText ?? '';
        const index = symbols.states.get(target);
        if (index === undefined) ctx.report('unknown-name', symbols.unknown(target, 'state', use), rangeRef, { state: target });
        return index;
    };

    // ---- reset target -----------------------------------------------------------------------
    let reset: Reset | undefined;
    if (resetDecl?.name !== undefined) {
        let target: number | 'clear' | undefined;
        if (resetDecl.clear) target = 'clear';
        else if (resetDecl.target) target = stateIndex(resetDecl.target, referenceRange(resetDecl.target, resetDecl), 'the reset loads a state');
        if (target !== undefined) {
            reset = {
                name: resetDecl.name, activeHigh: resetDecl.level !== 'low', async: resetDecl.mode === 'async', target,
                range: rangeOf(resetDecl), nameRange: propertyRange(resetDecl, 'name'),
            };
        }
    }

    // ---- encoding, flip-flop, recovery ---------------------------------------------------------
    let encoding: EncodingKind = 'binary';
    let encodingRange = NO_RANGE;
    let encodingSeen = false;
    for (const m of members.filter(ast.isEncodingDecl)) {
        if (encodingSeen) {
            ctx.report('encoding', 'a second `encoding` declaration', rangeOf(m), { related: [{ message: 'the first one', range: encodingRange }] });
            continue;
        }
        if (m.kind === undefined) continue;
        encodingSeen = true;
        encoding = m.kind as EncodingKind;
        encodingRange = rangeOf(m);
    }
    let flipflop: FlipFlopKind = 'D';
    let flipflopRange = NO_RANGE;
    let flipflopSeen = false;
    for (const m of members.filter(ast.isFlipFlopDecl)) {
        if (flipflopSeen) {
            ctx.report('duplicate-name', 'a second `flipflop` declaration', rangeOf(m), { related: [{ message: 'the first one', range: flipflopRange }] });
            continue;
        }
        if (m.kind === undefined) continue;
        if (!(FLIPFLOP_KINDS as readonly string[]).includes(m.kind)) {
            ctx.report('syntax', `unknown flip-flop '${m.kind}' (one of ${FLIPFLOP_KINDS.join(', ')})`, propertyRange(m, 'kind'));
            continue;
        }
        flipflopSeen = true;
        flipflop = m.kind as FlipFlopKind;
        flipflopRange = rangeOf(m);
    }
    let recover: { target: number; range: SourceRange } | undefined;
    let recoverSeen: SourceRange | undefined;
    for (const m of members.filter(ast.isRecoverDecl)) {
        if (recoverSeen) {
            ctx.report('duplicate-name', 'a second `recover` declaration', rangeOf(m), { related: [{ message: 'the first one', range: recoverSeen }] });
            continue;
        }
        recoverSeen = rangeOf(m);
        const target = stateIndex(m.target, referenceRange(m.target, m), 'unused codes recover to a state');
        if (target !== undefined) recover = { target, range: rangeOf(m) };
    }

    // ---- explicit codes ----------------------------------------------------------------------
    const codes = lowerCodes(members.filter(ast.isCodeDecl), encoding, encodingSeen, stateNodes, symbols, ctx);

    // ---- state bodies --------------------------------------------------------------------------
    const states: State[] = stateNodes.map((s, index) => {
        const stateName = s.name ?? '';
        const moore: Emit[] = [];
        const seenMoore = new Map<number, Emit>();
        for (const item of s.items.filter(ast.isMooreEmit)) moore.push(...lowerEmits(item.emits, ctx, symbols, outputs, stateName, seenMoore));
        const transitions: Transition[] = [];
        let otherwise: Otherwise | undefined;
        for (const item of s.items) {
            if (ast.isTransition(item)) {
                const guard = lowerGuard(item.guard, ctx, symbols, inputs);
                const targetRange = referenceRange(item.target, item);
                const target = item.target ? stateIndex(item.target, targetRange, 'a transition goes to a state') : undefined;
                const mealy = checkMealy(lowerEmits(item.emits, ctx, symbols, outputs, stateName), moore, outputs, ctx, stateName, rangeOf(item));
                if (guard && target !== undefined) transitions.push({ guard, target, emits: mealy, range: rangeOf(item), targetRange });
            } else if (ast.isOtherwise(item)) {
                if (otherwise) {
                    ctx.report('duplicate-name', `state '${stateName}' has a second \`otherwise\``, rangeOf(item), {
                        state: stateName, related: [{ message: 'the first one', range: otherwise.range }],
                    });
                    continue;
                }
                const range = rangeOf(item);
                if (item.stay) otherwise = { kind: 'stay', range };
                else if (item.dontcare) otherwise = { kind: 'dontcare', range };
                else if (item.target) {
                    const targetRange = referenceRange(item.target, item);
                    const target = stateIndex(item.target, targetRange, 'otherwise goes to a state');
                    const mealy = checkMealy(lowerEmits(item.emits, ctx, symbols, outputs, stateName), moore, outputs, ctx, stateName, range);
                    if (target !== undefined) otherwise = { kind: 'goto', target, emits: mealy, range, targetRange };
                }
            }
        }
        const doc = s.$cstNode ? docBefore(text, s.$cstNode.offset) : undefined;
        const code = codes.get(index);
        return {
            name: stateName, index, priority: s.priority, emits: moore, transitions,
            ...(otherwise ? { otherwise } : {}), ...(doc ? { doc } : {}), ...(code ? { code } : {}),
            range: rangeOf(s), nameRange: propertyRange(s, 'name'),
        };
    });

    // ---- scenarios ---------------------------------------------------------------------------------
    const scenarios: Scenario[] = [];
    const scenarioNames = new Map<string, SourceRange>();
    for (const sc of members.filter(ast.isScenario)) {
        if (sc.name === undefined) continue;
        const nameRange = propertyRange(sc, 'name');
        const earlier = scenarioNames.get(sc.name.toLowerCase());
        if (earlier) {
            ctx.report('duplicate-name', `a scenario named '${sc.name}' already exists (names are compared ignoring case)`, nameRange, {
                related: [{ message: 'the first one', range: earlier }],
            });
            continue;
        }
        scenarioNames.set(sc.name.toLowerCase(), nameRange);
        checkReserved(ctx, sc.name, nameRange, {});
        const lowered = lowerScenario(sc, ctx, symbols, inputs, outputs);
        if (lowered) scenarios.push(lowered);
    }

    if (name) checkReserved(ctx, name, propertyRange(node, 'name'), {});
    if (stateNodes.length === 0) {
        ctx.report('syntax', `machine '${name}' needs at least one state`, propertyRange(node, 'name'));
    }
    const doc = node.$cstNode ? docBefore(text, node.$cstNode.offset) : undefined;
    const machine: Machine = {
        name, ...(doc ? { doc } : {}), clock, ...(reset ? { reset } : {}), inputs, outputs, states,
        encoding, encodingRange, flipflop, flipflopRange, ...(recover ? { recover } : {}), scenarios,
        range: rangeOf(node), nameRange: propertyRange(node, 'name'),
    };
    return { machine, ctx };
}

/** Width of `input [w] …` / `output [w] …`; undefined for a single bit. Reports widths out of range. */
function declaredWidth(m: ast.InputDecl | ast.OutputDecl, ctx: LoweringContext): number | undefined {
    if (m.width === undefined) return undefined;
    const { value } = parseNumber(m.width);
    if (value < MIN_BUS_WIDTH || value > MAX_BUS_WIDTH) {
        ctx.report('width', `a bus is ${MIN_BUS_WIDTH} to ${MAX_BUS_WIDTH} bits wide, not ${m.width}`, propertyRange(m, 'width'));
        return Math.min(Math.max(value, MIN_BUS_WIDTH), MAX_BUS_WIDTH);
    }
    return value;
}

/**
 * `code S = …;` lines. `0b` literals fix the width by their digits and `0x` by 4 bits per digit;
 * decimal codes take the width of the fixed-width codes (or, if none, the narrowest width holding
 * every decimal code).
 */
function lowerCodes(
    decls: readonly ast.CodeDecl[], encoding: EncodingKind, encodingSeen: boolean, stateNodes: readonly ast.State[],
    symbols: MachineSymbols, ctx: LoweringContext,
): Map<number, StateCode> {
    const codes = new Map<number, StateCode>();
    const explicit = encoding === 'explicit';
    const parsed: { state: number; name: string; value: number; bits?: string; range: SourceRange; valueRange: SourceRange }[] = [];
    for (const d of decls) {
        const range = rangeOf(d);
        const stateName = d.state?.$refText ?? '';
        if (!explicit) {
            ctx.report('encoding', `\`code\` needs \`encoding explicit;\`${encodingSeen ? ` (this machine uses ${encoding})` : ''}`, range, { state: stateName });
            continue;
        }
        const state = symbols.states.get(stateName);
        if (state === undefined) {
            ctx.report('unknown-name', symbols.unknown(stateName, 'state', '`code` gives a state its code'), referenceRange(d.state, d), { state: stateName });
            continue;
        }
        const earlier = parsed.find((p) => p.state === state);
        if (earlier) {
            ctx.report('encoding', `state '${stateName}' already has a code`, range, { state: stateName, related: [{ message: 'the first code', range: earlier.range }] });
            continue;
        }
        if (d.value === undefined) continue;
        const n = parseNumber(d.value);
        parsed.push({ state, name: stateName, value: n.value, ...(n.bits ? { bits: n.bits } : {}), range, valueRange: propertyRange(d, 'value') });
    }
    if (!explicit) return codes;

    const fixed = parsed.filter((p) => p.bits !== undefined);
    const width = fixed.length > 0 ? fixed[0]!.bits!.length : Math.max(1, ...parsed.map((p) => (Number.isFinite(p.value) ? bitsFor(p.value) : 1)));
    const byBits = new Map<string, string>();
    for (const p of parsed) {
        let bits: string;
        if (p.bits !== undefined) {
            if (p.bits.length !== width) {
                ctx.report('width', `code of '${p.name}' is ${p.bits.length} bits wide; the first code is ${width} bits wide`, p.valueRange, {
                    state: p.name, related: [{ message: 'the first code', range: fixed[0]!.valueRange }],
                });
                continue;
            }
            bits = p.bits;
        } else {
            if (!(p.value < 2 ** width)) {
                ctx.report('width', `code ${p.value} of '${p.name}' does not fit ${width} bits`, p.valueRange, { state: p.name });
                continue;
            }
            bits = p.value.toString(2).padStart(width, '0');
        }
        const clash = byBits.get(bits);
        if (clash !== undefined) {
            ctx.report('encoding', `'${p.name}' and '${clash}' have the same code ${bits}`, p.valueRange, { state: p.name });
            continue;
        }
        byBits.set(bits, p.name);
        codes.set(p.state, { bits, range: p.range });
    }
    stateNodes.forEach((s, index) => {
        if (s.name !== undefined && !parsed.some((p) => p.state === index) && symbols.states.get(s.name) === index) {
            ctx.report('encoding', `state '${s.name}' has no \`code\` (encoding explicit gives every state one)`, propertyRange(s, 'name'), { state: s.name });
        }
    });
    return codes;
}
