/**
 * `detent check` output formats: text lines, the JSON of LANGUAGE.md, and SARIF 2.1.0.
 */
import { relative, isAbsolute, sep } from 'node:path';
import { pathToFileURL } from 'node:url';
import { DEFAULT_SEVERITY, type Finding, type FindingCode, type Severity } from '@detent/core';

export interface FileReport {
    readonly path: string;
    readonly findings: readonly Finding[];
}

/** `file:line:col: severity code: message`, 1-based line and column. */
export function textReport(files: readonly FileReport[]): string {
    const lines: string[] = [];
    for (const f of files) {
        for (const d of f.findings) {
            lines.push(`${f.path}:${d.range.start.line + 1}:${d.range.start.character + 1}: ${d.severity} ${d.code}: ${d.message}`);
        }
    }
    return lines.length > 0 ? `${lines.join('\n')}\n` : '';
}

export function summary(files: readonly FileReport[]): string {
    const count = (s: Severity) => files.reduce((n, f) => n + f.findings.filter((d) => d.severity === s).length, 0);
    const plural = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;
    return `${plural(files.length, 'file')} checked: ${plural(count('error'), 'error')}, ${plural(count('warning'), 'warning')}, ${count('info')} info\n`;
}

/** `{"files":[{"path","diagnostics":[{"code","severity","message","range","state","signal","witness"}]}]}`; absent fields are null. */
export function jsonReport(files: readonly FileReport[]): string {
    const out = {
        files: files.map((f) => ({
            path: f.path,
            diagnostics: f.findings.map((d) => ({
                code: d.code,
                severity: d.severity,
                message: d.message,
                range: d.range,
                state: d.state ?? null,
                signal: d.signal ?? null,
                witness: d.witness ?? null,
            })),
        })),
    };
    return `${JSON.stringify(out, null, 2)}\n`;
}

const RULE_TEXT: Readonly<Record<FindingCode, string>> = {
    'syntax': 'The parser cannot read the text.',
    'unknown-name': 'A name that is not declared (or is declared as something else).',
    'duplicate-name': 'A name declared twice, also when the two differ only in case.',
    'reserved-name': 'A name that an exported HDL or C file cannot use.',
    'width': 'A value or bit index that does not fit its bus, or codes of unequal width.',
    'encoding': 'A missing, duplicate or misplaced state code.',
    'output-conflict': 'Moore and Mealy values of an output differ, or a registered output is used as a Mealy output.',
    'overlap': 'Two guards with different effects can both be true.',
    'incomplete': 'Input combinations no transition covers in a state without otherwise.',
    'shadowed': 'A transition of a priority state that can never be the first true one.',
    'never': 'A guard that no input makes true.',
    'unreachable': 'A state no path from the reset state reaches.',
    'equivalent': 'States that no input sequence can tell apart.',
    'no-return': 'No path from the state back to the reset state.',
    'lockup': 'An unused code can stay among unused codes forever.',
    'reset-code': 'A clearing reset gives a code that is no state and does not recover.',
    'no-reset': 'The machine has no reset.',
    'async-input': 'An async input reaches the excitation of more than one flip-flop.',
    'unused-input': 'An input that is declared and never used.',
    'unused-output': 'An output that is declared and never assigned.',
    'scenario': "A scenario's expect does not hold.",
    'limit': 'An analysis was skipped or a size limit was hit.',
};

const RULE_IDS = Object.keys(DEFAULT_SEVERITY) as FindingCode[];
const SARIF_LEVEL: Readonly<Record<Severity, 'error' | 'warning' | 'note'>> = { error: 'error', warning: 'warning', info: 'note' };

function artifactUri(path: string): string {
    if (isAbsolute(path)) return pathToFileURL(path).href;
    const rel = relative('.', path) || path;
    return rel.split(sep).map(encodeURIComponent).join('/');
}

/** SARIF 2.1.0 (OASIS): one run, rule ids are the finding codes, 1-based regions, witness in properties. */
export function sarifReport(files: readonly FileReport[], version: string): string {
    const results = files.flatMap((f, index) => f.findings.map((d) => ({
        ruleId: d.code,
        ruleIndex: RULE_IDS.indexOf(d.code),
        level: SARIF_LEVEL[d.severity],
        message: { text: d.message },
        locations: [{
            physicalLocation: {
                artifactLocation: { uri: artifactUri(f.path), index },
                region: {
                    startLine: d.range.start.line + 1,
                    startColumn: d.range.start.character + 1,
                    endLine: d.range.end.line + 1,
                    endColumn: d.range.end.character + 1,
                },
            },
        }],
        ...(d.related && d.related.length > 0 ? {
            relatedLocations: d.related.map((r, i) => ({
                id: i,
                message: { text: r.message },
                physicalLocation: {
                    artifactLocation: { uri: artifactUri(f.path), index },
                    region: { startLine: r.range.start.line + 1, startColumn: r.range.start.character + 1, endLine: r.range.end.line + 1, endColumn: r.range.end.character + 1 },
                },
            })),
        } : {}),
        properties: {
            ...(d.state !== undefined ? { state: d.state } : {}),
            ...(d.signal !== undefined ? { signal: d.signal } : {}),
            ...(d.witness ? { witness: d.witness } : {}),
        },
    })));
    const log = {
        $schema: 'https://docs.oasis-open.org/sarif/sarif/v2.1.0/errata01/os/schemas/sarif-schema-2.1.0.json',
        version: '2.1.0',
        runs: [{
            tool: {
                driver: {
                    name: 'detent',
                    version,
                    rules: RULE_IDS.map((id) => ({
                        id,
                        shortDescription: { text: RULE_TEXT[id] },
                        defaultConfiguration: { level: SARIF_LEVEL[DEFAULT_SEVERITY[id]] },
                    })),
                },
            },
            columnKind: 'utf16CodeUnits',
            artifacts: files.map((f) => ({ location: { uri: artifactUri(f.path) } })),
            results,
        }],
    };
    return `${JSON.stringify(log, null, 2)}\n`;
}
