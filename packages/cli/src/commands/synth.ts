import type { CliIO } from '../io.js';

/** PLACEHOLDER: `detent synth` is built by its issue. */
export async function synthCommand(args: readonly string[], io: CliIO): Promise<number> {
    void args;
    io.stderr('detent synth: not built yet\n');
    return 2;
}
