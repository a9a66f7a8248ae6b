import type { CliIO } from '../io.js';

/** PLACEHOLDER: `detent lsp` is built by its issue. */
export async function lspCommand(args: readonly string[], io: CliIO): Promise<number> {
    void args;
    io.stderr('detent lsp: not built yet\n');
    return 2;
}
