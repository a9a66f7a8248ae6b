import type { CliIO } from '../io.js';

/** PLACEHOLDER: `detent test` is built by its issue. */
export async function testCommand(args: readonly string[], io: CliIO): Promise<number> {
    void args;
    io.stderr('detent test: not built yet\n');
    return 2;
}
