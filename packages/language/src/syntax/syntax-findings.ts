/**
 * Lexer and parser errors → `syntax` findings with exact ranges and short messages.
 */
import type { ILexingError, IRecognitionException } from 'chevrotain';
import { type Finding, finding } from '@detent/core';
import type { LineIndex } from './positions.js';

export interface SyntaxError {
    readonly finding: Finding;
    readonly offset: number;
}

export function lexerFindings(errors: readonly ILexingError[], lines: LineIndex, text: string): SyntaxError[] {
    return errors.map((e) => {
        const ch = text.slice(e.offset, e.offset + Math.max(1, e.length));
        const message = `unexpected character${ch.length > 1 ? 's' : ''} '${ch}'`;
        return { finding: finding('syntax', message, lines.range(e.offset, Math.max(1, e.length))), offset: e.offset };
    });
}

export function parserFindings(errors: readonly IRecognitionException[], lines: LineIndex, text: string): SyntaxError[] {
    return errors.map((e) => {
        const token = e.token;
        const atEnd = token.tokenType?.name === 'EOF' || Number.isNaN(token.startOffset);
        const offset = atEnd ? text.length : token.startOffset;
        const length = atEnd ? 0 : (token.endOffset ?? token.startOffset) - token.startOffset + 1;
        const range = atEnd ? { start: lines.end(), end: lines.end() } : lines.range(offset, length);
        const keywordAsName = !atEnd && /^[A-Za-z_]\w*$/.test(token.image) && /'Name'|\[Name\]|Name\b/.test(e.message) && !/Name/.test(token.tokenType?.name ?? '');
        const message = keywordAsName
            ? `'${token.image}' is a Detent keyword and cannot be used as a name here`
            : shorten(e.message, atEnd ? 'end of file' : `'${token.image}'`);
        return { finding: finding('syntax', message, range), offset };
    });
}

/** Chevrotain lists every viable token sequence; one line is enough in an editor. */
/** Token names as a user reads them. */
function tokenWord(token: string): string {
    const bare = token.replace(/^'|'$/g, '');
    if (bare === 'Name') return 'a name';
    if (bare === 'NumberLiteral') return 'a number';
    return `'${bare}'`;
}

function shorten(message: string, found: string): string {
    const expecting = /Expecting token of type '([^']+)'/.exec(message);
    if (expecting) return `expected ${tokenWord(expecting[1]!)} but found ${found}`;
    const keyword = /Expecting: expecting '([^']+)'/.exec(message);
    if (keyword) return `expected '${keyword[1]}' but found ${found}`;
    if (/^Expecting end of file/.test(message)) return `unexpected ${found} after the last machine`;
    if (/one of these possible Token sequences/.test(message)) {
        const options = [...message.matchAll(/\[([^\]]+)\]/g)].map((m) => m[1]!.split(',')[0]!.trim());
        const unique = [...new Set(options.map(tokenWord))].slice(0, 6);
        return unique.length > 0 ? `unexpected ${found}; expected ${unique.join(', ')}` : `unexpected ${found}`;
    }
    const first = message.split('\n')[0]!.trim().replace(/`([^`]*)`/g, "'$1'");
    return first.length > 0 ? first : `unexpected ${found}`;
}
