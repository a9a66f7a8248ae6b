/**
 * The `detent/*` requests of protocol.ts. Each handler waits until the document is linked, reads
 * under Langium's workspace read lock, answers from core (synthesis, exporters, simulator) through
 * the document model, and fails soft: an exception is logged and answered with an empty result.
 */
import { DocumentState, URI, type LangiumDocument } from 'langium';
import type { LangiumSharedServices } from 'langium/lsp';
import { type CancellationToken, type Connection, ErrorCodes, ResponseError } from 'vscode-languageserver';
import {
    type EncodingKind, type FlipFlopKind, ENCODING_KINDS, FLIPFLOP_KINDS, compareEncodings, describeFailure, runScenario,
} from '@detent/core';
import type { DetentServices } from '../detent-module.js';
import type { MachineEntry } from './document-model.js';
import { costTitle, compareMarkdown, equationsDocument, SAFETY_CAUTION } from './machine-text.js';
import { failSoft } from './fail-soft.js';
import { diagramOf, exportFiles, sourceNameOf, type ExportContext } from './exports.js';
import {
    COMPARE_REQUEST, type CompareParams, type CompareResult, DIAGRAM_REQUEST, type DiagramParams, type DiagramResult,
    EQUATIONS_REQUEST, type EquationsParams, type EquationsResult, EXPORT_REQUEST, type ExportParams, type ExportResult,
    RUN_SCENARIOS_REQUEST, type RunScenariosParams, type RunScenariosResult, SCENARIOS_REQUEST, type ScenariosParams,
    type ScenariosResult, STATUS_REQUEST, type StatusParams, type StatusResult,
} from './protocol.js';

export function registerDetentRequests(connection: Connection, shared: LangiumSharedServices, detent: DetentServices): void {
    const documents = shared.workspace.LangiumDocuments;
    const builder = shared.workspace.DocumentBuilder;
    const lock = shared.workspace.WorkspaceLock;
    const model = detent.lsp.DetentDocumentModel;

    async function documentFor(uri: string, token: CancellationToken): Promise<LangiumDocument> {
        // A request that arrives while the workspace is still loading must not create the document itself:
        // the loader would then fail on "already present" and no diagnostics would ever be published.
        await shared.workspace.WorkspaceManager.ready;
        const parsed = URI.parse(uri);
        if (documents.hasDocument(parsed)) {
            await builder.waitUntil(DocumentState.Linked, parsed, token);
            return documents.getDocument(parsed)!;
        }
        // Not open in the editor: load it from disk and link it (no diagnostics are published for it).
        const document = await documents.getOrCreateDocument(parsed);
        await builder.build([document], { validation: false }, token);
        return document;
    }

    function handle<P extends { uri: string }, R>(method: string, empty: R, answer: (document: LangiumDocument, params: P) => R): void {
        connection.onRequest(method, async (params: P, token: CancellationToken) =>
            failSoft(shared, method, empty, async () => {
                const document = await documentFor(params.uri, token);
                return lock.read(() => answer(document, params));
            }));
    }

    function contextOf(document: LangiumDocument): ExportContext {
        return { sourceName: sourceNameOf(document.uri.toString()), sourceText: document.textDocument.getText() };
    }

    /** Exports follow the file (its own encoding and flip-flop type), not the editor's display choice. */
    function declaredSynthesis(document: LangiumDocument, entry: MachineEntry) {
        return model.synthesis(document, entry, { encoding: entry.machine.encoding, flipflop: entry.machine.flipflop }).result;
    }

    function machineOf(document: LangiumDocument, name: string): MachineEntry {
        const entry = model.machineNamed(document, name);
        if (!entry) throw new Error(`no machine '${name}' in ${document.uri.toString()}`);
        return entry;
    }

    handle<DiagramParams, DiagramResult>(DIAGRAM_REQUEST, { machines: [] }, (document) => ({
        machines: model.machines(document).filter((m) => m.machine.name).map((entry) => {
            // a view, like hovers: the active encoding (exports follow the file's declaration)
            const active = model.synthesis(document, entry).result;
            const codes = active?.assignment.codes;
            return {
                name: entry.machine.name,
                dot: entry.blocked ? '' : diagramOf(entry.machine, contextOf(document), active),
                states: entry.machine.states.map((s, i) => ({ name: s.name, range: s.nameRange, code: codes?.[i] ?? '' })),
                range: entry.machine.range,
            };
        }),
    }));

    handle<EquationsParams, EquationsResult>(EQUATIONS_REQUEST, { text: '' }, (document, params) => {
        const entry = machineOf(document, params.machine);
        const encoding = (ENCODING_KINDS as readonly string[]).includes(params.encoding ?? '') ? params.encoding as EncodingKind : undefined;
        const flipflop = (FLIPFLOP_KINDS as readonly string[]).includes(params.flipflop ?? '') ? params.flipflop as FlipFlopKind : undefined;
        const outcome = model.synthesis(document, entry, { encoding, flipflop });
        if (!outcome.result) return { text: `Machine ${entry.machine.name}: ${outcome.note ?? 'no synthesis'}\n${SAFETY_CAUTION}\n` };
        return { text: equationsDocument(outcome.result) };
    });

    handle<CompareParams, CompareResult>(COMPARE_REQUEST, { markdown: '' }, (document, params) => {
        const entry = machineOf(document, params.machine);
        if (entry.blocked) return { markdown: `### ${entry.machine.name}\n\nNo comparison: fix the errors in this machine first.` };
        const rows = compareEncodings(entry.machine, { budgetMs: 300 });
        return { markdown: compareMarkdown(entry.machine.name, rows) };
    });

    handle<ExportParams, ExportResult>(EXPORT_REQUEST, { files: [] }, (document, params) => {
        const entry = machineOf(document, params.machine);
        if (entry.blocked) throw new ResponseError(ErrorCodes.InvalidRequest, `machine ${entry.machine.name} has errors; fix them before exporting`);
        try {
            return { files: exportFiles(entry.machine, params, contextOf(document), declaredSynthesis(document, entry)) };
        } catch (err) {
            throw new ResponseError(ErrorCodes.InternalError, `export to ${params.to} failed: ${err instanceof Error ? err.message : String(err)}`);
        }
    });

    handle<ScenariosParams, ScenariosResult>(SCENARIOS_REQUEST, { machines: [] }, (document) => ({
        machines: model.machines(document).filter((m) => m.machine.name).map((entry) => ({
            name: entry.machine.name,
            range: entry.machine.range,
            scenarios: entry.machine.scenarios.map((s) => ({ name: s.name, range: s.nameRange })),
        })),
    }));

    handle<RunScenariosParams, RunScenariosResult>(RUN_SCENARIOS_REQUEST, { results: [] }, (document, params) => {
        const entry = machineOf(document, params.machine);
        const wanted = params.scenarios && params.scenarios.length > 0 ? new Set(params.scenarios) : undefined;
        const scenarios = entry.machine.scenarios.filter((s) => !wanted || wanted.has(s.name));
        return {
            results: scenarios.map((scenario) => {
                if (entry.blocked) return { scenario: scenario.name, passed: false, message: 'not run: the machine has errors', range: scenario.nameRange, durationMs: 0 };
                const started = performance.now();
                const r = runScenario(entry.machine, scenario);
                const durationMs = performance.now() - started;
                return {
                    scenario: scenario.name,
                    passed: r.passed,
                    message: r.passed ? `passed: ${r.expects} expect(s) over ${r.cycles} cycle(s)` : (r.failure ? describeFailure(r.failure) : 'failed'),
                    range: r.failure?.range ?? scenario.nameRange,
                    durationMs,
                };
            }),
        };
    });

    handle<StatusParams, StatusResult>(STATUS_REQUEST, {}, (document, params) => {
        const entry = model.machineAt(document, document.textDocument.offsetAt(params.position));
        if (!entry || !entry.machine.name) return {};
        const outcome = model.synthesis(document, entry);
        if (!outcome.result) return { machine: entry.machine.name, text: `${entry.machine.name}: no synthesis`, tooltip: outcome.note };
        return {
            machine: entry.machine.name,
            text: `${entry.machine.name}: ${costTitle(outcome.result.cost, outcome.encoding, outcome.flipflop)}`,
            tooltip: `Codes: ${entry.machine.states.map((s, i) => `${s.name}=${outcome.result!.assignment.codes[i]}`).join(', ')}\n${SAFETY_CAUTION}`,
        };
    });
}
