// Detent for VS Code: starts the language server and wires its custom requests to commands, the
// state-diagram webview, the Test Explorer and the status bar. No analysis happens here.
import * as vscode from 'vscode';
import type { LanguageClient } from 'vscode-languageclient/node';
import {
    COMPARE_ENCODINGS_COMMAND, EXPORT_COMMAND, RUN_SCENARIO_COMMAND, SHOW_EQUATIONS_COMMAND, type LensCommandArgs,
} from '../../packages/language/src/lsp/protocol.js';
import { DiagramPanel } from './diagram.js';
import { exportCommand, type ExportArgs } from './exportCommand.js';
import { createLanguageClient, serverWorkspaceReady } from './languageClient.js';
import { compareEncodings, REPORT_SCHEME, ReportDocuments, showEquations } from './reports.js';
import { activeDetentEditor, DetentRequests } from './requests.js';
import { CostStatus } from './statusBar.js';
import { ScenarioTests } from './testing.js';

let client: LanguageClient | undefined;

/** Runs a command body and reports failures in the output channel and a message instead of throwing into VS Code. */
function guarded<A extends unknown[], R>(output: vscode.OutputChannel, name: string, fn: (...args: A) => Promise<R>): (...args: A) => Promise<R | undefined> {
    return async (...args: A) => {
        try {
            return await fn(...args);
        } catch (e) {
            const msg = e instanceof Error ? e.message : String(e);
            output.appendLine(`${name} failed: ${msg}`);
            void vscode.window.showErrorMessage(`Detent: ${name} failed: ${msg}`);
            return undefined;
        }
    };
}

export async function activate(context: vscode.ExtensionContext): Promise<void> {
    const output = vscode.window.createOutputChannel('Detent', { log: true });
    context.subscriptions.push(output);
    output.appendLine(`Detent ${String(context.extension.packageJSON.version ?? '')} — workspace ${vscode.workspace.isTrusted ? 'trusted' : 'in Restricted Mode (analysis only; Export asks before writing)'}`);

    client = createLanguageClient(context, output);
    const requests = new DetentRequests(client, serverWorkspaceReady);
    const reports = new ReportDocuments();
    const diagram = new DiagramPanel(requests, output);
    const tests = new ScenarioTests(requests, output);
    const status = new CostStatus(requests);
    context.subscriptions.push(reports, diagram, tests, status, vscode.workspace.registerTextDocumentContentProvider(REPORT_SCHEME, reports));

    context.subscriptions.push(
        vscode.commands.registerCommand('detent.showDiagram', guarded(output, 'Show State Diagram', async () => {
            const ed = activeDetentEditor();
            if (ed) diagram.show(ed.document);
        })),
        // These three are also the server's code-lens commands (protocol.ts): they take LensCommandArgs.
        vscode.commands.registerCommand(SHOW_EQUATIONS_COMMAND, guarded(output, 'Show Equations', (args?: LensCommandArgs) => showEquations(requests, reports, args))),
        vscode.commands.registerCommand(COMPARE_ENCODINGS_COMMAND, guarded(output, 'Compare Encodings', (args?: LensCommandArgs) => compareEncodings(requests, reports, args))),
        vscode.commands.registerCommand(EXPORT_COMMAND, guarded(output, 'Export', (args?: ExportArgs) => exportCommand(requests, output, args ?? {}))),
        vscode.commands.registerCommand(RUN_SCENARIO_COMMAND, guarded(output, 'Run Scenario', async (args?: LensCommandArgs) => {
            if (!args?.uri || !args.machine) return undefined;
            const item = await tests.itemFor(vscode.Uri.parse(args.uri), args.machine, args.scenario);
            if (!item) {
                void vscode.window.showWarningMessage(`No scenario ${args.scenario ?? ''} in ${args.machine}.`);
                return undefined;
            }
            const cts = new vscode.CancellationTokenSource();
            try {
                const r = await tests.run(new vscode.TestRunRequest([item]), cts.token);
                const say = r.failed === 0 ? vscode.window.showInformationMessage : vscode.window.showWarningMessage;
                void say(`Detent scenarios: ${r.passed} passed, ${r.failed} failed`);
                return r;
            } finally {
                cts.dispose();
            }
        })),
        vscode.commands.registerCommand('detent.runScenarios', guarded(output, 'Run Scenarios', async () => {
            const ed = activeDetentEditor();
            if (!ed) return undefined;
            const items = await tests.itemsOf(ed.document.uri);
            if (items.length === 0) {
                void vscode.window.showInformationMessage('This file has no scenarios.');
                return { passed: 0, failed: 0 };
            }
            const cts = new vscode.CancellationTokenSource();
            try {
                const r = await tests.run(new vscode.TestRunRequest(items), cts.token);
                const say = r.failed === 0 ? vscode.window.showInformationMessage : vscode.window.showWarningMessage;
                void say(`Detent scenarios: ${r.passed} passed, ${r.failed} failed`);
                return r;
            } finally {
                cts.dispose();
            }
        })),
        vscode.workspace.onDidGrantWorkspaceTrust(() => output.appendLine('Workspace trusted: Export writes without asking.')),
    );

    try {
        await client.start();
    } catch (e) {
        output.appendLine(`The Detent language server did not start: ${String(e)}`);
        void vscode.window.showErrorMessage('The Detent language server did not start; see the Detent output.');
        return;
    }
    status.schedule();
    for (const d of vscode.workspace.textDocuments) if (d.languageId === 'detent') void tests.refreshDocument(d.uri);
}

export async function deactivate(): Promise<void> {
    const c = client;
    client = undefined;
    if (c) await c.stop(2000);
}
