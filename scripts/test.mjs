#!/usr/bin/env node
// The whole test suite (README: `npm test`; CI: .ci/run). Runs each layer, then prints one
// closing line `N passed, N failed` over all layers, and exits non-zero on any failure.
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, mkdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const results = join(root, 'test-results');
mkdirSync(results, { recursive: true });
let passed = 0;
let failed = 0;
let skipped = 0;
const summary = [];

function run(label, cmd, args, options = {}) {
    const t0 = Date.now();
    process.stdout.write(`\n=== ${label}: ${cmd} ${args.join(' ')}\n`);
    const r = spawnSync(cmd, args, { cwd: root, stdio: 'inherit', env: { ...process.env, ...options.env } });
    const seconds = ((Date.now() - t0) / 1000).toFixed(1);
    summary.push(`${label}: exit ${r.status ?? r.signal} in ${seconds} s`);
    return r.status === 0;
}

function countVitest(file) {
    if (!existsSync(file)) return false;
    const report = JSON.parse(readFileSync(file, 'utf8'));
    passed += report.numPassedTests ?? 0;
    failed += report.numFailedTests ?? 0;
    // A test file that fails to load has no failed test of its own: count it once.
    for (const file of report.testResults ?? []) {
        if (file.status === 'failed' && !(file.assertionResults ?? []).some((a) => a.status === 'failed')) failed++;
    }
    skipped += (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
    return true;
}

// 1. Build the bundles the CLI, protocol and E2E tests execute.
if (run('build', process.execPath, ['scripts/build.mjs'])) passed++; else failed++;
// 2. Type-check the whole workspace (strict).
if (run('typecheck', process.execPath, [join(root, 'node_modules/typescript/bin/tsc'), '-p', 'tsconfig.json'])) passed++; else failed++;
// 3. Unit, property, CLI, protocol and real-HDL-tool tests.
const vitestJson = join(results, 'vitest.json');
const vitestOk = run('vitest', process.execPath, [join(root, 'node_modules/vitest/vitest.mjs'), 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${vitestJson}`]);
const failedBefore = failed;
if (!countVitest(vitestJson) || (!vitestOk && failed === failedBefore)) failed++;
// 4. Layers with runners of their own (E2E in a real VS Code host, fuzzing) print `N passed, N failed` last.
for (const [label, script] of [['fuzz', 'scripts/fuzz.mjs'], ['e2e', 'tests/e2e/run.mjs']]) {
    if (!existsSync(join(root, script))) continue;
    const r = spawnSync(process.execPath, [script], { cwd: root, encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'] });
    process.stdout.write(r.stdout ?? '');
    const m = /(\d+) passed, (\d+) failed(?:, (\d+) skipped)?\s*$/.exec((r.stdout ?? '').trimEnd());
    if (m) {
        passed += Number(m[1]); failed += Number(m[2]); skipped += Number(m[3] ?? 0);
        if (r.status !== 0 && Number(m[2]) === 0) failed++;
    } else {
        failed++;
    }
    summary.push(`${label}: exit ${r.status}`);
}

process.stdout.write(`\n${summary.join('\n')}\n`);
process.stdout.write(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}\n`);
process.exitCode = failed === 0 ? 0 : 1;
