/**
 * `detent check PATH…`: every diagnostic of every machine in the given files and folders.
 * Exit 0: no errors; 1: errors; 2: usage or I/O.
 */
import { checkText } from '@detent/language';
import { parseArgs, stringFlag } from '../args.js';
import type { CliIO } from '../io.js';
import { UsageError } from '../io.js';
import { collectFiles, readSource } from '../check-files.js';
import { type FileReport, jsonReport, sarifReport, summary, textReport } from '../check-report.js';
// main.ts imports this module too; VERSION is read only when the command runs, so the cycle is harmless
import { VERSION } from '../main.js';

const FLAGS = {
    format: { value: true, choices: ['text', 'json', 'sarif'] },
    help: { alias: 'h' },
} as const;

export const CHECK_HELP = `Usage: detent check PATH… [--format text|json|sarif]

Checks every machine in the given .detent files and folders (folders are searched
recursively for *.detent, skipping node_modules and .git).

  --format text    file:line:col: severity code: message (default)
  --format json    {"files":[{"path","diagnostics":[…]}]} with 0-based LSP ranges
  --format sarif   SARIF 2.1.0 log for code-scanning tools
  --help           this text

Exit status: 0 no errors, 1 errors found, 2 usage or I/O problem.
Detent checks logic, not safety certification; defer to the applicable codes and licensed practice.
`;

export async function checkCommand(args: readonly string[], io: CliIO): Promise<number> {
    const parsed = parseArgs('check', args, FLAGS);
    if (parsed.flags.has('help')) {
        io.stdout(CHECK_HELP);
        return 0;
    }
    if (parsed.positionals.length === 0) throw new UsageError('detent check: missing PATH (a .detent file or a folder); see `detent check --help`');
    const format = stringFlag(parsed, 'format') ?? 'text';
    const sources = collectFiles('check', parsed.positionals).map((p) => readSource('check', p));
    const reports: FileReport[] = sources.map((s) => ({ path: s.path, findings: checkText(s.text, s.path) }));
    if (format === 'json') io.stdout(jsonReport(reports));
    else if (format === 'sarif') io.stdout(sarifReport(reports, VERSION));
    else {
        io.stdout(textReport(reports));
        io.stderr(summary(reports));
    }
    return reports.some((r) => r.findings.some((f) => f.severity === 'error')) ? 1 : 0;
}
