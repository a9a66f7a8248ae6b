/**
 * The editor's view of the language's validation: the same findings as `detent check`, with the
 * user's severity overrides (`detent.severity`: code → error | warning | info | hint | off) applied
 * and each witness also given as related information, so it shows in the Problems panel tree.
 */
import { type LangiumDocument, type ValidationOptions, Cancellation } from 'langium';
import type { LangiumServices } from 'langium/lsp';
import { type Diagnostic, DiagnosticSeverity } from 'vscode-languageserver-types';
import type { Witness } from '@detent/core';
import { DetentDocumentValidator } from '../validation/document-validator.js';
import type { DetentServices } from '../detent-module.js';
import { witnessText } from './machine-text.js';

const OVERRIDES: Readonly<Record<string, DiagnosticSeverity | 'off'>> = {
    error: DiagnosticSeverity.Error,
    warning: DiagnosticSeverity.Warning,
    info: DiagnosticSeverity.Information,
    information: DiagnosticSeverity.Information,
    hint: DiagnosticSeverity.Hint,
    off: 'off',
};

/** Applies `severity` overrides; unknown values are ignored (the default stays). */
export function applySeverity(diagnostics: readonly Diagnostic[], severity: Readonly<Record<string, string>>): Diagnostic[] {
    const out: Diagnostic[] = [];
    for (const d of diagnostics) {
        const override = typeof d.code === 'string' ? OVERRIDES[severity[d.code] ?? ''] : undefined;
        if (override === 'off') continue;
        out.push(override === undefined ? d : { ...d, severity: override });
    }
    return out;
}

/** Adds the witness as a related-information entry at the diagnostic's own range. */
export function withWitnessInfo(d: Diagnostic, uri: string): Diagnostic {
    const witness = (d.data as { witness?: Witness } | undefined)?.witness;
    const text = witnessText(witness);
    if (!text) return d;
    return { ...d, relatedInformation: [...(d.relatedInformation ?? []), { location: { uri, range: d.range }, message: `witness: ${text}` }] };
}

export class DetentEditorValidator extends DetentDocumentValidator {
    private readonly editor: DetentServices;

    constructor(services: LangiumServices) {
        super(services);
        this.editor = services as DetentServices;
    }

    override async validateDocument(document: LangiumDocument, options: ValidationOptions = {}, cancelToken = Cancellation.CancellationToken.None): Promise<Diagnostic[]> {
        const diagnostics = await super.validateDocument(document, options, cancelToken);
        const uri = document.uri.toString();
        return applySeverity(diagnostics, this.editor.lsp.DetentSettings.settings.severity).map((d) => withWitnessInfo(d, uri));
    }
}
