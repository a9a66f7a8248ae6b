/**
 * Protocol-test harness: builds the real server bundle (scripts/build.mjs), spawns it with
 * `--stdio` and speaks LSP to it through vscode-languageserver-protocol, exactly as an editor does.
 *
 * Several test files may run in parallel processes: the build runs under a lock directory and each
 * process spawns its own copy of the bundle, so one file's rebuild never tears another's server.
 */
import { spawn, fork, execFileSync, type ChildProcess } from 'node:child_process';
import { copyFileSync, existsSync, mkdirSync, mkdtempSync, rmSync, rmdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import {
    type Diagnostic, type ProtocolConnection, type PublishDiagnosticsParams, type InitializeResult,
    StreamMessageReader, StreamMessageWriter, IPCMessageReader, IPCMessageWriter, createProtocolConnection,
    DidOpenTextDocumentNotification, DidChangeTextDocumentNotification, PublishDiagnosticsNotification,
    InitializeRequest, InitializedNotification, ShutdownRequest, ExitNotification, DidChangeConfigurationNotification,
    ConfigurationRequest, RegistrationRequest, WorkDoneProgressCreateRequest,
} from 'vscode-languageserver-protocol/node';

/** The repository root: the first folder upwards holding scripts/build.mjs (this file may run from a bundle in node_modules/.cache). */
function findRoot(): string {
    for (const start of [dirname(fileURLToPath(import.meta.url)), process.cwd()]) {
        for (let dir = start; ; dir = dirname(dir)) {
            if (existsSync(join(dir, 'scripts', 'build.mjs')) && existsSync(join(dir, 'server'))) return dir;
            if (dirname(dir) === dir) break;
        }
    }
    throw new Error('cannot find the repository root (scripts/build.mjs)');
}

export const ROOT = findRoot();
const BUNDLE = join(ROOT, 'server', 'dist', 'server.mjs');

function sleep(ms: number): Promise<void> {
    return new Promise((r) => setTimeout(r, ms));
}

let builtCopy: string | undefined;

/** Builds the bundle once per process (under a cross-process lock) and returns a private copy of it. */
export async function serverBundle(): Promise<string> {
    if (builtCopy) return builtCopy;
    const cache = join(ROOT, 'node_modules', '.cache');
    mkdirSync(cache, { recursive: true });
    const lock = join(cache, 'detent-lsp-build.lock');
    const deadline = Date.now() + 120_000;
    for (;;) {
        try { mkdirSync(lock); break; } catch {
            if (Date.now() > deadline) throw new Error('timed out waiting for the server build lock');
            await sleep(100);
        }
    }
    try {
        execFileSync(process.execPath, [join(ROOT, 'scripts', 'build.mjs')], { cwd: ROOT, stdio: 'pipe' });
        if (!existsSync(BUNDLE)) throw new Error('scripts/build.mjs did not produce server/dist/server.mjs');
        const dir = mkdtempSync(join(cache, 'detent-lsp-'));
        const copy = join(dir, 'server.mjs');
        copyFileSync(BUNDLE, copy);
        process.on('exit', () => rmSync(dir, { recursive: true, force: true }));
        builtCopy = copy;
        return copy;
    } finally {
        rmdirSync(lock);
    }
}

export interface StartOptions {
    /** Sent as initializationOptions and answered to workspace/configuration for section `detent`. */
    readonly settings?: Record<string, unknown>;
    /** 'server' (default): server/dist/server.mjs --stdio; 'cli': packages/cli/dist/detent.mjs lsp --stdio. */
    readonly via?: 'server' | 'cli' | 'ipc';
}

export class LspSession {
    private readonly diagnostics = new Map<string, PublishDiagnosticsParams[]>();
    private readonly waiters: { uri: string; after: number; resolve: (d: Diagnostic[]) => void }[] = [];
    private readonly versions = new Map<string, number>();
    readonly stderr: string[] = [];
    readonly logs: string[] = [];
    settings: Record<string, unknown>;

    private constructor(readonly process: ChildProcess, readonly connection: ProtocolConnection, settings: Record<string, unknown>) {
        this.settings = settings;
    }

    static async start(options: StartOptions = {}): Promise<LspSession> {
        const bundle = await serverBundle();
        const args = options.via === 'cli' ? [join(ROOT, 'packages', 'cli', 'dist', 'detent.mjs'), 'lsp', '--stdio'] : [bundle, '--stdio'];
        // e.g. DETENT_LSP_NODE_ARGS="--cpu-prof --cpu-prof-dir=/tmp/p" to profile the server
        const nodeArgs = (process.env['DETENT_LSP_NODE_ARGS'] ?? '').split(' ').filter(Boolean);
        const ipc = options.via === 'ipc';
        const child = ipc
            ? fork(bundle, ['--node-ipc'], { cwd: ROOT, execArgv: nodeArgs, stdio: ['pipe', 'pipe', 'pipe', 'ipc'] })
            : spawn(process.execPath, [...nodeArgs, ...args], { cwd: ROOT, stdio: ['pipe', 'pipe', 'pipe'] });
        const connection = ipc
            ? createProtocolConnection(new IPCMessageReader(child), new IPCMessageWriter(child))
            : createProtocolConnection(new StreamMessageReader(child.stdout!), new StreamMessageWriter(child.stdin!));
        const session = new LspSession(child, connection, { encoding: 'machine', flipflop: 'machine', severity: {}, ...(options.settings ?? {}) });
        child.stderr!.on('data', (d: Buffer) => session.stderr.push(d.toString()));
        connection.onNotification(PublishDiagnosticsNotification.type, (p) => session.onDiagnostics(p));
        connection.onNotification('window/logMessage', (p: { message: string }) => { session.logs.push(p.message); });
        connection.onRequest(ConfigurationRequest.type, (p) => p.items.map((item) => (item.section === 'detent' ? session.settings : null)));
        connection.onRequest(RegistrationRequest.type, () => { /* accepted */ });
        connection.onRequest(WorkDoneProgressCreateRequest.type, () => { /* accepted */ });
        connection.listen();
        const result: InitializeResult = await connection.sendRequest(InitializeRequest.type, {
            processId: process.pid,
            rootUri: pathToFileURL(ROOT).href,
            workspaceFolders: null,
            initializationOptions: session.settings,
            capabilities: {
                workspace: { configuration: true, didChangeConfiguration: { dynamicRegistration: true } },
                textDocument: {
                    publishDiagnostics: { relatedInformation: true },
                    codeAction: { codeActionLiteralSupport: { codeActionKind: { valueSet: ['quickfix', 'refactor'] } } },
                    hover: { contentFormat: ['markdown', 'plaintext'] },
                },
            },
        });
        session.capabilities = result.capabilities;
        await connection.sendNotification(InitializedNotification.type, {});
        return session;
    }

    capabilities: InitializeResult['capabilities'] = {};

    private onDiagnostics(p: PublishDiagnosticsParams): void {
        const list = this.diagnostics.get(p.uri) ?? [];
        list.push(p);
        this.diagnostics.set(p.uri, list);
        for (let i = this.waiters.length - 1; i >= 0; i--) {
            const w = this.waiters[i]!;
            if (w.uri === p.uri && list.length > w.after) {
                this.waiters.splice(i, 1);
                w.resolve(p.diagnostics);
            }
        }
    }

    private nextDiagnostics(uri: string, timeoutMs = 20_000): Promise<Diagnostic[]> {
        const after = this.diagnostics.get(uri)?.length ?? 0;
        return new Promise((resolve, reject) => {
            const timer = setTimeout(() => reject(new Error(`no diagnostics for ${uri} within ${timeoutMs} ms; stderr: ${this.stderr.join('')}`)), timeoutMs);
            this.waiters.push({ uri, after, resolve: (d) => { clearTimeout(timer); resolve(d); } });
        });
    }

    /** How many diagnostics publications arrived for a document so far. */
    publications(uri: string): number {
        return this.diagnostics.get(uri)?.length ?? 0;
    }

    /** Opens a document and resolves with its first diagnostics. */
    async open(uri: string, text: string): Promise<Diagnostic[]> {
        const next = this.nextDiagnostics(uri);
        this.versions.set(uri, 1);
        await this.connection.sendNotification(DidOpenTextDocumentNotification.type, { textDocument: { uri, languageId: 'detent', version: 1, text } });
        return next;
    }

    /** Replaces the whole text and resolves with the diagnostics of a build that follows it. */
    async change(uri: string, text: string): Promise<Diagnostic[]> {
        const next = this.nextDiagnostics(uri);
        this.sendChange(uri, text);
        return next;
    }

    /** Sends a full-text change without waiting (to test that stale builds are superseded). */
    sendChange(uri: string, text: string): void {
        const version = (this.versions.get(uri) ?? 1) + 1;
        this.versions.set(uri, version);
        void this.connection.sendNotification(DidChangeTextDocumentNotification.type, { textDocument: { uri, version }, contentChanges: [{ text }] });
    }

    /** Resolves with the first publication (the latest one included) that satisfies `accept`. */
    async waitFor(uri: string, accept: (d: Diagnostic[]) => boolean, timeoutMs = 20_000): Promise<Diagnostic[]> {
        const deadline = Date.now() + timeoutMs;
        for (;;) {
            const list = this.diagnostics.get(uri) ?? [];
            const last = list[list.length - 1];
            if (last && accept(last.diagnostics)) return last.diagnostics;
            if (Date.now() > deadline) throw new Error(`diagnostics for ${uri} never satisfied the condition; last: ${JSON.stringify(last?.diagnostics.map((d) => d.code))}`);
            await sleep(25);
        }
    }

    /** Waits until `ms` pass without new diagnostics for the document, then returns the last ones. */
    async settle(uri: string, ms = 400): Promise<Diagnostic[]> {
        for (;;) {
            const before = this.diagnostics.get(uri)?.length ?? 0;
            await sleep(ms);
            const list = this.diagnostics.get(uri) ?? [];
            if (list.length === before && list.length > 0) return list[list.length - 1]!.diagnostics;
        }
    }

    async configure(settings: Record<string, unknown>): Promise<void> {
        this.settings = { ...this.settings, ...settings };
        await this.connection.sendNotification(DidChangeConfigurationNotification.type, { settings: { detent: this.settings } });
    }

    request<R>(method: string, params: unknown): Promise<R> {
        return this.connection.sendRequest(method, params) as Promise<R>;
    }

    async stop(): Promise<void> {
        try {
            await Promise.race([this.connection.sendRequest(ShutdownRequest.type), sleep(2000)]);
            await this.connection.sendNotification(ExitNotification.type);
        } catch { /* the server may already be gone */ }
        await Promise.race([new Promise((r) => this.process.once('exit', r)), sleep(2000)]);
        if (this.process.exitCode === null) this.process.kill();
        this.connection.dispose();
    }
}

/** Line/character of the `occurrence`-th (0-based) match of `needle` in `text` — the oracle for expected ranges. */
export function positionOf(text: string, needle: string, occurrence = 0): { line: number; character: number } {
    let index = -1;
    for (let k = 0; k <= occurrence; k++) {
        index = text.indexOf(needle, index + 1);
        if (index < 0) throw new Error(`'${needle}' (occurrence ${occurrence}) not in text`);
    }
    const before = text.slice(0, index);
    const line = before.split('\n').length - 1;
    return { line, character: index - (before.lastIndexOf('\n') + 1) };
}

/** The range of a whole-word occurrence of `word` (0-based occurrence count, word boundaries respected). */
export function wordRange(text: string, word: string, occurrence = 0): { start: { line: number; character: number }; end: { line: number; character: number } } {
    const re = new RegExp(`\\b${word.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}\\b`, 'g');
    let m: RegExpExecArray | null;
    let k = 0;
    while ((m = re.exec(text))) {
        if (k++ === occurrence) {
            const before = text.slice(0, m.index);
            const line = before.split('\n').length - 1;
            const character = m.index - (before.lastIndexOf('\n') + 1);
            return { start: { line, character }, end: { line, character: character + word.length } };
        }
    }
    throw new Error(`word '${word}' (occurrence ${occurrence}) not in text`);
}

/** Applies LSP TextEdits (non-overlapping, any order) to a text — independent of the server. */
export function applyEdits(text: string, edits: readonly { range: { start: { line: number; character: number }; end: { line: number; character: number } }; newText: string }[]): string {
    const lineStarts = [0];
    for (let i = 0; i < text.length; i++) if (text[i] === '\n') lineStarts.push(i + 1);
    const offset = (p: { line: number; character: number }) => (p.line >= lineStarts.length ? text.length : Math.min(text.length, lineStarts[p.line]! + p.character));
    const sorted = [...edits].sort((a, b) => offset(b.range.start) - offset(a.range.start) || offset(b.range.end) - offset(a.range.end));
    let out = text;
    for (const e of sorted) out = out.slice(0, offset(e.range.start)) + e.newText + out.slice(offset(e.range.end));
    return out;
}
