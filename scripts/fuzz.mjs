#!/usr/bin/env node
// Fuzz suite (issue 6). Fixed seed. Mutated, truncated and random-token files derived from
// examples/**/*.detent and generated machines, plus pathological inputs, each through parse →
// check → synth → export in a worker thread with a time budget (a hang is reported, not waited
// for); then a sample through the CLI bundle. Last line: `N passed, N failed`; exit 1 on failure.
//   node scripts/fuzz.mjs            bounded run (~2 minutes on 2 cores)
//   node scripts/fuzz.mjs --long     much longer local run (npm run fuzz)
//   --count N  --seed S  --jobs J    override the defaults
import { build } from 'esbuild';
import { scriptBundleOptions } from './script-bundle.mjs';
import { Worker } from 'node:worker_threads';
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const argv = process.argv.slice(2);
const flag = (name, fallback) => {
    const i = argv.indexOf(`--${name}`);
    return i >= 0 && argv[i + 1] !== undefined ? Number(argv[i + 1]) : fallback;
};
const long = argv.includes('--long');
const seed = flag('seed', 0xde7e47);
const count = flag('count', long ? 60_000 : 5_200);
const jobs = flag('jobs', Math.max(1, Math.min(availableParallelism(), long ? 8 : 2)));
const BUDGET_MS = flag('budget', 15_000);
const t0 = Date.now();

// 1. Bundle the worker (library code in-process, for speed) and the corpus generator.
const cache = join(root, 'node_modules', '.cache');
mkdirSync(cache, { recursive: true });
const out = mkdtempSync(join(cache, 'detent-fuzz-'));
process.on('exit', () => rmSync(out, { recursive: true, force: true }));
await build({
    entryPoints: { worker: join(root, 'scripts/fuzz-worker.ts'), lib: join(root, 'scripts/fuzz-lib.ts') },
    outdir: out,
    outExtension: { '.js': '.mjs' },
    ...scriptBundleOptions(root),
});
const lib = await import(pathToFileURL(join(out, 'lib.mjs')).href);

// 2. The corpus: seeds + mutations, then the pathological inputs.
const inputs = [...lib.corpus({ seed, count, root }), ...lib.pathologicalInputs()];
process.stdout.write(`fuzz: seed ${seed}, ${inputs.length} inputs, ${jobs} worker(s), budget ${BUDGET_MS} ms per input (pathological: their own)\n`);

// 3. Run them on a pool of workers; a worker past its budget is terminated and replaced.
const failures = [];
let passed = 0;
let usableCount = 0;
let synthCount = 0;
let exportCount = 0;
let slowest = { id: '', ms: 0 };
let next = 0;

function runWorker() {
    return new Promise((resolve) => {
        let worker;
        let current;
        let timer;
        const start = () => {
            worker = new Worker(join(out, 'worker.mjs'), { resourceLimits: { maxOldGenerationSizeMb: 3072 } });
            worker.on('message', (msg) => {
                clearTimeout(timer);
                const ms = msg.ms;
                if (ms > slowest.ms) slowest = { id: current.id, ms };
                const r = msg.result;
                usableCount += r.usable; synthCount += r.synthesized; exportCount += r.exports;
                if (r.problems.length) failures.push({ input: current, problems: r.problems });
                else passed++;
                feed();
            });
            worker.on('error', (err) => {
                clearTimeout(timer);
                if (current) failures.push({ input: current, problems: [`worker died: ${err?.stack ?? err}`] });
                current = undefined;
                start();
                feed();
            });
        };
        const feed = () => {
            if (next >= inputs.length) {
                current = undefined;
                worker.terminate().then(() => resolve());
                return;
            }
            current = inputs[next++];
            const input = current;
            const budget = input.budgetMs ?? BUDGET_MS;
            timer = setTimeout(() => {
                failures.push({ input, problems: [`hang: no answer within ${budget} ms`] });
                const old = worker;
                current = undefined;
                old.removeAllListeners();
                old.terminate();
                start();
                feed();
            }, budget);
            // SARIF schema validation for a sample (every 25th input and every pathological one)
            worker.postMessage({ id: input.id, text: input.text, parseOnly: input.parseOnly, sarif: next % 25 === 0 || input.id.startsWith('pathological:'), root });
        };
        start();
        feed();
    });
}
const progress = setInterval(() => process.stderr.write(`fuzz: ${next}/${inputs.length} after ${((Date.now() - t0) / 1000).toFixed(0)} s\n`), 15_000);
await Promise.all(Array.from({ length: jobs }, runWorker));
clearInterval(progress);
const libSeconds = (Date.now() - t0) / 1000;

// 4. A sample through the CLI bundle: exit codes, valid JSON, never a stack trace.
const cliBin = join(root, 'packages/cli/bin/detent.js');
if (!existsSync(join(root, 'packages/cli/dist/detent.mjs'))) spawnSync(process.execPath, [join(root, 'scripts/build.mjs')], { stdio: 'inherit' });
const tmp = mkdtempSync(join(tmpdir(), 'detent-fuzz-cli-'));
const sample = inputs.filter((_, i) => i % Math.max(1, Math.floor(inputs.length / (long ? 200 : 20))) === 0 && inputs[i].text.length < 200_000);
let cliPassed = 0;
for (const [k, input] of sample.entries()) {
    const file = join(tmp, `f${k}.detent`);
    writeFileSync(file, input.text);
    const problems = [];
    for (const args of [['check', '--format', 'json', file], ['check', '--format', 'sarif', file], ['synth', '--format', 'json', file]]) {
        const r = spawnSync(process.execPath, [cliBin, ...args], { encoding: 'utf8', timeout: 60_000 });
        const what = `detent ${args.slice(0, 3).join(' ')}`;
        if (r.error || r.status === null) { problems.push(`${what}: ${r.error?.message ?? r.signal}`); continue; }
        const okCodes = args[0] === 'check' ? [0, 1] : [0, 1, 2];
        if (!okCodes.includes(r.status)) problems.push(`${what}: exit ${r.status}: ${r.stderr.slice(0, 300)}`);
        if (/\n\s+at .+:\d+:\d+\)?/.test(r.stderr)) problems.push(`${what}: stack trace on stderr`);
        if (r.status === 0 || args[0] === 'check') {
            try { JSON.parse(r.stdout); } catch (err) { if (r.stdout.length || args[0] === 'check') problems.push(`${what}: stdout is not JSON (${err.message})`); }
        }
    }
    if (problems.length) failures.push({ input: { ...input, id: `cli:${input.id}` }, problems });
    else cliPassed++;
}
rmSync(tmp, { recursive: true, force: true });

// 5. Report.
const seconds = (Date.now() - t0) / 1000;
process.stdout.write(`fuzz: ${inputs.length} inputs in-process in ${libSeconds.toFixed(1)} s (${usableCount} usable machines, ${synthCount} synthesized, ${exportCount} files exported); slowest ${slowest.id} ${slowest.ms.toFixed(0)} ms\n`);
process.stdout.write(`fuzz: ${sample.length} inputs through the CLI bundle (check json, check sarif, synth json): ${cliPassed} clean\n`);
if (failures.length) {
    const dir = join(root, 'test-results', 'fuzz-failures');
    mkdirSync(dir, { recursive: true });
    failures.forEach((f, i) => {
        writeFileSync(join(dir, `${i}.detent`), f.input.text);
        writeFileSync(join(dir, `${i}.txt`), `${f.input.id}\n${f.problems.join('\n')}\n`);
    });
    for (const f of failures.slice(0, 25)) process.stdout.write(`FAIL ${f.input.id}\n  ${f.problems.slice(0, 3).join('\n  ').slice(0, 1500)}\n`);
    if (failures.length > 25) process.stdout.write(`… ${failures.length - 25} more; all in test-results/fuzz-failures/\n`);
}
process.stdout.write(`fuzz: total ${seconds.toFixed(1)} s\n`);
process.stdout.write(`${passed + cliPassed} passed, ${failures.length} failed\n`);
process.exit(failures.length === 0 ? 0 : 1);
