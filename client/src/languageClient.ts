// Starts the Detent language server (a Node bundle shipped inside the extension) over IPC.
// The client stays thin: every analysis happens in the server.
import * as fs from 'node:fs';
import * as vscode from 'vscode';
import { LanguageClient, TransportKind, type LanguageClientOptions, type ServerOptions } from 'vscode-languageclient/node';
import type { DetentSettings } from '../../packages/language/src/lsp/protocol.js';

/** Where the server bundle lives: `server/server.mjs` in a packaged .vsix, `../server/dist/server.mjs` in the repo. */
export function serverModulePath(context: vscode.ExtensionContext): string {
    const candidates = [
        context.asAbsolutePath('server/server.mjs'),
        context.asAbsolutePath('../server/dist/server.mjs'),
    ];
    const found = candidates.find((p) => fs.existsSync(p));
    if (!found) throw new Error(`Detent language server not found (looked for ${candidates.join(', ')})`);
    return found;
}

export function readSettings(): DetentSettings {
    const cfg = vscode.workspace.getConfiguration('detent');
    return {
        encoding: cfg.get<string>('encoding', 'machine'),
        flipflop: cfg.get<string>('flipflop', 'machine'),
        severity: cfg.get<Record<string, string>>('severity', {}),
    };
}

/**
 * Resolves when the server has published its first diagnostics (its initial workspace build is done),
 * or after `WORKSPACE_READY_TIMEOUT_MS`. Custom requests wait for it: asked earlier, the server would
 * load a document from disk while its own workspace scan adds the same document.
 */
const WORKSPACE_READY_TIMEOUT_MS = 8000;
let markReady: (() => void) | undefined;
export const serverWorkspaceReady: Promise<void> = new Promise<void>((resolve) => { markReady = resolve; });

export function createLanguageClient(context: vscode.ExtensionContext, output: vscode.LogOutputChannel): LanguageClient {
    const module = serverModulePath(context);
    output.appendLine(`Starting the Detent language server: ${module}`);
    const serverOptions: ServerOptions = {
        run: { module, transport: TransportKind.ipc },
        debug: { module, transport: TransportKind.ipc, options: { execArgv: ['--nolazy', '--inspect=6019'] } },
    };
    const clientOptions: LanguageClientOptions = {
        documentSelector: [{ language: 'detent' }],
        outputChannel: output,
        middleware: {
            handleDiagnostics: (uri, diagnostics, next) => {
                markReady?.();
                next(uri, diagnostics);
            },
        },
        initializationOptions: readSettings(),
        synchronize: {
            // Sends the `detent` section with workspace/didChangeConfiguration whenever it changes.
            configurationSection: 'detent',
            fileEvents: vscode.workspace.createFileSystemWatcher('**/*.detent'),
        },
    };
    const client = new LanguageClient('detent', 'Detent', serverOptions, clientOptions);
    setTimeout(() => markReady?.(), WORKSPACE_READY_TIMEOUT_MS).unref?.();
    return client;
}
