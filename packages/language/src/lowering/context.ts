/**
 * Shared state of one machine's lowering: findings, ranges from the CST, number parsing.
 */
import type { AstNode, CstNode, Reference } from 'langium';
import { GrammarUtils } from 'langium';
import { type Finding, type FindingCode, type SourceRange, NO_RANGE, finding } from '@detent/core';

/** Codes whose presence makes the model too incomplete for analyses (see docs/language.md). */
const BLOCKING: ReadonlySet<FindingCode> = new Set<FindingCode>(['syntax', 'unknown-name', 'duplicate-name', 'width', 'encoding']);

export class LoweringContext {
    readonly findings: Finding[] = [];
    /** Set when a finding makes the machine unusable for analyses. */
    blocked = false;

    report(code: FindingCode, message: string, range: SourceRange, extra: Partial<Omit<Finding, 'code' | 'message' | 'range'>> = {}): void {
        const f = finding(code, message, range, extra);
        this.findings.push(f);
        if (f.severity === 'error' && BLOCKING.has(code)) this.blocked = true;
    }
}

export function rangeOf(node: AstNode | undefined): SourceRange {
    return cstRange(node?.$cstNode);
}

export function cstRange(cst: CstNode | undefined): SourceRange {
    if (!cst) return NO_RANGE;
    const r = cst.range;
    return { start: { line: r.start.line, character: r.start.character }, end: { line: r.end.line, character: r.end.character } };
}

/** Range of one property's text, e.g. a declaration's name. */
export function propertyRange(node: AstNode, property: string, index?: number): SourceRange {
    const cst = GrammarUtils.findNodeForProperty(node.$cstNode, property, index);
    return cst ? cstRange(cst) : rangeOf(node);
}

export function referenceRange(ref: Reference | undefined, owner: AstNode): SourceRange {
    return ref?.$refNode ? cstRange(ref.$refNode) : rangeOf(owner);
}

export interface NumberValue {
    /** The value; `Infinity` when it exceeds 2^53 (never fits anything). */
    readonly value: number;
    /** Bits MSB first when the literal fixes its width: `0b` digits, 4 per `0x` digit. */
    readonly bits?: string;
}

export function parseNumber(text: string): NumberValue {
    const lower = text.toLowerCase();
    if (lower.startsWith('0b')) {
        const digits = lower.slice(2);
        return { value: digitsValue(digits, 2), bits: digits };
    }
    if (lower.startsWith('0x')) {
        const digits = lower.slice(2);
        const bits = [...digits].map((d) => parseInt(d, 16).toString(2).padStart(4, '0')).join('');
        return { value: digitsValue(digits, 16), bits };
    }
    return { value: digitsValue(lower, 10) };
}

function digitsValue(digits: string, radix: number): number {
    const v = parseInt(digits, radix);
    return Number.isSafeInteger(v) ? v : Infinity;
}

/** Smallest number of bits holding `value` (at least 1). */
export function bitsFor(value: number): number {
    let w = 1;
    while (value >= 2 ** w) w++;
    return w;
}

/** Nearest name within edit distance 2, for "did you mean" hints. */
export function suggest(name: string, candidates: Iterable<string>): string | undefined {
    let best: string | undefined;
    let bestDistance = 3;
    for (const c of candidates) {
        const d = editDistance(name.toLowerCase(), c.toLowerCase(), bestDistance);
        if (d < bestDistance) { best = c; bestDistance = d; }
    }
    return best;
}

function editDistance(a: string, b: string, cap: number): number {
    if (Math.abs(a.length - b.length) >= cap) return cap;
    let prev = Array.from({ length: b.length + 1 }, (_, j) => j);
    for (let i = 1; i <= a.length; i++) {
        const cur = [i];
        for (let j = 1; j <= b.length; j++) {
            cur[j] = Math.min(prev[j]! + 1, cur[j - 1]! + 1, prev[j - 1]! + (a[i - 1] === b[j - 1] ? 0 : 1));
        }
        prev = cur;
    }
    return prev[b.length]!;
}
