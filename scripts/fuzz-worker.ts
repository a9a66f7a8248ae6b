/**
 * One fuzz input through the whole pipeline, in-process: parse → check → synthesize → export
 * (every language and style when the machine is usable), checking the invariants on the way.
 * Runs as a worker thread of scripts/fuzz.mjs (so a hang is a timeout there, not a stuck run);
 * `runPipeline` is also imported directly by tests.
 */
import { parentPort } from 'node:worker_threads';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import Ajv from 'ajv';
import { checkParsed, parseDetent } from '@detent/language';
import {
    type ExportLanguage, type ExportStyle, type Finding, GENERATED_PHRASE, SynthesisError, analyzeMachine, exportMachine,
    recoveryReport, synthesize,
} from '@detent/core';
import { jsonReport, sarifReport } from '../packages/cli/src/check-report.js';
import { synthJson } from '../packages/cli/src/commands/synth.js';
import { formatDetentText } from '../packages/language/src/lsp/formatter.js';
import { lineLengths, rangeProblem } from './fuzz-lib.js';

export interface PipelineResult {
    /** Invariant violations (an uncaught exception is one, with its stack). */
    readonly problems: string[];
    readonly machines: number;
    readonly usable: number;
    readonly synthesized: number;
    readonly exports: number;
}

const LANGUAGES: readonly ExportLanguage[] = ['verilog', 'systemverilog', 'vhdl', 'c', 'dot'];
const STYLES: readonly ExportStyle[] = ['behavioral', 'structural'];

type Validate = ((data: unknown) => boolean) & { errors?: unknown };
let sarifValidate: Validate | undefined;
function sarifValidator(root: string): Validate {
    if (!sarifValidate) {
        // The OASIS SARIF 2.1.0 schema (JSON Schema draft-07) is the oracle for the SARIF shape.
        const schema = JSON.parse(readFileSync(join(root, 'tests/fixtures/sarif-schema-2.1.0.json'), 'utf8')) as Record<string, unknown>;
        const AjvClass = (Ajv as unknown as { default?: typeof Ajv }).default ?? Ajv;
        const ajv = new AjvClass({ allErrors: false });
        ajv.addFormat('uri', (s: string) => URL.canParse(s));
        ajv.addFormat('uri-reference', (s: string) => URL.canParse(s, 'file:///'));
        ajv.addFormat('date-time', /^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(\.\d+)?(Z|[+-]\d\d:\d\d)$/i);
        sarifValidate = ajv.compile(schema) as Validate;
    }
    return sarifValidate;
}

function checkFindings(where: string, findings: readonly Finding[], lengths: readonly number[], problems: string[]): void {
    for (const f of findings) {
        const p = rangeProblem(f.range, lengths);
        if (p) problems.push(`${where}: ${f.code} '${f.message.slice(0, 80)}': range ${p}`);
        for (const r of f.related ?? []) {
            const q = rangeProblem(r.range, lengths);
            if (q) problems.push(`${where}: ${f.code} related '${r.message.slice(0, 60)}': range ${q}`);
        }
        if (typeof f.message !== 'string' || f.message.length === 0) problems.push(`${where}: ${f.code} without a message`);
    }
}

function jsonProblem(where: string, text: string): string | undefined {
    try {
        JSON.parse(text);
        return undefined;
    } catch (err) {
        return `${where}: invalid JSON (${(err as Error).message})`;
    }
}

export interface PipelineOptions {
    readonly root: string;
    readonly parseOnly?: boolean;
    /** Validate SARIF against the schema (slower; the runner does it for a sample). */
    readonly sarif?: boolean;
}

export function runPipeline(text: string, options: PipelineOptions): PipelineResult {
    const problems: string[] = [];
    let machines = 0;
    let usable = 0;
    let synthesized = 0;
    let exports = 0;
    const step = (name: string, fn: () => void) => {
        try {
            fn();
        } catch (err) {
            problems.push(`${name}: uncaught ${err instanceof Error ? `${err.name}: ${err.message}\n${(err.stack ?? '').split('\n').slice(1, 6).join('\n')}` : String(err)}`);
        }
    };
    const lengths = lineLengths(text);
    step('format', () => {
        // the editor formats any text: it must not throw, and a result must be a fixed point
        const once = formatDetentText(text);
        if (once !== undefined && formatDetentText(once) !== once) problems.push('format: not idempotent');
    });
    step('parse', () => {
        const parsed = parseDetent(text, 'file:///fuzz.detent');
        machines = parsed.machines.length;
        checkFindings('parse', parsed.findings, lengths, problems);
        let findings: Finding[] = [];
        step('check', () => {
            findings = checkParsed(parsed);
            checkFindings('check', findings, lengths, problems);
        });
        step('check json', () => {
            const report = [{ path: 'fuzz.detent', findings }];
            const json = jsonReport(report);
            const bad = jsonProblem('check --format json', json);
            if (bad) problems.push(bad);
            else {
                const back = JSON.parse(json) as { files: { diagnostics: unknown[] }[] };
                if (back.files[0]?.diagnostics.length !== findings.length) problems.push('check --format json: diagnostics lost');
            }
            const sarif = sarifReport(report, '0.0.0');
            const badSarif = jsonProblem('check --format sarif', sarif);
            if (badSarif) problems.push(badSarif);
            else if (options.sarif) {
                const validate = sarifValidator(options.root);
                if (!validate(JSON.parse(sarif))) problems.push(`check --format sarif: not SARIF 2.1.0: ${JSON.stringify(validate.errors).slice(0, 300)}`);
            }
        });
        if (options.parseOnly) return;
        for (const m of parsed.machines) {
            if (!m.usable) continue;
            const errors = [...m.findings, ...analyzeMachine(m.machine)].filter((f) => f.severity === 'error');
            if (errors.length) continue;
            usable++;
            step(`synth ${m.machine.name}`, () => {
                let result;
                try {
                    result = synthesize(m.machine);
                } catch (err) {
                    if (err instanceof SynthesisError) return; // a reported refusal, not a crash
                    throw err;
                }
                synthesized++;
                const recovery = recoveryReport(result, { budgetMs: 2000 });
                const json = JSON.stringify(synthJson(result, recovery));
                const bad = jsonProblem('synth --format json', json);
                if (bad) problems.push(bad);
                for (const language of LANGUAGES) {
                    for (const style of STYLES) {
                        if ((language === 'c' || language === 'dot') && style === 'structural') continue;
                        step(`export ${language} ${style}`, () => {
                            const files = exportMachine(m.machine, language, {
                                style, testbench: language !== 'c' && language !== 'dot', statePort: true, sourceName: 'fuzz.detent', sourceText: text,
                                assignment: result.assignment, synthesis: result,
                            });
                            for (const f of files) {
                                exports++;
                                if (!/^[A-Za-z0-9_][A-Za-z0-9_.-]*$/.test(f.name) || f.name.includes('..')) problems.push(`export ${language}: unsafe file name '${f.name}'`);
                                if (!f.text.includes(GENERATED_PHRASE)) problems.push(`export ${language} ${f.name}: no generated-file header`);
                            }
                        });
                    }
                }
            });
        }
    });
    return { problems, machines, usable, synthesized, exports };
}

// Worker protocol: {id, text, parseOnly, sarif} in, {id, result, ms} out.
if (parentPort) {
    const port = parentPort;
    port.on('message', (msg: { id: string; text: string; parseOnly?: boolean; sarif?: boolean; root: string }) => {
        const t0 = performance.now();
        const result = runPipeline(msg.text, { root: msg.root, parseOnly: msg.parseOnly, sarif: msg.sarif });
        port.postMessage({ id: msg.id, result, ms: performance.now() - t0 });
    });
}
