// Read-only documents for Show Equations and Compare Encodings, served by a content provider so
// they never touch the disk and cannot be saved over anything.
import * as vscode from 'vscode';
import { readSettings } from './languageClient.js';
import type { LensCommandArgs } from '../../packages/language/src/lsp/protocol.js';
import { activeDetentEditor, pickMachine, type DetentRequests } from './requests.js';

/** The document and machine a report is for: given by a code lens, or the active editor's. */
async function target(requests: DetentRequests, args?: Partial<LensCommandArgs>): Promise<{ uri: string; machine: string } | undefined> {
    if (args?.uri && args.machine) return { uri: args.uri, machine: args.machine };
    const ed = activeDetentEditor();
    if (!ed) return undefined;
    const machine = await pickMachine(requests, ed, args?.machine);
    return machine ? { uri: ed.document.uri.toString(), machine } : undefined;
}

export const REPORT_SCHEME = 'detent-report';

export class ReportDocuments implements vscode.TextDocumentContentProvider, vscode.Disposable {
    private readonly contents = new Map<string, string>();
    private readonly changed = new vscode.EventEmitter<vscode.Uri>();
    readonly onDidChange = this.changed.event;

    provideTextDocumentContent(uri: vscode.Uri): string {
        return this.contents.get(uri.toString()) ?? '';
    }

    /** Loads (or refreshes) the report document without showing it. */
    async load(name: string, text: string, language: string): Promise<vscode.TextDocument> {
        const uri = vscode.Uri.from({ scheme: REPORT_SCHEME, path: `/${name}` });
        this.contents.set(uri.toString(), text);
        this.changed.fire(uri);
        const doc = await vscode.workspace.openTextDocument(uri);
        return doc.languageId === language ? doc : vscode.languages.setTextDocumentLanguage(doc, language);
    }

    async open(name: string, text: string, language: string): Promise<vscode.TextEditor> {
        const doc = await this.load(name, text, language);
        return vscode.window.showTextDocument(doc, { viewColumn: vscode.ViewColumn.Beside, preview: true, preserveFocus: false });
    }

    dispose(): void {
        this.changed.dispose();
    }
}

export async function showEquations(requests: DetentRequests, reports: ReportDocuments, args?: Partial<LensCommandArgs>): Promise<void> {
    const t = await target(requests, args);
    if (!t) return;
    const { machine } = t;
    const s = readSettings();
    const { text } = await requests.equations({
        uri: t.uri,
        machine,
        encoding: s.encoding === 'machine' ? undefined : s.encoding,
        flipflop: s.flipflop === 'machine' ? undefined : s.flipflop,
    });
    await reports.open(`${machine} equations.txt`, text, 'plaintext');
}

export async function compareEncodings(requests: DetentRequests, reports: ReportDocuments, args?: Partial<LensCommandArgs>): Promise<void> {
    const t = await target(requests, args);
    if (!t) return;
    const { machine } = t;
    const { markdown } = await requests.compare({ uri: t.uri, machine });
    const name = `${machine} encodings.md`;
    const doc = await reports.load(name, markdown, 'markdown');
    // The rendered table reads better than the Markdown source; show the source only without the built-in preview.
    try {
        await vscode.commands.executeCommand('markdown.showPreviewToSide', doc.uri);
    } catch {
        await reports.open(name, markdown, 'markdown');
    }
}
