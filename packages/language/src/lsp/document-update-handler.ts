/**
 * Debounced rebuilds while typing (leading and trailing edge). Langium rebuilds on every keystroke; each new build already
 * cancels the one before it (the workspace lock cancels the running write action), but a burst of
 * keystrokes would still start and abandon many builds. Changes are collected for a short quiet
 * period and built together; the previous build is cancelled at once, so stale diagnostics are
 * never published after a newer edit arrived.
 */
import { URI } from 'langium';
import { DefaultDocumentUpdateHandler, type LangiumSharedServices } from 'langium/lsp';
import type { TextDocumentChangeEvent } from 'vscode-languageserver';
import type { TextDocument } from 'vscode-languageserver-textdocument';

/** Quiet period before a build starts; short enough to keep edit→diagnostics well under 100 ms. */
export const DEBOUNCE_MS = 25;

export class DetentDocumentUpdateHandler extends DefaultDocumentUpdateHandler {
    private readonly pending = new Map<string, URI>();
    private timer: ReturnType<typeof setTimeout> | undefined;
    private lastFired = 0;
    private readonly shared: LangiumSharedServices;

    constructor(services: LangiumSharedServices) {
        super(services);
        this.shared = services;
    }

    override didChangeContent(change: TextDocumentChangeEvent<TextDocument>): void {
        const uri = URI.parse(change.document.uri);
        this.pending.set(uri.toString(), uri);
        // A newer text makes the running build stale: stop it now rather than when the next one starts.
        this.shared.workspace.WorkspaceLock.cancelWrite();
        const fire = () => {
            this.timer = undefined;
            this.lastFired = Date.now();
            const changed = [...this.pending.values()];
            this.pending.clear();
            this.fireDocumentUpdate(changed, []);
        };
        // Leading edge: an isolated edit builds at once; edits in quick succession are coalesced.
        if (!this.timer && Date.now() - this.lastFired >= DEBOUNCE_MS) {
            fire();
            return;
        }
        if (this.timer) clearTimeout(this.timer);
        this.timer = setTimeout(fire, DEBOUNCE_MS);
    }
}
