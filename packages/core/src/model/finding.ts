import type { SourceRange } from './machine.js';

/** Every diagnostic code of LANGUAGE.md. Stable: other tools match on these strings. */
export type FindingCode =
    | 'syntax'
    | 'unknown-name'
    | 'duplicate-name'
    | 'reserved-name'
    | 'width'
    | 'encoding'
    | 'output-conflict'
    | 'overlap'
    | 'incomplete'
    | 'shadowed'
    | 'never'
    | 'unreachable'
    | 'equivalent'
    | 'no-return'
    | 'lockup'
    | 'reset-code'
    | 'no-reset'
    | 'async-input'
    | 'unused-input'
    | 'unused-output'
    | 'scenario'
    | 'limit';

export type Severity = 'error' | 'warning' | 'info';

/** The severity LANGUAGE.md gives each code. */
export const DEFAULT_SEVERITY: Readonly<Record<FindingCode, Severity>> = {
    'syntax': 'error',
    'unknown-name': 'error',
    'duplicate-name': 'error',
    'reserved-name': 'error',
    'width': 'error',
    'encoding': 'error',
    'output-conflict': 'error',
    'overlap': 'error',
    'incomplete': 'warning',
    'shadowed': 'warning',
    'never': 'warning',
    'unreachable': 'warning',
    'equivalent': 'warning',
    'no-return': 'info',
    'lockup': 'warning',
    'reset-code': 'error',
    'no-reset': 'warning',
    'async-input': 'warning',
    'unused-input': 'warning',
    'unused-output': 'info',
    'scenario': 'error',
    // Detent's own addition (documented in docs/decisions.md): an analysis was skipped or a size limit hit.
    'limit': 'warning',
};

/**
 * Evidence for a finding. JSON shape (documented in docs/decisions.md):
 * - `inputs`: a concrete input assignment, by input name (bus values as unsigned integers);
 * - `path`: a sequence of state names (e.g. the reset state … the unreachable one's nearest miss);
 * - `cycle`: state codes (MSB first) with the inputs that move each to the next, for lock-ups;
 * - `state`: a state name where the witness needs one (e.g. a Mealy conflict's state).
 */
export interface Witness {
    readonly inputs?: Readonly<Record<string, number>>;
    readonly path?: readonly string[];
    readonly cycle?: readonly { readonly code: string; readonly inputs: Readonly<Record<string, number>> }[];
    readonly state?: string;
}

export interface RelatedInfo {
    readonly message: string;
    readonly range: SourceRange;
}

export interface Finding {
    readonly code: FindingCode;
    readonly severity: Severity;
    readonly message: string;
    readonly range: SourceRange;
    /** Name of the state the finding is about. */
    readonly state?: string;
    /** Name of the input or output the finding is about. */
    readonly signal?: string;
    readonly witness?: Witness;
    readonly related?: readonly RelatedInfo[];
}

export function finding(code: FindingCode, message: string, range: SourceRange, extra: Partial<Omit<Finding, 'code' | 'message' | 'range'>> = {}): Finding {
    return { code, severity: extra.severity ?? DEFAULT_SEVERITY[code], message, range, ...extra };
}
