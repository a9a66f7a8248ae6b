/**
 * Every editor handler fails soft: an exception is logged on the connection's console and the
 * request is answered with an empty result, so one bug never takes the editor's features down.
 * Cancellation is not an error and is passed through for Langium to answer.
 */
import { isOperationCancelled } from 'langium';
import type { LangiumServices, LangiumSharedServices } from 'langium/lsp';
import { ResponseError } from 'vscode-languageserver';

export function logError(shared: LangiumSharedServices, what: string, err: unknown): void {
    const text = `detent: ${what} failed: ${err instanceof Error ? err.stack ?? err.message : String(err)}`;
    const connection = shared.lsp.Connection;
    if (connection) connection.console.error(text);
    else console.error(text);
}

export async function failSoft<T>(services: LangiumServices | LangiumSharedServices, what: string, fallback: T, run: () => T | Promise<T>): Promise<T> {
    try {
        return await run();
    } catch (err) {
        // Cancellation and deliberate error answers (a refused export, …) go to the client as they are.
        if (isOperationCancelled(err) || err instanceof ResponseError) throw err;
        logError('shared' in services ? services.shared : services, what, err);
        return fallback;
    }
}
