/**
 * `detent check PATH…`: every diagnostic of every machine in the given files and folders.
 * Exit 0: no errors; 1: errors; 2: usage or I/O.
 */
import { checkText } from '@detent/language';
import { parseArgs, stringFlag } from '../args.js';
import type { CliIO } from '../io.js';
import { UsageError } from '../io.js';
import { IGNORE_FILE, collectFilesWithIgnored, readSource } from '../check-files.js';
import { type FileReport, jsonReport, sarifReport, summary, textReport } from '../check-report.js';
// main.ts imports this module too; VERSION is read only when the command runs, so the cycle is harmless
import { VERSION } from '../main.js';

const FLAGS = {
    format: { value: true, choices: ['text', 'json', 'sarif'] },
    help: { alias: 'h' },
} as const;

export const CHECK_HELP = `Usage: detent check PATH… [--format text|json|sarif]

Checks every machine in the given .detent files and folders (folders are searched
recursively for *.detent, skipping node_modules, .git and whatever a .detentignore file in a
searched folder lists: one name or glob per line, relative to that folder, * and ? wildcards,
a trailing / for folders only, # comments). Files named on the command line are always checked.

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
    const collected = collectFilesWithIgnored('check', parsed.positionals);
    const sources = collected.files.map((p) => readSource('check', p));
    const reports: FileReport[] = sources.map((s) => ({ path: s.path, findings: checkText(s.text, s.path) }));
    // skipped files are always mentioned on stderr, so an ignore file never hides anything silently
    const skipped = collected.ignored > 0 ? `${collected.ignored} file${collected.ignored === 1 ? '' : 's'} skipped by ${IGNORE_FILE}` : '';
    if (format === 'json' || format === 'sarif') {
        io.stdout(format === 'json' ? jsonReport(reports) : sarifReport(reports, VERSION));
        if (skipped) io.stderr(`detent check: ${skipped}\n`);
    } else {
        io.stdout(textReport(reports));
        const line = summary(reports);
        io.stderr(skipped ? `${line.replace(/\n$/, '')}; ${skipped}\n` : line);
    }
    return reports.some((r) => r.findings.some((f) => f.severity === 'error')) ? 1 : 0;
}
