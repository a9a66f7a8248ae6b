// A real VS Code host for the E2E test: code-server (installed by scripts/vscode-host.mjs) in a
// scratch folder, driven by Debian's Chromium through playwright-core. Every wait is bounded and
// every process is killed in `close()`.
import { spawn, spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export const CHROMIUM = process.env.DETENT_CHROMIUM ?? '/usr/bin/chromium';

export function log(msg) {
    process.stderr.write(`[e2e] ${msg}\n`);
}

export function freePort() {
    return new Promise((res, rej) => {
        const s = createServer();
        s.unref();
        s.on('error', rej);
        s.listen(0, '127.0.0.1', () => {
            const { port } = s.address();
            s.close(() => res(port));
        });
    });
}

export function sleep(ms) {
    return new Promise((r) => setTimeout(r, ms));
}

export async function withTimeout(promise, ms, what) {
    let t;
    try {
        return await Promise.race([promise, new Promise((_, rej) => { t = setTimeout(() => rej(new Error(`timed out after ${ms} ms: ${what}`)), ms); })]);
    } finally {
        clearTimeout(t);
    }
}

async function waitForHttp(url, ms) {
    const until = Date.now() + ms;
    let last;
    while (Date.now() < until) {
        try {
            const r = await fetch(url, { redirect: 'manual', signal: AbortSignal.timeout(2000) });
            if (r.status > 0) return;
        } catch (e) {
            last = e;
        }
        await sleep(250);
    }
    throw new Error(`code-server did not answer at ${url} within ${ms} ms (${String(last)})`);
}

/**
 * Prepares a scratch VS Code profile with the extension installed and a copy of the workspace.
 * `settings` become the user settings.
 */
export function prepareProfile({ entry, vsix, workspaceFrom, settings, label }) {
    const dir = mkdtempSync(join(tmpdir(), `detent-e2e-${label}-`));
    const userData = join(dir, 'user-data');
    const extensions = join(dir, 'extensions');
    const workspace = join(dir, 'workspace');
    mkdirSync(join(userData, 'User'), { recursive: true });
    mkdirSync(extensions, { recursive: true });
    cpSync(workspaceFrom, workspace, { recursive: true });
    writeFileSync(join(userData, 'User', 'settings.json'), JSON.stringify(settings, null, 2));
    const config = join(dir, 'config.yaml');
    writeFileSync(config, 'auth: none\ncert: false\n');
    const t0 = Date.now();
    const r = spawnSync(process.execPath, [entry, '--config', config, '--user-data-dir', userData, '--extensions-dir', extensions, '--install-extension', vsix], {
        encoding: 'utf8',
        timeout: 120_000,
    });
    if (r.status !== 0) throw new Error(`--install-extension failed (status ${r.status}, signal ${r.signal}):\n${r.stdout}\n${r.stderr}`);
    log(`installed ${vsix} into ${extensions} in ${Date.now() - t0} ms`);
    return { dir, userData, extensions, workspace, config };
}

export async function startCodeServer({ entry, profile }) {
    const port = await freePort();
    const logFile = join(profile.dir, 'code-server.log');
    const child = spawn(process.execPath, [entry, '--config', profile.config, '--auth', 'none', '--bind-addr', `127.0.0.1:${port}`,
        '--disable-telemetry', '--disable-update-check', '--user-data-dir', profile.userData,
        '--extensions-dir', profile.extensions, profile.workspace], {
        stdio: ['ignore', 'pipe', 'pipe'],
        detached: true,
        env: { ...process.env, VSCODE_PROXY_URI: '' },
    });
    const chunks = [];
    child.stdout.on('data', (d) => chunks.push(d));
    child.stderr.on('data', (d) => chunks.push(d));
    const url = `http://127.0.0.1:${port}/`;
    try {
        await waitForHttp(url, 60_000);
    } catch (e) {
        killGroup(child);
        throw new Error(`${e.message}\n${Buffer.concat(chunks).toString('utf8').slice(-3000)}`);
    }
    return {
        url,
        child,
        output: () => Buffer.concat(chunks).toString('utf8'),
        close: () => {
            killGroup(child);
            try { writeFileSync(logFile, Buffer.concat(chunks)); } catch { /* best effort */ }
        },
    };
}

export function killGroup(child) {
    if (!child || child.exitCode !== null) return;
    try { process.kill(-child.pid, 'SIGTERM'); } catch { /* gone */ }
    setTimeout(() => { try { process.kill(-child.pid, 'SIGKILL'); } catch { /* gone */ } }, 3000).unref();
}

export async function launchBrowser() {
    const { chromium } = await import('playwright-core');
    return chromium.launch({
        executablePath: CHROMIUM,
        headless: true,
        timeout: 60_000,
        args: ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run',
            '--disable-dev-shm-usage'],
    });
}

export function removeProfile(profile) {
    if (profile && existsSync(profile.dir) && !process.env.DETENT_E2E_KEEP) rmSync(profile.dir, { recursive: true, force: true });
}
