// Process entry bundled into dist/detent.mjs. Internal errors (bugs) print one line plus a hint, never for user error.
import { main } from './main.js';

const io = {
    stdout: (t: string) => { process.stdout.write(t); },
    stderr: (t: string) => { process.stderr.write(t); },
};
main(process.argv.slice(2), io).then(
    (code) => { process.exitCode = code; },
    (err: unknown) => {
        process.stderr.write(`detent: internal error: ${err instanceof Error ? err.message : String(err)}\n(please report this with the input file)\n`);
        if (process.env.DETENT_DEBUG) process.stderr.write(`${err instanceof Error ? err.stack : ''}\n`);
        process.exitCode = 3;
    },
);
