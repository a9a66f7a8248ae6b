// Detent: Export… — asks the server for the generated files and writes them (the client owns the
// file system and Workspace Trust). Never overwrites a file without Detent's generated header; in
// Restricted Mode it asks before writing anything.
import * as fs from 'node:fs';
import * as path from 'node:path';
import * as vscode from 'vscode';
import type { ExportParams } from '../../packages/language/src/lsp/protocol.js';
import { planExport, resolveExportFolder } from './exportPlan.js';
import { activeDetentEditor, pickMachine, type DetentRequests } from './requests.js';

type Target = ExportParams['to'];

/** Arguments a keybinding or another extension (and the E2E test) may pass to skip the pickers. */
export interface ExportArgs {
    uri?: string;
    machine?: string;
    to?: Target;
    style?: 'behavioral' | 'structural';
    testbench?: boolean;
    statePort?: boolean;
}

const TARGETS: { label: string; to: Target; hdl: boolean }[] = [
    { label: 'Verilog', to: 'verilog', hdl: true },
    { label: 'SystemVerilog', to: 'systemverilog', hdl: true },
    { label: 'VHDL', to: 'vhdl', hdl: true },
    { label: 'C', to: 'c', hdl: false },
    { label: 'DOT (Graphviz)', to: 'dot', hdl: false },
];

function readIfExists(target: string): string | undefined {
    try {
        return fs.readFileSync(target, 'utf8');
    } catch (e) {
        if ((e as NodeJS.ErrnoException).code === 'ENOENT') return undefined;
        throw e;
    }
}

export async function exportCommand(requests: DetentRequests, output: vscode.OutputChannel, args: ExportArgs = {}): Promise<string[] | undefined> {
    let document: vscode.TextDocument;
    let editor: vscode.TextEditor | undefined;
    if (args.uri) {
        document = await vscode.workspace.openTextDocument(vscode.Uri.parse(args.uri));
        editor = vscode.window.visibleTextEditors.find((e) => e.document === document);
    } else {
        editor = activeDetentEditor();
        if (!editor) return undefined;
        document = editor.document;
    }
    if (document.uri.scheme !== 'file') {
        void vscode.window.showWarningMessage('Detent exports only files on disk.');
        return undefined;
    }
    const machine = editor ? await pickMachine(requests, editor, args.machine) : args.machine;
    if (!machine) return undefined;

    let to = args.to;
    if (!to) {
        const pick = await vscode.window.showQuickPick(TARGETS.map((t) => ({ label: t.label, to: t.to })), { placeHolder: `Export ${machine} as…` });
        if (!pick) return undefined;
        to = pick.to;
    }
    const isHdl = TARGETS.find((t) => t.to === to)?.hdl ?? false;
    let { style, testbench, statePort } = args;
    if (isHdl && args.to === undefined) {
        const opts = await vscode.window.showQuickPick(
            [
                { label: 'Structural (gates from the minimized equations)', key: 'structural' },
                { label: 'Testbench from the scenarios', key: 'testbench' },
                { label: 'State port (the state code as an output)', key: 'statePort' },
            ],
            { canPickMany: true, placeHolder: 'Options (none: behavioral, no testbench)' },
        );
        if (!opts) return undefined;
        const keys = new Set(opts.map((o) => o.key));
        style = keys.has('structural') ? 'structural' : 'behavioral';
        testbench = keys.has('testbench');
        statePort = keys.has('statePort');
    }

    const cfg = vscode.workspace.getConfiguration('detent', document.uri);
    const wsFolder = vscode.workspace.getWorkspaceFolder(document.uri)?.uri.fsPath;
    const folder = resolveExportFolder(document.uri.fsPath, cfg.get<string>('exportFolder', ''), wsFolder);

    const result = await requests.export({ uri: document.uri.toString(), machine, to, style, testbench, statePort });
    if (result.files.length === 0) {
        void vscode.window.showWarningMessage(`Detent produced no files for ${machine} (fix the errors in the file first).`);
        return undefined;
    }
    const plan = planExport(folder, result.files, readIfExists);
    if (plan.refused.length > 0) {
        const lines = plan.refused.map((r) => `${r.target}: ${r.reason}`);
        output.appendLine(`Export refused, nothing written:\n  ${lines.join('\n  ')}`);
        void vscode.window.showErrorMessage(`Detent will not overwrite ${plan.refused.map((r) => path.basename(r.target)).join(', ')}: ${plan.refused[0]!.reason}. Nothing was written.`);
        return undefined;
    }
    if (!vscode.workspace.isTrusted) {
        const names = plan.write.map((f) => f.name).join(', ');
        const answer = await vscode.window.showWarningMessage(
            `This workspace is in Restricted Mode. Write ${plan.write.length} generated file(s) to ${folder}?`,
            { modal: true, detail: names },
            'Write Files',
        );
        if (answer !== 'Write Files') {
            output.appendLine(`Export cancelled in Restricted Mode (${names}).`);
            return undefined;
        }
    }
    await vscode.workspace.fs.createDirectory(vscode.Uri.file(folder));
    for (const f of plan.write) {
        await vscode.workspace.fs.writeFile(vscode.Uri.file(f.target), Buffer.from(f.content, 'utf8'));
    }
    const written = plan.write.map((f) => f.target);
    output.appendLine(`Exported ${machine} (${to}) → ${written.join(', ')}`);
    void vscode.window.showInformationMessage(`Detent wrote ${written.map((w) => path.basename(w)).join(', ')}`, 'Open').then((a) => {
        if (a === 'Open') void vscode.window.showTextDocument(vscode.Uri.file(written[0]!));
    });
    return written;
}
