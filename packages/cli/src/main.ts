/**
 * `detent` command line: dispatches to one module per command. Thin over core + language.
 */
import { type CliIO, type Command, UsageError } from './io.js';
import { checkCommand } from './commands/check.js';
import { synthCommand } from './commands/synth.js';
import { exportCommand } from './commands/export.js';
import { testCommand } from './commands/test.js';
import { simCommand } from './commands/sim.js';
import { lspCommand } from './commands/lsp.js';

export const VERSION = '0.1.0';

const COMMANDS: Readonly<Record<string, { run: Command; summary: string }>> = {
    check: { run: checkCommand, summary: 'check PATH…            report design defects (text, --format json|sarif)' },
    synth: { run: synthCommand, summary: 'synth FILE              state codes, minimized equations and cost' },
    export: { run: exportCommand, summary: 'export FILE --to LANG   Verilog, SystemVerilog, VHDL, C or DOT (with --testbench)' },
    test: { run: testCommand, summary: 'test PATH…              run every scenario' },
    sim: { run: simCommand, summary: 'sim FILE --stimulus F   simulate a stimulus file (table, --vcd OUT)' },
    lsp: { run: lspCommand, summary: 'lsp --stdio             run the language server' },
};

export function usage(): string {
    return [
        `detent ${VERSION} — clocked finite state machines: check, synthesize, export`,
        '',
        'Usage: detent <command> [options]',
        '',
        ...Object.values(COMMANDS).map((c) => `  detent ${c.summary}`),
        '',
        'Run `detent <command> --help` for the options of one command.',
        'Detent checks logic; it is not a safety certification. Defer to the applicable codes and licensed practice.',
        '',
    ].join('\n');
}

export async function main(argv: readonly string[], io: CliIO): Promise<number> {
    const [name, ...rest] = argv;
    if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
        io.stdout(usage());
        return name === undefined ? 2 : 0;
    }
    if (name === '--version' || name === '-v') {
        io.stdout(`${VERSION}\n`);
        return 0;
    }
    const command = COMMANDS[name];
    if (!command) {
        io.stderr(`detent: unknown command '${name}' (valid: ${Object.keys(COMMANDS).join(', ')})\n`);
        return 2;
    }
    try {
        return await command.run(rest, io);
    } catch (err) {
        if (err instanceof UsageError) {
            io.stderr(`${err.message}\n`);
            return 2;
        }
        throw err;
    }
}
