/**
 * `detent export FILE --to verilog|systemverilog|vhdl|c|dot [--style behavioral|structural]
 *  [--testbench] [--state-port] [--machine M] [-o DIR] [--force]`
 * One file set per machine, named as the machine, written atomically (temp file + rename) into DIR
 * (default: beside FILE). A file that exists without Detent's generated-file header is never
 * overwritten unless --force. Exit 0: written; 1: the machine has errors; 2: usage or I/O.
 */
import { existsSync, mkdirSync, readFileSync, renameSync, unlinkSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, resolve, sep } from 'node:path';
import { parseDetent } from '@detent/language';
import {
    type ExportFile, type ExportLanguage, type ExportStyle, type Finding, type Machine, type SynthesisResult,
    SynthesisError, analyzeMachine, exportMachine, isDetentGenerated, synthesize,
} from '@detent/core';
import { parseArgs, stringFlag } from '../args.js';
import type { CliIO } from '../io.js';
import { UsageError } from '../io.js';
import { readSource } from '../check-files.js';

const LANGUAGES: readonly ExportLanguage[] = ['verilog', 'systemverilog', 'vhdl', 'c', 'dot'];

const FLAGS = {
    to: { value: true, choices: LANGUAGES },
    style: { value: true, choices: ['behavioral', 'structural'] },
    testbench: {},
    'state-port': {},
    machine: { value: true },
    output: { value: true, alias: 'o' },
    force: {},
    help: { alias: 'h' },
} as const;

export const EXPORT_HELP = `Usage: detent export FILE --to LANG [--style behavioral|structural] [--testbench] [--state-port]
                     [--machine M] [-o DIR] [--force]

Writes one module/entity per machine, named as the machine:
  --to verilog        NAME.v   (Verilog-2005)         --to systemverilog  NAME.sv  (SystemVerilog-2017)
  --to vhdl           NAME.vhd (VHDL-2008)            --to c              NAME.h + NAME.c (C99)
  --to dot            NAME.dot (state diagram, Graphviz)
  --style behavioral  state register + case on the state (default)
  --style structural  the synthesized excitation and output equations, flip-flops as declared
  --testbench         also NAME_tb.v / NAME_tb.sv / NAME_tb.vhd running the machine's scenarios (implies --state-port)
  --state-port        add the output port 'state' (the state code) after the outputs
  --machine M         export only machine M (default: every machine in FILE)
  -o, --output DIR    where to write (default: the folder of FILE)
  --force             overwrite files that lack Detent's generated-file header
  --help              this text

Ports: clock, reset, inputs, outputs in declaration order, then 'state'.
Exit status: 0 written, 1 the machine has errors, 2 usage or I/O problem.
Detent checks logic, not safety certification; defer to the applicable codes and licensed practice.
`;

export function location(path: string, f: Finding): string {
    return `${path}:${f.range.start.line + 1}:${f.range.start.character + 1}: ${f.severity} ${f.code}: ${f.message}`;
}

/** The machines of a file, or the exit status when the file has errors (messages already printed). */
export function loadMachines(command: string, path: string, wanted: string | undefined, io: CliIO): { text: string; machines: Machine[] } | number {
    const source = readSource(command, path);
    const doc = parseDetent(source.text, path);
    if (doc.machines.length === 0) {
        const errors = doc.findings.filter((f) => f.severity === 'error');
        for (const f of errors) io.stderr(`${location(path, f)}\n`);
        if (errors.length) return 1;
        throw new UsageError(`detent ${command}: ${path}: no machine in this file`);
    }
    const chosen = wanted === undefined ? doc.machines : doc.machines.filter((m) => m.machine.name === wanted);
    if (chosen.length === 0) throw new UsageError(`detent ${command}: no machine '${wanted}' in ${path} (machines: ${doc.machines.map((m) => m.machine.name).join(', ')})`);
    let status = 0;
    for (const lm of chosen) {
        const errors = [...lm.findings, ...(lm.usable ? analyzeMachine(lm.machine) : [])].filter((f) => f.severity === 'error');
        if (errors.length > 0 || !lm.usable) {
            for (const f of errors) io.stderr(`${location(path, f)}\n`);
            io.stderr(`detent ${command}: ${lm.machine.name} has errors; fix them first (see \`detent check\`)\n`);
            status = 1;
        }
    }
    if (status) return status;
    return { text: source.text, machines: chosen.map((m) => m.machine) };
}

/** Only plain identifiers become file names, so no machine name can leave DIR. */
export function confinedPath(dir: string, name: string): string {
    if (!/^[A-Za-z_][A-Za-z0-9_.]*$/.test(name) || name.includes('..') || basename(name) !== name) {
        throw new UsageError(`detent export: refusing the file name '${name}'`);
    }
    const root = resolve(dir);
    const full = resolve(root, name);
    if (dirname(full) !== root || !full.startsWith(root + sep)) throw new UsageError(`detent export: '${name}' would leave ${dir}`);
    return full;
}

/** Refuses (exit 2) when a target exists without the generated-file header and --force is not given. */
export function checkClobber(command: string, paths: readonly string[], force: boolean): void {
    if (force) return;
    for (const p of paths) {
        if (!existsSync(p)) continue;
        let text: string;
        try {
            text = readFileSync(p, 'utf8');
        } catch {
            throw new UsageError(`detent ${command}: ${p}: exists and cannot be read; not overwriting (use --force)`);
        }
        if (!isDetentGenerated(text)) throw new UsageError(`detent ${command}: ${p}: exists and was not generated by Detent; not overwriting (use --force)`);
    }
}

/** Writes through a temporary file in the same folder and a rename, so a reader never sees half a file. */
export function writeAtomic(command: string, path: string, text: string): void {
    const tmp = join(dirname(path), `.${basename(path)}.${process.pid}.tmp`);
    try {
        // A symlink planted at the temporary name must not redirect the write: remove whatever is
        // there (unlink removes a link, not its target) and create the file exclusively.
        try { unlinkSync(tmp); } catch { /* nothing left over */ }
        writeFileSync(tmp, text, { flag: 'wx' });
        renameSync(tmp, path);
    } catch (err) {
        try { unlinkSync(tmp); } catch { /* already gone */ }
        throw new UsageError(`detent ${command}: ${path}: cannot write (${(err as { code?: string }).code ?? String(err)})`);
    }
}

export async function exportCommand(args: readonly string[], io: CliIO): Promise<number> {
    const parsed = parseArgs('export', args, FLAGS);
    if (parsed.flags.has('help')) {
        io.stdout(EXPORT_HELP);
        return 0;
    }
    if (parsed.positionals.length !== 1) throw new UsageError('detent export: expected one FILE; see `detent export --help`');
    const language = stringFlag(parsed, 'to') as ExportLanguage | undefined;
    if (!language) throw new UsageError(`detent export: --to is required (one of: ${LANGUAGES.join(', ')})`);
    const style = (stringFlag(parsed, 'style') ?? 'behavioral') as ExportStyle;
    const testbench = parsed.flags.has('testbench');
    if (testbench && (language === 'c' || language === 'dot')) throw new UsageError(`detent export: --testbench is for verilog, systemverilog and vhdl, not ${language}`);
    if (style === 'structural' && (language === 'c' || language === 'dot')) throw new UsageError(`detent export: --style structural is for verilog, systemverilog and vhdl, not ${language}`);
    const path = parsed.positionals[0]!;
    const loaded = loadMachines('export', path, stringFlag(parsed, 'machine'), io);
    if (typeof loaded === 'number') return loaded;
    const dir = stringFlag(parsed, 'output') ?? dirname(path);

    const planned: { path: string; file: ExportFile }[] = [];
    for (const machine of loaded.machines) {
        let synthesis: SynthesisResult | undefined;
        if (style === 'structural' || machine.encoding === 'auto') {
            try {
                synthesis = synthesize(machine);
            } catch (err) {
                if (err instanceof SynthesisError) { io.stderr(`${path}: error: ${err.message}\n`); return 1; }
                throw err;
            }
        }
        const files = exportMachine(machine, language, {
            style, testbench, statePort: parsed.flags.has('state-port'), sourceName: basename(path), sourceText: loaded.text, synthesis,
        });
        for (const file of files) planned.push({ path: confinedPath(dir, file.name), file });
    }
    try {
        mkdirSync(dir, { recursive: true });
    } catch {
        throw new UsageError(`detent export: ${dir}: cannot create the folder`);
    }
    checkClobber('export', planned.map((p) => p.path), parsed.flags.has('force'));
    for (const p of planned) {
        writeAtomic('export', p.path, p.file.text);
        io.stdout(`wrote ${p.path}\n`);
    }
    return 0;
}
