// Scenarios in VS Code's Testing API: file → machine → scenario, discovered with `detent/scenarios`
// and run with `detent/runScenarios` (the core simulator runs in the server).
import * as vscode from 'vscode';
import type { ScenariosResult } from '../../packages/language/src/lsp/protocol.js';
import { toRange, type DetentRequests } from './requests.js';

const REFRESH_DEBOUNCE_MS = 500;
const MAX_DISCOVERED_FILES = 200;

interface ItemData { kind: 'file' | 'machine' | 'scenario'; uri: vscode.Uri; machine?: string; scenario?: string }

export class ScenarioTests implements vscode.Disposable {
    readonly controller: vscode.TestController;
    private readonly data = new WeakMap<vscode.TestItem, ItemData>();
    private readonly timers = new Map<string, NodeJS.Timeout>();
    private readonly subscriptions: vscode.Disposable[] = [];

    constructor(private readonly requests: DetentRequests, private readonly output: vscode.OutputChannel) {
        this.controller = vscode.tests.createTestController('detent', 'Detent Scenarios');
        this.controller.resolveHandler = async (item) => {
            if (!item) await this.discoverWorkspace();
        };
        this.controller.refreshHandler = async () => { await this.discoverWorkspace(); };
        this.controller.createRunProfile('Run', vscode.TestRunProfileKind.Run, async (req, token) => { await this.run(req, token); }, true);
        this.subscriptions.push(
            vscode.workspace.onDidOpenTextDocument((d) => this.schedule(d)),
            vscode.workspace.onDidChangeTextDocument((e) => this.schedule(e.document)),
            vscode.workspace.onDidDeleteFiles((e) => { for (const u of e.files) this.controller.items.delete(u.toString()); }),
        );
        for (const d of vscode.workspace.textDocuments) this.schedule(d);
    }

    private schedule(doc: vscode.TextDocument): void {
        if (doc.languageId !== 'detent' || doc.uri.scheme !== 'file') return;
        const key = doc.uri.toString();
        clearTimeout(this.timers.get(key));
        this.timers.set(key, setTimeout(() => { this.timers.delete(key); void this.refreshDocument(doc.uri); }, REFRESH_DEBOUNCE_MS));
    }

    private async discoverWorkspace(): Promise<void> {
        const files = await vscode.workspace.findFiles('**/*.detent', '**/node_modules/**', MAX_DISCOVERED_FILES);
        // Opening a document hands it to the server (didOpen), so the request works for closed files too.
        for (const uri of files) {
            try {
                await vscode.workspace.openTextDocument(uri);
                await this.refreshDocument(uri);
            } catch (e) {
                this.output.appendLine(`scenario discovery failed for ${uri.fsPath}: ${String(e)}`);
            }
        }
    }

    async refreshDocument(uri: vscode.Uri): Promise<void> {
        let result: ScenariosResult;
        try {
            result = await this.requests.scenarios({ uri: uri.toString() });
        } catch (e) {
            this.output.appendLine(`detent/scenarios failed for ${uri.fsPath}: ${String(e)}`);
            return;
        }
        const withScenarios = result.machines.filter((m) => m.scenarios.length > 0);
        if (withScenarios.length === 0) {
            this.controller.items.delete(uri.toString());
            return;
        }
        const fileItem = this.controller.items.get(uri.toString())
            ?? this.controller.createTestItem(uri.toString(), vscode.workspace.asRelativePath(uri), uri);
        this.data.set(fileItem, { kind: 'file', uri });
        const machineItems: vscode.TestItem[] = [];
        for (const m of withScenarios) {
            const mItem = this.controller.createTestItem(`${uri.toString()}#${m.name}`, m.name, uri);
            mItem.range = toRange(m.range);
            this.data.set(mItem, { kind: 'machine', uri, machine: m.name });
            mItem.children.replace(m.scenarios.map((s) => {
                const sItem = this.controller.createTestItem(`${uri.toString()}#${m.name}/${s.name}`, s.name, uri);
                sItem.range = toRange(s.range);
                this.data.set(sItem, { kind: 'scenario', uri, machine: m.name, scenario: s.name });
                return sItem;
            }));
            machineItems.push(mItem);
        }
        fileItem.children.replace(machineItems);
        this.controller.items.add(fileItem);
    }

    /** Scenario items of one document (for the Run Scenarios command). */
    async itemsOf(uri: vscode.Uri): Promise<vscode.TestItem[]> {
        await this.refreshDocument(uri);
        const f = this.controller.items.get(uri.toString());
        return f ? [f] : [];
    }

    /** The item of one scenario (or of the whole machine when `scenario` is omitted). */
    async itemFor(uri: vscode.Uri, machine: string, scenario?: string): Promise<vscode.TestItem | undefined> {
        await this.refreshDocument(uri);
        const m = this.controller.items.get(uri.toString())?.children.get(`${uri.toString()}#${machine}`);
        return scenario === undefined ? m : m?.children.get(`${uri.toString()}#${machine}/${scenario}`);
    }

    private leaves(items: readonly vscode.TestItem[], exclude: readonly vscode.TestItem[]): vscode.TestItem[] {
        const out: vscode.TestItem[] = [];
        const skip = new Set(exclude.map((x) => x.id));
        const visit = (it: vscode.TestItem) => {
            if (skip.has(it.id)) return;
            const d = this.data.get(it);
            if (d?.kind === 'scenario') { out.push(it); return; }
            it.children.forEach(visit);
        };
        items.forEach(visit);
        return out;
    }

    async run(request: vscode.TestRunRequest, token: vscode.CancellationToken): Promise<{ passed: number; failed: number }> {
        const roots: vscode.TestItem[] = [];
        if (request.include) roots.push(...request.include);
        else this.controller.items.forEach((i) => roots.push(i));
        const scenarios = this.leaves(roots, request.exclude ?? []);
        const run = this.controller.createTestRun(request);
        let passed = 0;
        let failed = 0;
        // One request per machine: the simulator is set up once per machine.
        const groups = new Map<string, { uri: vscode.Uri; machine: string; items: vscode.TestItem[] }>();
        for (const it of scenarios) {
            const d = this.data.get(it)!;
            const key = `${d.uri.toString()}#${d.machine}`;
            const g = groups.get(key) ?? { uri: d.uri, machine: d.machine!, items: [] };
            g.items.push(it);
            groups.set(key, g);
            run.enqueued(it);
        }
        try {
            for (const g of groups.values()) {
                if (token.isCancellationRequested) break;
                for (const it of g.items) run.started(it);
                try {
                    const res = await this.requests.runScenarios({ uri: g.uri.toString(), machine: g.machine, scenarios: g.items.map((i) => this.data.get(i)!.scenario!) });
                    for (const it of g.items) {
                        const name = this.data.get(it)!.scenario!;
                        const r = res.results.find((x) => x.scenario === name);
                        if (!r) {
                            run.errored(it, new vscode.TestMessage(`The server returned no result for scenario ${name}.`));
                            failed++;
                            continue;
                        }
                        if (r.passed) {
                            run.passed(it, r.durationMs);
                            passed++;
                        } else {
                            const msg = new vscode.TestMessage(r.message);
                            msg.location = new vscode.Location(g.uri, toRange(r.range));
                            run.failed(it, msg, r.durationMs);
                            failed++;
                        }
                        run.appendOutput(`${r.passed ? 'PASS' : 'FAIL'} ${g.machine}.${name}${r.passed ? '' : `: ${r.message}`}\r\n`, undefined, it);
                    }
                } catch (e) {
                    for (const it of g.items) run.errored(it, new vscode.TestMessage(`detent/runScenarios failed: ${String(e)}`));
                    failed += g.items.length;
                }
            }
        } finally {
            run.end();
        }
        this.output.appendLine(`Scenarios: ${passed} passed, ${failed} failed`);
        return { passed, failed };
    }

    dispose(): void {
        for (const t of this.timers.values()) clearTimeout(t);
        for (const d of this.subscriptions) d.dispose();
        this.controller.dispose();
    }
}
