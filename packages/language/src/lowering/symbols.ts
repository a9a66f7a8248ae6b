/**
 * One machine's names. Clock, reset, inputs, outputs and states share ONE namespace, compared
 * case-insensitively: VHDL does not distinguish case, and in VHDL the state names (enumeration
 * literals), ports and signals live in the same declarative region. Scenarios have their own.
 */
import { type SourceRange, reservedBy, vhdlIdentifierProblem } from '@detent/core';
import { type LoweringContext, suggest } from './context.js';

export type SymbolKind = 'clock' | 'reset' | 'input' | 'output' | 'state';

interface Declared {
    readonly name: string;
    readonly kind: SymbolKind;
    readonly range: SourceRange;
    readonly implicit: boolean;
}

const KIND_WORD: Readonly<Record<SymbolKind, string>> = { clock: 'the clock', reset: 'the reset', input: 'an input', output: 'an output', state: 'a state' };

export class MachineSymbols {
    private readonly byLower = new Map<string, Declared>();
    readonly inputs = new Map<string, number>();
    readonly outputs = new Map<string, number>();
    readonly states = new Map<string, number>();
    private readonly kinds = new Map<string, SymbolKind>();

    constructor(private readonly ctx: LoweringContext) {}

    /**
     * Declares a name; reports `duplicate-name` (also for a name differing only in case) and
     * `reserved-name`. Returns false for a duplicate, which the caller then skips.
     */
    declare(name: string, kind: SymbolKind, range: SourceRange, implicit = false): boolean {
        const lower = name.toLowerCase();
        const earlier = this.byLower.get(lower);
        if (earlier) {
            const what = `${KIND_WORD[earlier.kind]} '${earlier.name}'`;
            const message = earlier.implicit
                ? `'${name}' clashes with the default clock 'clk'; declare the clock (clock c;) with another name`
                : earlier.name === name
                    ? `'${name}' is already declared as ${what}`
                    : `'${name}' differs from ${what} only in case; VHDL does not distinguish case, so the exports would clash`;
            this.ctx.report('duplicate-name', message, range, {
                ...(kind === 'state' ? { state: name } : { signal: name }),
                related: earlier.implicit ? [] : [{ message: `'${earlier.name}' declared here`, range: earlier.range }],
            });
            return false;
        }
        this.byLower.set(lower, { name, kind, range, implicit });
        this.kinds.set(name, kind);
        if (!implicit) checkReserved(this.ctx, name, range, kind === 'state' ? { state: name } : { signal: name });
        return true;
    }

    kindOf(name: string): SymbolKind | undefined {
        return this.kinds.get(name);
    }

    /** A message for a name that does not resolve to the wanted kind. */
    unknown(name: string, wanted: 'input' | 'output' | 'state', use: string): string {
        const actual = this.kindOf(name);
        if (actual) return `'${name}' is ${KIND_WORD[actual]}, not ${KIND_WORD[wanted]}; ${use}`;
        const pool = wanted === 'input' ? this.inputs.keys() : wanted === 'output' ? this.outputs.keys() : this.states.keys();
        const hint = suggest(name, pool);
        return `no ${wanted} named '${name}'${hint ? ` (did you mean '${hint}'?)` : ''}`;
    }
}

/** `reserved-name` for a name some export target cannot use. */
export function checkReserved(ctx: LoweringContext, name: string, range: SourceRange, about: { state?: string; signal?: string }): void {
    const by = reservedBy(name);
    if (by.length > 0) {
        const why = by.includes('Detent exports') && by.length === 1
            ? 'the exports generate this name themselves'
            : `it is a reserved word in ${by.filter((b) => b !== 'Detent exports').join(', ')}`;
        ctx.report('reserved-name', `'${name}' cannot be used: ${why}`, range, about);
        return;
    }
    const vhdl = vhdlIdentifierProblem(name);
    if (vhdl) ctx.report('reserved-name', `'${name}' cannot be used: ${vhdl}`, range, about);
}
