import type { CliIO } from '../io.js';

/** PLACEHOLDER: `detent check` is built by its issue. */
export async function checkCommand(args: readonly string[], io: CliIO): Promise<number> {
    void args;
    io.stderr('detent check: not built yet\n');
    return 2;
}
