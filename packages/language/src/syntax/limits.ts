/**
 * Size limits checked on the raw text before parsing, so hostile or generated input cannot
 * exhaust the parser's stack (the guard grammar recurses once per `(` and per prefix `!`).
 * Documented in docs/language.md (Limits).
 */
export const MAX_GUARD_DEPTH = 64;
export const MAX_NAME_LENGTH = 128;
/** UTF-16 code units of one file (2 MiB of ASCII). */
export const MAX_SOURCE_LENGTH = 2 * 1024 * 1024;

export interface LimitViolation {
    readonly offset: number;
    readonly length: number;
    readonly message: string;
}

export interface PrescanResult {
    /** The text to parse: unchanged, or with each too-deep guard blanked (same length, same line breaks). */
    readonly text: string;
    readonly violations: readonly LimitViolation[];
}

interface Frame {
    /** `!` directly in front of this `(`. */
    readonly nots: number;
    /** Offset where the outermost prefix chain of this nest started. */
    readonly chainStart: number;
}

/**
 * Finds guards nested deeper than MAX_GUARD_DEPTH (open parentheses plus the prefix `!`s that
 * apply at a point) and names longer than MAX_NAME_LENGTH. A too-deep nest is replaced by `0`
 * and spaces up to its closing parenthesis, so the rest of the file still parses normally.
 */
export function prescan(source: string): PrescanResult {
    if (source.length > MAX_SOURCE_LENGTH) {
        // Parsing runs at a few hundred kB per second: refuse instead of blocking the CLI or the
        // editor for minutes. Nothing is parsed, so no offset of the parse result needs to match.
        return {
            text: '',
            violations: [{ offset: 0, length: 0, message: `file has ${source.length} characters; Detent reads files of up to ${MAX_SOURCE_LENGTH} (split it into several files)` }],
        };
    }
    const violations: LimitViolation[] = [];
    const blanks: { from: number; to: number; parity?: boolean }[] = [];
    const stack: Frame[] = [];
    let notRun = 0;
    let notRunStart = -1;
    let depth = 0;
    let tooDeepFrom = -1;
    let i = 0;
    const n = source.length;
    const endNest = (end: number) => {
        if (tooDeepFrom >= 0) blanks.push({ from: tooDeepFrom, to: end });
        tooDeepFrom = -1;
    };
    while (i < n) {
        const ch = source.charCodeAt(i);
        // comments and whitespace do not end a prefix run
        if (ch === 47 /* / */ && source.charCodeAt(i + 1) === 47) {
            while (i < n && source.charCodeAt(i) !== 10) i++;
            continue;
        }
        if (ch === 47 && source.charCodeAt(i + 1) === 42 /* * */) {
            const close = source.indexOf('*/', i + 2);
            i = close < 0 ? n : close + 2;
            continue;
        }
        if (ch === 32 || ch === 9 || ch === 10 || ch === 13) { i++; continue; }
        if (ch === 33 /* ! */ && source.charCodeAt(i + 1) !== 61 /* != */) {
            if (notRun === 0) notRunStart = i;
            notRun++;
            depth++;
            if (depth > MAX_GUARD_DEPTH && tooDeepFrom < 0) {
                violations.push({ offset: i, length: 1, message: `guard nested deeper than ${MAX_GUARD_DEPTH} levels (parentheses and '!')` });
                tooDeepFrom = stack.length > 0 ? stack[0]!.chainStart : notRunStart;
            }
            i++;
            continue;
        }
        if (ch === 40 /* ( */) {
            const chainStart = notRun > 0 ? notRunStart : i;
            stack.push({ nots: notRun, chainStart: stack.length > 0 ? stack[0]!.chainStart : chainStart });
            notRun = 0;
            depth++;
            if (depth > MAX_GUARD_DEPTH && tooDeepFrom < 0) {
                violations.push({ offset: i, length: 1, message: `guard nested deeper than ${MAX_GUARD_DEPTH} levels (parentheses and '!')` });
                tooDeepFrom = stack[0]!.chainStart;
            }
            i++;
            continue;
        }
        // any other token ends the current prefix run
        depth -= notRun;
        notRun = 0;
        if (ch === 41 /* ) */) {
            const frame = stack.pop();
            if (frame) depth -= 1 + frame.nots;
            if (stack.length === 0) endNest(i + 1);
            i++;
            continue;
        }
        if (ch === 59 /* ; */ || ch === 123 /* { */ || ch === 125 /* } */ || (ch === 45 /* - */ && source.charCodeAt(i + 1) === 62 /* > */)) {
            // a guard never spans these: an unbalanced nest ends here
            if (stack.length > 0) { stack.length = 0; depth = 0; }
            endNest(i);
            i++;
            continue;
        }
        if ((ch >= 65 && ch <= 90) || (ch >= 97 && ch <= 122) || ch === 95) {
            const start = i;
            while (i < n && isNameChar(source.charCodeAt(i))) i++;
            if (i - start > MAX_NAME_LENGTH) {
                violations.push({ offset: start, length: i - start, message: `name longer than ${MAX_NAME_LENGTH} characters` });
            }
            continue;
        }
        i++;
    }
    endNest(n);
    if (blanks.length === 0) return { text: source, violations };
    let text = '';
    let last = 0;
    for (const b of blanks) {
        text += source.slice(last, b.from) + '0' + source.slice(b.from + 1, b.to).replace(/[^\r\n]/g, ' ');
        last = b.to;
    }
    text += source.slice(last);
    return { text, violations };
}

function isNameChar(c: number): boolean {
    return (c >= 65 && c <= 90) || (c >= 97 && c <= 122) || (c >= 48 && c <= 57) || c === 95;
}
