#!/usr/bin/env node
// E2E entry (`npm run test:e2e`, and layer 4 of `npm test`). Installs the VS Code host (code-server,
// cached outside the repo), packages the .vsix, runs the browser-driven test in it, reports the
// Electron extension-host layer as skipped with its reason, and prints `N passed, N failed, N skipped`
// as the last line of stdout. Diagnostics go to stderr.
//
// DETENT_E2E_EXAMPLES=DIR   use DIR instead of examples/ (a copy is opened; the original is never touched)
// DETENT_SERVER_BUNDLE=FILE package FILE as the language server (development before the server exists)
// DETENT_E2E_DOCS_IMAGE=1   also copy the editor + diagram screenshot to docs/images/editor.png
// DETENT_E2E_KEEP=1         keep the scratch profiles in the temp folder
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { install } from '../../scripts/vscode-host.mjs';
import { detectElectronHost } from './electron.mjs';
import { CHROMIUM, log } from './host.mjs';
import { runVsCodeHostE2E } from './vscode-host.e2e.mjs';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const TOTAL_BUDGET_MS = 20 * 60_000;

let passed = 0;
let failed = 0;
let skipped = 0;

function finish() {
    process.stdout.write(`${passed} passed, ${failed} failed, ${skipped} skipped\n`);
    process.exit(failed === 0 ? 0 : 1);
}

// A hard stop so a hung browser or host can never hold CI.
const watchdog = setTimeout(() => {
    log(`E2E exceeded ${TOTAL_BUDGET_MS / 60_000} min; stopping`);
    failed++;
    finish();
}, TOTAL_BUDGET_MS);
watchdog.unref();

async function main() {
    const electron = detectElectronHost(root);
    if (electron.runnable) {
        log(`Electron extension host is available (${electron.reason}) but no Electron suite is defined; the code-server host covers the same ground.`);
    } else {
        log(`SKIP Electron extension-host tests: ${electron.reason}.`);
    }
    skipped++;

    if (!existsSync(CHROMIUM)) {
        log(`SKIP VS Code host E2E: no Chromium at ${CHROMIUM} (apt-get install -y chromium)`);
        skipped++;
        return;
    }
    let host;
    const t0 = Date.now();
    try {
        host = install();
        log(`VS Code host ready in ${((Date.now() - t0) / 1000).toFixed(1)} s (install took ${host.info.seconds} s when first done)`);
    } catch (e) {
        log(`FAIL VS Code host install: ${e instanceof Error ? e.message : String(e)}`);
        failed++;
        return;
    }
    const pk = spawnSync(process.execPath, [join(root, 'scripts', 'package-vsix.mjs')], { cwd: root, encoding: 'utf8', stdio: ['ignore', 'pipe', 'inherit'], timeout: 600_000 });
    if (pk.status !== 0) {
        log('FAIL packaging the .vsix');
        failed++;
        return;
    }
    const vsix = pk.stdout.trim().split('\n').pop();
    const examples = process.env.DETENT_E2E_EXAMPLES ? resolve(process.env.DETENT_E2E_EXAMPLES) : join(root, 'examples');
    const checks = await runVsCodeHostE2E({ entry: host.entry, vsix, examples });
    passed += checks.passed;
    failed += checks.failed;
    if (checks.failures.length) log(`failures:\n  ${checks.failures.join('\n  ')}`);
}

main().catch((e) => {
    log(`E2E runner error: ${e instanceof Error ? e.stack : String(e)}`);
    failed++;
}).finally(finish);
