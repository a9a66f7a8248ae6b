// Status bar item: the cost of the machine under the cursor, from `detent/status`.
import * as vscode from 'vscode';
import type { DetentRequests } from './requests.js';

const DEBOUNCE_MS = 250;

export class CostStatus implements vscode.Disposable {
    private readonly item = vscode.window.createStatusBarItem('detent.cost', vscode.StatusBarAlignment.Right, 100);
    private timer: NodeJS.Timeout | undefined;
    private generation = 0;
    private readonly subscriptions: vscode.Disposable[] = [];

    constructor(private readonly requests: DetentRequests) {
        this.item.name = 'Detent machine cost';
        this.item.command = 'detent.showEquations';
        this.subscriptions.push(
            vscode.window.onDidChangeActiveTextEditor(() => this.schedule()),
            vscode.window.onDidChangeTextEditorSelection(() => this.schedule()),
            vscode.workspace.onDidChangeTextDocument((e) => { if (e.document === vscode.window.activeTextEditor?.document) this.schedule(); }),
            vscode.workspace.onDidChangeConfiguration((e) => { if (e.affectsConfiguration('detent')) this.schedule(); }),
        );
        this.schedule();
    }

    schedule(): void {
        clearTimeout(this.timer);
        this.timer = setTimeout(() => void this.update(), DEBOUNCE_MS);
    }

    private async update(): Promise<void> {
        const ed = vscode.window.activeTextEditor;
        if (!ed || ed.document.languageId !== 'detent') {
            this.item.hide();
            return;
        }
        const gen = ++this.generation;
        try {
            const pos = ed.selection.active;
            const st = await this.requests.status({ uri: ed.document.uri.toString(), position: { line: pos.line, character: pos.character } });
            if (gen !== this.generation) return;
            if (!st.text) {
                this.item.hide();
                return;
            }
            this.item.text = `$(circuit-board) ${st.text}`;
            this.item.tooltip = st.tooltip ?? (st.machine ? `Detent: ${st.machine}` : undefined);
            this.item.show();
        } catch {
            if (gen === this.generation) this.item.hide();
        }
    }

    dispose(): void {
        clearTimeout(this.timer);
        for (const d of this.subscriptions) d.dispose();
        this.item.dispose();
    }
}
