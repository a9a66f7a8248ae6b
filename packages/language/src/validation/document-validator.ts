/**
 * Replaces Langium's validator: a document's diagnostics are exactly the findings `checkText`
 * gives for its text (syntax, lowering, core checks), so editor and CLI never disagree.
 * Langium's own linking errors are not reported: lowering reports `unknown-name` instead.
 */
import { type LangiumCoreServices, type LangiumDocument, type ValidationOptions, Cancellation, DefaultDocumentValidator } from 'langium';
import type { Diagnostic } from 'vscode-languageserver-types';
import type { CheckOptions } from '@detent/core';
import { analyzeParse, checkParsed } from '../analyze.js';
import { prescan } from '../syntax/limits.js';
import { LineIndex } from '../syntax/positions.js';
import { findingToDiagnostic } from './diagnostics.js';
import { finding } from '@detent/core';

export class DetentDocumentValidator extends DefaultDocumentValidator {
    private readonly checkOptions: () => CheckOptions;

    constructor(services: LangiumCoreServices) {
        super(services);
        const detent = (services as LangiumCoreServices & { detent?: { CheckOptions?: CheckOptions } }).detent;
        this.checkOptions = () => detent?.CheckOptions ?? {};
    }

    override async validateDocument(document: LangiumDocument, options: ValidationOptions = {}, cancelToken = Cancellation.CancellationToken.None): Promise<Diagnostic[]> {
        // Everything Detent checks runs in the 'fast' category; other passes add nothing.
        if (options.categories && !options.categories.includes('fast')) return [];
        if (cancelToken.isCancellationRequested) return [];
        const text = document.textDocument.getText();
        const uri = document.uri.toString();
        // the parser already saw the guarded text (services/parser.ts); here only the violations are reported
        const scan = prescan(text);
        const result = document.parseResult;
        const lines = new LineIndex(text);
        const limits = scan.violations.map((v) => ({ finding: finding('syntax', v.message, lines.range(v.offset, v.length)), offset: v.offset }));
        const findings = checkParsed(analyzeParse(result, text, limits), this.checkOptions());
        return findings.map((f) => findingToDiagnostic(f, uri));
    }
}
