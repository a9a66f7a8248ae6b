/**
 * Text for analysis messages: guards printed back in Detent syntax, witness input assignments.
 * The model carries no source text, so messages are rebuilt from the guard tree.
 */
import type { Guard, Machine, Transition } from '../model/machine.js';

/** Binding strength of each operator (LANGUAGE.md: `!` > `&` > `^` > `|`; comparisons are primaries). */
function strength(g: Guard): number {
    switch (g.kind) {
        case 'or': return 1;
        case 'xor': return 2;
        case 'and': return 3;
        case 'not': return 4;
        default: return 5;
    }
}

export function formatGuard(g: Guard, machine: Machine): string {
    const name = (i: number) => machine.inputs[i]?.name ?? `#${i}`;
    switch (g.kind) {
        case 'const': return g.value ? '1' : '0';
        case 'input': return name(g.input);
        case 'bit': return `${name(g.input)}[${g.bit}]`;
        case 'compare': return `${name(g.input)} ${g.op} ${g.value}`;
        case 'not': {
            const inner = formatGuard(g.operand, machine);
            return strength(g.operand) < 4 ? `!(${inner})` : `!${inner}`;
        }
        case 'and': case 'or': case 'xor': {
            const op = g.kind === 'and' ? ' & ' : g.kind === 'or' ? ' | ' : ' ^ ';
            const mine = strength(g);
            // Operands of equal strength need no parentheses (the operators are associative).
            return g.operands.map((o) => (strength(o) < mine ? `(${formatGuard(o, machine)})` : formatGuard(o, machine))).join(op);
        }
    }
}

/** Longest guard text quoted in a message; the range shows the rest. */
const MAX_GUARD_TEXT = 60;

/** `'when G'`, the way a transition is named in messages (long guards shortened with …). */
export function transitionLabel(t: Transition, machine: Machine): string {
    const text = formatGuard(t.guard, machine);
    return `'when ${text.length > MAX_GUARD_TEXT ? `${text.slice(0, MAX_GUARD_TEXT - 1)}…` : text}'`;
}

/**
 * `overload=1, level=12`: the inputs that matter for the witness (those the witness cube fixes,
 * or non-zero), with "(other inputs 0)" when some were left out; `all inputs 0` when none matter.
 */
export function formatInputs(inputs: Readonly<Record<string, number>>, relevant: ReadonlySet<string>): string {
    const names = Object.keys(inputs);
    const shown = names.filter((n) => relevant.has(n) || inputs[n] !== 0);
    if (names.length === 0) return 'any input (the machine has none)';
    if (shown.length === 0) return 'all inputs 0';
    const text = shown.map((n) => `${n}=${inputs[n]}`).join(', ');
    return shown.length < names.length ? `${text} (other inputs 0)` : text;
}
