/**
 * Starts the Detent language server on a connection: Langium's services and handlers, Detent's
 * feature module (registered in detent-module.ts) and the custom `detent/*` requests.
 * Used by `server/src/main.ts` and by `detent lsp`.
 */
import { startLanguageServer } from 'langium/lsp';
import { NodeFileSystem } from 'langium/node';
import { type Connection, ProposedFeatures, createConnection } from 'vscode-languageserver/node';
import { createDetentServices } from '../detent-module.js';
import { registerDetentRequests } from './custom-requests.js';
import { AsBuiltDiagnostics } from './asbuilt-diagnostics.js';

/** Creates a connection from the process arguments (`--stdio`, `--node-ipc`, `--socket=`) unless given one. */
export function startDetentLanguageServer(connection: Connection = createConnection(ProposedFeatures.all)): Connection {
    const { shared, Detent } = createDetentServices({ connection, ...NodeFileSystem });
    registerDetentRequests(connection, shared, Detent);
    new AsBuiltDiagnostics(shared, Detent, connection);
    // Severity overrides and the active encoding change diagnostics, hovers and lenses: rebuild open documents.
    Detent.lsp.DetentSettings.onDidChange(() => {
        const uris = shared.workspace.LangiumDocuments.all.map((d) => d.uri).toArray();
        void shared.workspace.WorkspaceLock.write((token) => shared.workspace.DocumentBuilder.update(uris, [], token));
        void connection.sendRequest('workspace/codeLens/refresh').catch(() => undefined);
        void connection.sendRequest('workspace/inlayHint/refresh').catch(() => undefined);
    });
    startLanguageServer(shared);
    return connection;
}
