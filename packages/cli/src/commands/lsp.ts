/**
 * `detent lsp --stdio` (or `--node-ipc`): runs the same language server the VS Code extension starts.
 * The command only returns when the client disconnects.
 */
import type { CliIO } from '../io.js';
import { UsageError } from '../io.js';
import { parseArgs } from '../args.js';

export async function lspCommand(args: readonly string[], io: CliIO): Promise<number> {
    const parsed = parseArgs('lsp', args, { 'stdio': {}, 'node-ipc': {}, 'help': { alias: 'h' } });
    if (parsed.flags.has('help')) {
        io.stdout('Usage: detent lsp --stdio | --node-ipc\n  Runs the Detent language server (LSP 3.17) on the given transport.\n');
        return 0;
    }
    if (parsed.positionals.length > 0) throw new UsageError(`detent lsp: unexpected argument '${parsed.positionals[0]}'`);
    if (!parsed.flags.has('stdio') && !parsed.flags.has('node-ipc')) throw new UsageError('detent lsp: choose a transport: --stdio or --node-ipc');
    // Loaded lazily so that other commands do not pay for the language server's startup.
    const { startDetentLanguageServer } = await import('../../../language/src/lsp/start-server.js');
    const connection = startDetentLanguageServer();
    await new Promise<void>((resolve) => connection.onExit(() => resolve()));
    return 0;
}
