// Read-only documents for Show Equations and Compare Encodings, served by a content provider so
// they never touch the disk and cannot be saved over anything.
import * as vscode from 'vscode';
import { readSettings } from './languageClient.js';
import { activeDetentEditor, pickMachine, type DetentRequests } from './requests.js';

export const REPORT_SCHEME = 'detent-report';

export class ReportDocuments implements vscode.TextDocumentContentProvider, vscode.Disposable {
    private readonly contents = new Map<string, string>();
    private readonly changed = new vscode.EventEmitter<vscode.Uri>();
    readonly onDidChange = this.changed.event;

    provideTextDocumentContent(uri: vscode.Uri): string {
        return this.contents.get(uri.toString()) ?? '';
    }

    async open(name: string, text: string, language: string): Promise<vscode.TextEditor> {
        const uri = vscode.Uri.from({ scheme: REPORT_SCHEME, path: `/${name}` });
        this.contents.set(uri.toString(), text);
        this.changed.fire(uri);
        const doc = await vscode.workspace.openTextDocument(uri);
        const typed = doc.languageId === language ? doc : await vscode.languages.setTextDocumentLanguage(doc, language);
        return vscode.window.showTextDocument(typed, { viewColumn: vscode.ViewColumn.Beside, preview: true, preserveFocus: false });
    }

    dispose(): void {
        this.changed.dispose();
    }
}

export async function showEquations(requests: DetentRequests, reports: ReportDocuments): Promise<void> {
    const ed = activeDetentEditor();
    if (!ed) return;
    const machine = await pickMachine(requests, ed);
    if (!machine) return;
    const s = readSettings();
    const { text } = await requests.equations({
        uri: ed.document.uri.toString(),
        machine,
        encoding: s.encoding === 'machine' ? undefined : s.encoding,
        flipflop: s.flipflop === 'machine' ? undefined : s.flipflop,
    });
    await reports.open(`${machine} equations.txt`, text, 'plaintext');
}

export async function compareEncodings(requests: DetentRequests, reports: ReportDocuments): Promise<void> {
    const ed = activeDetentEditor();
    if (!ed) return;
    const machine = await pickMachine(requests, ed);
    if (!machine) return;
    const { markdown } = await requests.compare({ uri: ed.document.uri.toString(), machine });
    const shown = await reports.open(`${machine} encodings.md`, markdown, 'markdown');
    // The rendered table reads better than the Markdown source when the built-in preview is there.
    try {
        await vscode.commands.executeCommand('markdown.showPreviewToSide', shown.document.uri);
    } catch {
        /* preview not available: the source stays open */
    }
}
