/** What a command may touch: its output streams. Commands never call process.exit themselves. */
export interface CliIO {
    readonly stdout: (text: string) => void;
    readonly stderr: (text: string) => void;
}

/** A mistake in how the command was called, or a file that cannot be read: exit 2, one line. */
export class UsageError extends Error {}

export type Command = (args: readonly string[], io: CliIO) => Promise<number>;
