/**
 * Text → lowered machines + findings (syntax, lowering) and, for `checkText`, the core checks.
 * The editor's validator and the CLI both go through `analyzeParse`, so they report the same.
 */
import { type AstNode, GrammarUtils } from 'langium';
import type { LangiumParser } from 'langium';
import { type CheckOptions, type Finding, type Machine, checkMachine, finding } from '@detent/core';
import { createDetentCoreServices } from './detent-module.js';
import type { Model } from './generated/ast.js';
import { lowerMachine } from './lowering/lower-machine.js';
import { prescan } from './syntax/limits.js';
import { modelLimitFindings } from './syntax/model-limits.js';
import { LineIndex } from './syntax/positions.js';
import { type SyntaxError, lexerFindings, parserFindings } from './syntax/syntax-findings.js';
import type { ParseResult } from 'langium';

export interface LoweredMachine {
    readonly machine: Machine;
    /** Syntax findings inside this machine and its lowering findings. */
    readonly findings: Finding[];
    /** False when errors (syntax, names, widths, encoding) make the analyses meaningless. */
    readonly usable: boolean;
}

export interface ParsedDetent {
    readonly machines: LoweredMachine[];
    /** Every syntax and lowering finding of the text, in text order. */
    readonly findings: Finding[];
}

let parser: LangiumParser | undefined;

function detentParser(): LangiumParser {
    parser ??= createDetentCoreServices().Detent.parser.LangiumParser;
    return parser;
}

/** Parses with the size limits applied (the parser blanks too-deep guards itself, see services/parser.ts). */
export function parseText(text: string): { result: ParseResult<Model>; limitErrors: SyntaxError[] } {
    const scan = prescan(text);
    const lines = new LineIndex(text);
    const limitErrors = scan.violations.map((v) => ({ finding: finding('syntax', v.message, lines.range(v.offset, v.length)), offset: v.offset }));
    return { result: detentParser().parse<Model>(text), limitErrors };
}

export function parseDetent(text: string, uri?: string): ParsedDetent {
    void uri;
    const { result, limitErrors } = parseText(text);
    return analyzeParse(result, text, limitErrors);
}

/** Syntax + lowering for an existing parse result (the editor's documents are parsed by Langium). */
export function analyzeParse(result: ParseResult<AstNode>, text: string, extraSyntax: readonly SyntaxError[] = []): ParsedDetent {
    const lines = new LineIndex(text);
    const syntax = [...extraSyntax, ...lexerFindings(result.lexerErrors, lines, text), ...parserFindings(result.parserErrors, lines, text)];
    const model = result.value as Model;
    const machines: LoweredMachine[] = [];
    const all: Finding[] = [];
    const claimed = new Set<SyntaxError>();
    const names = new Map<string, Machine>();
    for (const node of model.machines ?? []) {
        const { machine, ctx } = lowerMachine(node, text);
        const cst = node.$cstNode;
        const start = cst?.offset ?? 0;
        const end = cst ? cst.end : 0;
        // closed = the machine's own `}` was parsed (not just a nested state's)
        const closed = cst ? GrammarUtils.findNodeForKeyword(cst, '}') !== undefined : false;
        const own = syntax.filter((s) => !claimed.has(s) && s.offset >= start && (s.offset < end || !closed));
        own.forEach((s) => claimed.add(s));
        const findings = [...own.map((s) => s.finding), ...ctx.findings];
        // a nameless machine is what parser recovery leaves after an error another machine claimed
        let usable = !ctx.blocked && own.length === 0 && machine.name !== '';
        if (usable) {
            // size limits: beyond them the analyses and synthesis would hang (docs/limits.md)
            const limits = modelLimitFindings(machine);
            if (limits.length > 0) {
                findings.push(...limits);
                usable = false;
            }
        }
        const lower = machine.name.toLowerCase();
        const earlier = lower ? names.get(lower) : undefined;
        if (earlier) {
            findings.push(finding('duplicate-name', `a machine named '${earlier.name}' is already in this file (names are compared ignoring case: VHDL entities)`, machine.nameRange, {
                related: [{ message: 'the first one', range: earlier.nameRange }],
            }));
            usable = false;
        } else if (lower) {
            names.set(lower, machine);
        }
        sortFindings(findings);
        machines.push({ machine, findings, usable });
        all.push(...findings);
    }
    all.push(...syntax.filter((s) => !claimed.has(s)).map((s) => s.finding));
    return { machines, findings: sortFindings(all) };
}

/** Syntax + lowering + every core check of each usable machine. */
export function checkText(text: string, uri?: string, options?: CheckOptions): Finding[] {
    const parsed = parseDetent(text, uri);
    return checkParsed(parsed, options);
}

export function checkParsed(parsed: ParsedDetent, options?: CheckOptions): Finding[] {
    const findings = [...parsed.findings];
    for (const m of parsed.machines) if (m.usable) findings.push(...checkMachine(m.machine, options));
    return sortFindings(findings);
}

export function sortFindings(findings: Finding[]): Finding[] {
    return findings.sort((a, b) => a.range.start.line - b.range.start.line || a.range.start.character - b.range.start.character);
}
