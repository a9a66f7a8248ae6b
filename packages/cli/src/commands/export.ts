import type { CliIO } from '../io.js';

/** PLACEHOLDER: `detent export` is built by its issue. */
export async function exportCommand(args: readonly string[], io: CliIO): Promise<number> {
    void args;
    io.stderr('detent export: not built yet\n');
    return 2;
}
