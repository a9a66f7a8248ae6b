// The live state-diagram webview beside the editor: follows the active Detent document (debounced
// on edits), highlights the state under the cursor, and reveals a state in the source on click.
import * as vscode from 'vscode';
import type { DiagramResult } from '../../packages/language/src/lsp/protocol.js';
import { diagramHtml, makeNonce, sanitizeSvg } from './diagramHtml.js';
import { dotToSvg } from './graphviz.js';
import { containsPosition, toRange, type DetentRequests } from './requests.js';

const EDIT_DEBOUNCE_MS = 300;
const CURSOR_DEBOUNCE_MS = 80;

interface RenderedMachine { name: string; states: string[]; svg?: string; error?: string }

export class DiagramPanel implements vscode.Disposable {
    static readonly viewType = 'detent.diagram';
    private panel: vscode.WebviewPanel | undefined;
    private documentUri: vscode.Uri | undefined;
    private last: DiagramResult | undefined;
    private ready = false;
    private pendingRender: { machines: RenderedMachine[]; note?: string } | undefined;
    private editTimer: NodeJS.Timeout | undefined;
    private cursorTimer: NodeJS.Timeout | undefined;
    private generation = 0;
    private readonly subscriptions: vscode.Disposable[] = [];

    constructor(private readonly requests: DetentRequests, private readonly output: vscode.OutputChannel) {
        this.subscriptions.push(
            vscode.workspace.onDidChangeTextDocument((e) => {
                if (this.panel && this.documentUri && e.document.uri.toString() === this.documentUri.toString()) this.scheduleRefresh();
            }),
            vscode.window.onDidChangeActiveTextEditor((ed) => {
                if (!this.panel || !ed || ed.document.languageId !== 'detent') return;
                if (ed.document.uri.toString() !== this.documentUri?.toString()) {
                    this.documentUri = ed.document.uri;
                    this.panel.title = this.title();
                    void this.refresh();
                }
            }),
            vscode.window.onDidChangeTextEditorSelection((e) => {
                if (!this.panel || e.textEditor.document.uri.toString() !== this.documentUri?.toString()) return;
                clearTimeout(this.cursorTimer);
                this.cursorTimer = setTimeout(() => this.highlightAt(e.textEditor.selection.active), CURSOR_DEBOUNCE_MS);
            }),
        );
    }

    /** Opens (or re-targets) the panel beside the editor for this document. */
    show(document: vscode.TextDocument): void {
        this.documentUri = document.uri;
        if (this.panel) {
            this.panel.title = this.title();
            this.panel.reveal(vscode.ViewColumn.Beside, true);
        } else {
            this.panel = vscode.window.createWebviewPanel(DiagramPanel.viewType, this.title(), { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true }, {
                enableScripts: true,
                // Nothing is loaded from disk: the SVG arrives by message, the style and script are inline with a nonce.
                localResourceRoots: [],
                retainContextWhenHidden: true,
            });
            this.ready = false;
            const webview = this.panel.webview;
            webview.html = diagramHtml(webview.cspSource, makeNonce());
            webview.onDidReceiveMessage((msg: unknown) => this.onMessage(msg));
            this.panel.onDidDispose(() => { this.panel = undefined; this.ready = false; });
        }
        void this.refresh();
    }

    private title(): string {
        const name = this.documentUri ? this.documentUri.path.split('/').pop() : '';
        return `Diagram: ${name}`;
    }

    private scheduleRefresh(): void {
        clearTimeout(this.editTimer);
        this.editTimer = setTimeout(() => void this.refresh(), EDIT_DEBOUNCE_MS);
    }

    async refresh(): Promise<void> {
        const uri = this.documentUri;
        if (!this.panel || !uri) return;
        const gen = ++this.generation;
        let result: DiagramResult;
        try {
            result = await this.requests.diagram({ uri: uri.toString() });
        } catch (e) {
            this.output.appendLine(`diagram request failed: ${String(e)}`);
            return;
        }
        const machines: RenderedMachine[] = [];
        for (const m of result.machines) {
            if (m.dot.trim() === '') {
                // The server sends no DOT for a machine it cannot draw (errors in it, or no drawing available).
                machines.push({ name: m.name, states: [], error: 'No diagram for this machine right now: fix the errors shown in Problems.' });
                continue;
            }
            try {
                machines.push({ name: m.name, states: m.states.map((st) => st.name), svg: sanitizeSvg(await dotToSvg(m.dot)) });
            } catch (e) {
                machines.push({ name: m.name, states: [], error: `Graphviz could not lay out this machine: ${String(e)}` });
            }
        }
        if (gen !== this.generation) return; // a newer edit already asked again
        let note: string | undefined;
        if (machines.length === 0 && this.last && this.last.machines.length > 0) {
            note = 'The file has no readable machine right now; fix the syntax errors to update the diagram.';
        } else {
            this.last = result;
        }
        if (machines.length === 0 && !note) note = 'No machine in this file.';
        this.post({ machines: machines.length > 0 ? machines : [], note });
        const ed = vscode.window.visibleTextEditors.find((e) => e.document.uri.toString() === uri.toString());
        if (ed) this.highlightAt(ed.selection.active);
    }

    private post(render: { machines: RenderedMachine[]; note?: string }): void {
        if (!this.panel) return;
        if (!this.ready) {
            this.pendingRender = render;
            return;
        }
        void this.panel.webview.postMessage({ type: 'render', ...render });
    }

    private highlightAt(pos: vscode.Position): void {
        if (!this.panel || !this.last) return;
        for (const m of this.last.machines) {
            const st = m.states.find((s) => containsPosition(s.range, pos.line, pos.character));
            if (st) {
                void this.panel.webview.postMessage({ type: 'highlight', machine: m.name, state: st.name });
                return;
            }
        }
        void this.panel.webview.postMessage({ type: 'highlight' });
    }

    private onMessage(msg: unknown): void {
        if (!msg || typeof msg !== 'object') return;
        const m = msg as { type?: string; machine?: string; state?: string };
        if (m.type === 'ready') {
            this.ready = true;
            if (this.pendingRender) {
                void this.panel?.webview.postMessage({ type: 'render', ...this.pendingRender });
                this.pendingRender = undefined;
            }
        } else if (m.type === 'reveal' && typeof m.machine === 'string' && typeof m.state === 'string') {
            void this.reveal(m.machine, m.state);
        }
    }

    private async reveal(machine: string, state: string): Promise<void> {
        const uri = this.documentUri;
        const target = this.last?.machines.find((m) => m.name === machine)?.states.find((s) => s.name === state);
        if (!uri || !target) return;
        const doc = await vscode.workspace.openTextDocument(uri);
        const visible = vscode.window.visibleTextEditors.find((e) => e.document.uri.toString() === uri.toString());
        const range = toRange(target.range);
        const ed = await vscode.window.showTextDocument(doc, { viewColumn: visible?.viewColumn ?? vscode.ViewColumn.One, selection: new vscode.Range(range.start, range.start) });
        ed.revealRange(range, vscode.TextEditorRevealType.InCenterIfOutsideViewport);
    }

    dispose(): void {
        clearTimeout(this.editTimer);
        clearTimeout(this.cursorTimer);
        this.panel?.dispose();
        for (const d of this.subscriptions) d.dispose();
    }
}
