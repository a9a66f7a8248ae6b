// Typed wrappers for Detent's custom requests, and the "which machine" question every command asks.
import * as vscode from 'vscode';
import type { LanguageClient } from 'vscode-languageclient/node';
import {
    COMPARE_REQUEST, DIAGRAM_REQUEST, EQUATIONS_REQUEST, EXPORT_REQUEST, RUN_SCENARIOS_REQUEST, SCENARIOS_REQUEST, STATUS_REQUEST,
    type CompareParams, type CompareResult, type DiagramParams, type DiagramResult, type EquationsParams, type EquationsResult,
    type ExportParams, type ExportResult, type Range0, type RunScenariosParams, type RunScenariosResult, type ScenariosParams,
    type ScenariosResult, type StatusParams, type StatusResult,
} from '../../packages/language/src/lsp/protocol.js';

export class DetentRequests {
    /** `ready`: requests wait for it (the server's initial workspace build, see serverWorkspaceReady). */
    constructor(private readonly client: LanguageClient, private readonly ready: Promise<void> = Promise.resolve()) {}

    private async send<R>(method: string, params: object): Promise<R> {
        await this.ready;
        return this.client.sendRequest<R>(method, params);
    }

    diagram(p: DiagramParams): Promise<DiagramResult> { return this.send<DiagramResult>(DIAGRAM_REQUEST, p); }
    equations(p: EquationsParams): Promise<EquationsResult> { return this.send<EquationsResult>(EQUATIONS_REQUEST, p); }
    compare(p: CompareParams): Promise<CompareResult> { return this.send<CompareResult>(COMPARE_REQUEST, p); }
    export(p: ExportParams): Promise<ExportResult> { return this.send<ExportResult>(EXPORT_REQUEST, p); }
    scenarios(p: ScenariosParams): Promise<ScenariosResult> { return this.send<ScenariosResult>(SCENARIOS_REQUEST, p); }
    runScenarios(p: RunScenariosParams): Promise<RunScenariosResult> { return this.send<RunScenariosResult>(RUN_SCENARIOS_REQUEST, p); }
    status(p: StatusParams): Promise<StatusResult> { return this.send<StatusResult>(STATUS_REQUEST, p); }
}

export function toRange(r: Range0): vscode.Range {
    return new vscode.Range(r.start.line, r.start.character, r.end.line, r.end.character);
}

export function containsPosition(r: Range0, line: number, character: number): boolean {
    if (line < r.start.line || line > r.end.line) return false;
    if (line === r.start.line && character < r.start.character) return false;
    if (line === r.end.line && character > r.end.character) return false;
    return true;
}

/** The active Detent editor, or undefined with a message shown. */
export function activeDetentEditor(): vscode.TextEditor | undefined {
    const ed = vscode.window.activeTextEditor;
    if (ed && ed.document.languageId === 'detent') return ed;
    const visible = vscode.window.visibleTextEditors.find((e) => e.document.languageId === 'detent');
    if (visible) return visible;
    void vscode.window.showInformationMessage('Open a .detent file first.');
    return undefined;
}

/**
 * The machine a command applies to: the one under the cursor, the only one in the file,
 * or the user's pick. Machine names and ranges come from the server's diagram request.
 */
export async function pickMachine(requests: DetentRequests, editor: vscode.TextEditor, given?: string): Promise<string | undefined> {
    if (given) return given;
    const { machines } = await requests.diagram({ uri: editor.document.uri.toString() });
    if (machines.length === 0) {
        void vscode.window.showWarningMessage('No machine in this file.');
        return undefined;
    }
    if (machines.length === 1) return machines[0]!.name;
    const pos = editor.selection.active;
    const under = machines.find((m) => containsPosition(m.range, pos.line, pos.character));
    if (under) return under.name;
    return vscode.window.showQuickPick(machines.map((m) => m.name), { placeHolder: 'Machine' });
}
