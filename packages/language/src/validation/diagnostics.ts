/**
 * Core `Finding` → LSP `Diagnostic`: `code` is the finding code, `source` is 'detent', and
 * `data` carries what code actions and hovers need (witness, state, signal).
 */
import type { Diagnostic, DiagnosticRelatedInformation } from 'vscode-languageserver-types';
import { DiagnosticSeverity } from 'vscode-languageserver-types';
import type { Finding, FindingCode, Witness } from '@detent/core';

export interface DetentDiagnosticData {
    readonly code: FindingCode;
    readonly witness?: Witness;
    readonly state?: string;
    readonly signal?: string;
}

const SEVERITY = { error: DiagnosticSeverity.Error, warning: DiagnosticSeverity.Warning, info: DiagnosticSeverity.Information } as const;

export function findingToDiagnostic(f: Finding, uri: string): Diagnostic {
    const data: DetentDiagnosticData = {
        code: f.code,
        ...(f.witness ? { witness: f.witness } : {}),
        ...(f.state !== undefined ? { state: f.state } : {}),
        ...(f.signal !== undefined ? { signal: f.signal } : {}),
    };
    const related: DiagnosticRelatedInformation[] = (f.related ?? []).map((r) => ({ message: r.message, location: { uri, range: r.range } }));
    return {
        range: f.range,
        severity: SEVERITY[f.severity],
        code: f.code,
        source: 'detent',
        message: f.message,
        data,
        ...(related.length > 0 ? { relatedInformation: related } : {}),
    };
}
