import type { CliIO } from '../io.js';

/** PLACEHOLDER: `detent sim` is built by its issue. */
export async function simCommand(args: readonly string[], io: CliIO): Promise<number> {
    void args;
    io.stderr('detent sim: not built yet\n');
    return 2;
}
