/**
 * Formatting: a token-level pretty printer instead of Langium's CST formatter, because its three
 * guarantees are easiest to keep at the token level:
 * - it never changes meaning: the output has exactly the input's tokens in the same order (checked
 *   by re-lexing the result; any difference and the formatter gives up and changes nothing);
 * - it keeps every comment verbatim (the interior of a block comment is never touched);
 * - it is idempotent: spacing and indentation are functions of the token sequence alone, except the
 *   gap before a trailing comment and the line structure, which are carried over as they are.
 * Line breaks stay where the author put them (runs of blank lines shrink to one); indentation is
 * one level per open brace, plus one for a continuation line inside a statement.
 */
import type { DocumentFormattingParams, DocumentOnTypeFormattingOptions, DocumentRangeFormattingParams, FormattingOptions, TextEdit } from 'vscode-languageserver-protocol';
import type { LangiumDocument, MaybePromise } from 'langium';
import type { Formatter } from 'langium/lsp';
import { MAX_SOURCE_LENGTH } from '../syntax/limits.js';

type TokenKind = 'id' | 'number' | 'punct' | 'line-comment' | 'block-comment';

interface Token {
    readonly kind: TokenKind;
    readonly text: string;
    /** Newlines in the whitespace before this token. */
    readonly newlinesBefore: number;
    /** The whitespace before this token on its own line (used for trailing comments). */
    readonly gapBefore: string;
}

const PUNCT2 = ['->', '==', '!=', '<=', '>='];
const PUNCT1 = '{}()[];,=!&^|<>*';

/** Splits Detent text into tokens; undefined when some character is not Detent at all. */
export function lexDetent(text: string): Token[] | undefined {
    const tokens: Token[] = [];
    let i = 0;
    while (i <= text.length) {
        const wsStart = i;
        while (i < text.length && /\s/.test(text[i]!)) i++;
        const ws = text.slice(wsStart, i);
        if (i >= text.length) break;
        const newlinesBefore = (ws.match(/\r\n|\r|\n/g) ?? []).length;
        const gapBefore = ws.slice(Math.max(ws.lastIndexOf('\n'), ws.lastIndexOf('\r')) + 1);
        const rest = text.slice(i);
        let m: RegExpMatchArray | null;
        let kind: TokenKind;
        let value: string;
        if (rest.startsWith('//')) {
            m = rest.match(/^\/\/[^\n\r]*/);
            kind = 'line-comment';
            value = m![0];
        } else if (rest.startsWith('/*')) {
            const end = rest.indexOf('*/', 2);
            if (end < 0) return undefined;
            kind = 'block-comment';
            value = rest.slice(0, end + 2);
        } else if ((m = rest.match(/^(0[bB][01]+|0[xX][0-9a-fA-F]+|[0-9]+)/))) {
            kind = 'number';
            value = m[0];
        } else if ((m = rest.match(/^[A-Za-z_][A-Za-z0-9_]*/))) {
            kind = 'id';
            value = m[0];
        } else if (PUNCT2.includes(rest.slice(0, 2))) {
            kind = 'punct';
            value = rest.slice(0, 2);
        } else if (PUNCT1.includes(rest[0]!)) {
            kind = 'punct';
            value = rest[0]!;
        } else {
            return undefined;
        }
        tokens.push({ kind, text: value, newlinesBefore, gapBefore });
        i += value.length;
    }
    return tokens;
}

/** Keywords after which `[` opens a width, not a bit select. */
const WIDTH_KEYWORDS = new Set(['input', 'output', 'registered', 'async']);
const BINARY = new Set(['&', '^', '|', '==', '!=', '<', '<=', '>', '>=', '->', '=', '*']);

function spaceBetween(prev: Token, next: Token): string {
    if (next.kind === 'line-comment' || next.kind === 'block-comment') return next.gapBefore.length > 0 ? next.gapBefore.replace(/\t/g, ' ') : ' ';
    if (prev.kind === 'block-comment') return ' ';
    const p = prev.text;
    const n = next.text;
    if (n === ';' || n === ',' || n === ')' || n === ']') return '';
    if (p === '(' || p === '!') return '';
    if (p === '[') return '';
    if (n === '[') return prev.kind === 'id' && !WIDTH_KEYWORDS.has(p) ? '' : ' ';
    if (BINARY.has(n) || BINARY.has(p)) return ' ';
    return ' ';
}

/** True when a statement is still open after this token (the next line is a continuation). */
function endsStatement(t: Token): boolean {
    return t.text === ';' || t.text === '{' || t.text === '}' || t.kind === 'line-comment' || t.kind === 'block-comment';
}

export interface DetentFormatOptions {
    readonly tabSize: number;
    readonly insertSpaces: boolean;
}

/** The formatted text, or undefined when the text cannot be formatted safely (unknown characters, unclosed comment). */
export function formatDetentText(text: string, options: DetentFormatOptions = { tabSize: 4, insertSpaces: true }): string | undefined {
    // beyond the file-length limit nothing is parsed either; formatting megabytes would block the server for seconds
    if (text.length > MAX_SOURCE_LENGTH) return undefined;
    const tokens = lexDetent(text);
    if (!tokens) return undefined;
    const unit = options.insertSpaces ? ' '.repeat(Math.max(1, options.tabSize)) : '\t';
    const lines: string[] = [];
    let line = '';
    let depth = 0;
    let continuation = false;
    let prev: Token | undefined;
    let lastCode: Token | undefined;
    for (const token of tokens) {
        const startsLine = prev === undefined || token.newlinesBefore > 0;
        if (startsLine) {
            if (prev !== undefined) {
                lines.push(line.trimEnd());
                if (token.newlinesBefore > 1) lines.push('');
            }
            const closes = token.text === '}' ? 1 : 0;
            const level = Math.max(0, depth - closes) + (continuation && closes === 0 && token.text !== '{' ? 1 : 0);
            line = unit.repeat(level) + token.text;
        } else {
            line += spaceBetween(prev!, token) + token.text;
        }
        if (token.kind === 'punct') {
            if (token.text === '{') depth++;
            else if (token.text === '}') depth = Math.max(0, depth - 1);
        }
        if (token.kind !== 'line-comment' && token.kind !== 'block-comment') lastCode = token;
        // A comment line does not end or start a statement: continuation follows the last code token.
        continuation = lastCode !== undefined && !endsStatement(lastCode) && depth > 0;
        prev = token;
    }
    if (prev !== undefined) lines.push(line.trimEnd());
    const result = lines.length === 0 ? '' : lines.join('\n') + '\n';
    // The guarantee: same tokens, same order.
    const again = lexDetent(result);
    if (!again || again.length !== tokens.length || again.some((t, k) => t.text !== tokens[k]!.text || t.kind !== tokens[k]!.kind)) return undefined;
    return result;
}

export class DetentFormatter implements Formatter {
    formatDocument(document: LangiumDocument, params: DocumentFormattingParams): MaybePromise<TextEdit[]> {
        return this.edits(document, params.options);
    }

    /** Range formatting formats the whole document: indentation depends on everything before the range. */
    formatDocumentRange(document: LangiumDocument, params: DocumentRangeFormattingParams): MaybePromise<TextEdit[]> {
        return this.edits(document, params.options);
    }

    formatDocumentOnType(): MaybePromise<TextEdit[]> {
        return [];
    }

    get formatOnTypeOptions(): DocumentOnTypeFormattingOptions | undefined {
        return undefined;
    }

    protected edits(document: LangiumDocument, options: FormattingOptions): TextEdit[] {
        try {
            return this.computeEdits(document, options);
        } catch (err) {
            console.error(`detent: formatting failed: ${err instanceof Error ? err.stack ?? err.message : String(err)}`);
            return [];
        }
    }

    protected computeEdits(document: LangiumDocument, options: FormattingOptions): TextEdit[] {
        // Never reformat text the parser could not read: the author is mid-edit.
        if (document.parseResult.lexerErrors.length > 0 || document.parseResult.parserErrors.length > 0) return [];
        const text = document.textDocument.getText();
        const formatted = formatDetentText(text, { tabSize: options.tabSize, insertSpaces: options.insertSpaces });
        if (formatted === undefined || formatted === text) return [];
        const end = document.textDocument.positionAt(text.length);
        return [{ range: { start: { line: 0, character: 0 }, end }, newText: formatted }];
    }
}
