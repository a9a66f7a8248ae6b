/**
 * As-built diagnostics (lockup, reset-code, async-input and their `limit`s) in a second, idle-time
 * phase. They need a full synthesis and a reachability analysis of the synthesized logic (hundreds
 * of milliseconds on a large machine), which would make every keystroke wait. So the editor's
 * build runs every other check (`skipAsBuilt`) and publishes at once; when the document has then
 * been quiet for `AS_BUILT_IDLE_MS`, this service runs core's (internally time-bounded) as-built
 * analysis machine by machine, checks between machines that no newer text arrived (a newer text
 * cancels the run), and publishes the merged diagnostics. Results are cached per machine text, so
 * an edit in one machine of a file does not re-analyze the others.
 */
import { DocumentState, type LangiumDocument } from 'langium';
import type { LangiumSharedServices } from 'langium/lsp';
import type { Connection } from 'vscode-languageserver';
import type { Diagnostic } from 'vscode-languageserver-types';
import { type Finding, analyzeAsBuilt } from '@detent/core';
import { analyzeParse } from '../analyze.js';
import { findingToDiagnostic } from '../validation/diagnostics.js';
import type { DetentServices } from '../detent-module.js';
import { applySeverity, withWitnessInfo } from './editor-validator.js';
import { logError } from './fail-soft.js';

/** Quiet time after the fast diagnostics before the as-built analysis starts. */
export const AS_BUILT_IDLE_MS = 250;
const CACHE_SIZE = 64;

export function isAsBuiltDiagnostic(d: Diagnostic): boolean {
    return (d.data as { asBuilt?: boolean } | undefined)?.asBuilt === true;
}

export class AsBuiltDiagnostics {
    private readonly timers = new Map<string, ReturnType<typeof setTimeout>>();
    private readonly cache = new Map<string, Finding[]>();

    constructor(private readonly shared: LangiumSharedServices, private readonly detent: DetentServices, private readonly connection: Connection) {
        shared.workspace.DocumentBuilder.onDocumentPhase(DocumentState.Validated, (document) => this.schedule(document));
    }

    private currentVersion(uri: string): number | undefined {
        return this.shared.workspace.TextDocuments?.get(uri)?.version;
    }

    private schedule(document: LangiumDocument): void {
        const uri = document.uri.toString();
        const version = document.textDocument.version;
        const previous = this.timers.get(uri);
        if (previous) clearTimeout(previous);
        this.timers.set(uri, setTimeout(() => {
            this.timers.delete(uri);
            try {
                this.run(document, uri, version);
            } catch (err) {
                logError(this.shared, 'as-built analysis', err);
            }
        }, AS_BUILT_IDLE_MS));
    }

    private stale(document: LangiumDocument, uri: string, version: number): boolean {
        const current = this.currentVersion(uri);
        return (current !== undefined && current !== version) || document.textDocument.version !== version || document.state < DocumentState.Validated;
    }

    private run(document: LangiumDocument, uri: string, version: number): void {
        if (this.stale(document, uri, version)) return;
        const text = document.textDocument.getText();
        const parsed = analyzeParse(document.parseResult, text);
        const findings: Finding[] = [];
        for (const m of parsed.machines) {
            if (!m.usable) continue;
            const start = m.machine.range.start;
            const end = m.machine.range.end;
            const key = `${start.line}:${start.character}:${text.slice(document.textDocument.offsetAt(start), document.textDocument.offsetAt(end))}`;
            let result = this.cache.get(key);
            if (!result) {
                result = analyzeAsBuilt(m.machine);
                this.cache.set(key, result);
                if (this.cache.size > CACHE_SIZE) this.cache.delete(this.cache.keys().next().value!);
                // a newer text arrived while this machine was analyzed: drop the run
                if (this.stale(document, uri, version)) return;
            }
            findings.push(...result);
        }
        const severity = this.detent.lsp.DetentSettings.settings.severity;
        const added = applySeverity(findings.map((f) => findingToDiagnostic(f, uri)), severity)
            .map((d) => withWitnessInfo({ ...d, data: { ...(d.data as object), asBuilt: true } }, uri));
        const kept = (document.diagnostics ?? []).filter((d) => !isAsBuiltDiagnostic(d));
        // nothing new and nothing to withdraw: spare the client a second identical publication
        if (added.length > 0 || kept.length !== (document.diagnostics ?? []).length) {
            document.diagnostics = [...kept, ...added];
            void this.connection.sendDiagnostics({ uri, version, diagnostics: document.diagnostics });
        }
        // Still idle: synthesize under the active encoding now, so the next hover or lens is warm.
        const model = this.detent.lsp.DetentDocumentModel;
        for (const entry of model.machines(document)) {
            if (this.stale(document, uri, version)) return;
            model.synthesis(document, entry);
        }
    }
}
