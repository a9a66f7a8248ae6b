#!/usr/bin/env node
// Installs a real VS Code host (code-server from npm) into a cache folder outside the repository,
// offline apart from the npm registry: every install runs with --ignore-scripts and the native
// modules are rebuilt from source against this machine's Node headers, because the packages'
// own install steps would download prebuilt binaries (which cannot be fetched here).
//
//   node scripts/vscode-host.mjs install   install (idempotent; reused when the marker exists)
//   node scripts/vscode-host.mjs path      print the entry.js path if installed, exit 1 if not
//
// Cache: $DETENT_CACHE (default ~/.cache/detent)/code-server-<version>.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, writeFileSync, readFileSync, symlinkSync, rmSync, realpathSync, lstatSync } from 'node:fs';
import { homedir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export const CODE_SERVER_VERSION = '4.100.3';
const MARKER = '.detent-installed';

export function cacheRoot() {
    return process.env.DETENT_CACHE ? resolve(process.env.DETENT_CACHE) : join(homedir(), '.cache', 'detent');
}

export function hostDir() {
    return join(cacheRoot(), `code-server-${CODE_SERVER_VERSION}`);
}

export function codeServerDir() {
    return join(hostDir(), 'node_modules', 'code-server');
}

export function entryPath() {
    return join(codeServerDir(), 'out', 'node', 'entry.js');
}

/** The installed host, or undefined when the cache has no complete install. */
export function installedHost() {
    const marker = join(hostDir(), MARKER);
    if (!existsSync(marker) || !existsSync(entryPath())) return undefined;
    return { entry: entryPath(), dir: hostDir(), info: JSON.parse(readFileSync(marker, 'utf8')) };
}

function log(msg) {
    process.stderr.write(`[vscode-host] ${msg}\n`);
}

/** Runs a command synchronously with a time bound; throws with the tail of its output on failure. */
function run(cmd, args, cwd, timeoutMs = 15 * 60_000, env = {}) {
    const started = Date.now();
    log(`$ (cd ${cwd} && ${cmd} ${args.join(' ')})`);
    const r = spawnSync(cmd, args, {
        cwd,
        encoding: 'utf8',
        timeout: timeoutMs,
        maxBuffer: 256 * 1024 * 1024,
        env: { ...process.env, npm_config_fund: 'false', npm_config_audit: 'false', npm_config_update_notifier: 'false', ...env },
    });
    const secs = ((Date.now() - started) / 1000).toFixed(1);
    if (r.status !== 0) {
        const tail = `${r.stdout ?? ''}\n${r.stderr ?? ''}`.split('\n').slice(-40).join('\n');
        throw new Error(`${cmd} ${args.join(' ')} failed in ${cwd} (status ${r.status}, signal ${r.signal}, ${secs}s)\n${tail}`);
    }
    log(`  ok in ${secs}s`);
    return r;
}

/** npm's bundled node-gyp, so no extra package is needed. */
function nodeGypScript() {
    const npmBin = spawnSync('sh', ['-c', 'command -v npm'], { encoding: 'utf8' }).stdout.trim();
    const candidates = [];
    if (npmBin) {
        const npmRoot = join(dirname(realpathSync(npmBin)), '..');
        candidates.push(join(npmRoot, 'node_modules', 'node-gyp', 'bin', 'node-gyp.js'));
    }
    candidates.push('/usr/lib/node_modules/npm/node_modules/node-gyp/bin/node-gyp.js');
    candidates.push('/usr/local/lib/node_modules/npm/node_modules/node-gyp/bin/node-gyp.js');
    const found = candidates.find((c) => existsSync(c));
    if (!found) throw new Error(`node-gyp not found (looked in ${candidates.join(', ')})`);
    return found;
}

/** The folder holding include/node/node.h for the running Node, so node-gyp never downloads headers. */
function nodeDir() {
    const dir = resolve(dirname(process.execPath), '..');
    if (!existsSync(join(dir, 'include', 'node', 'node.h'))) {
        throw new Error(`Node headers not found under ${dir}/include/node (node-gyp would try to download them)`);
    }
    return dir;
}

export function install() {
    const have = installedHost();
    if (have) {
        log(`code-server ${CODE_SERVER_VERSION} already installed in ${have.dir} (took ${have.info.seconds}s when installed)`);
        return have;
    }
    const t0 = Date.now();
    const dir = hostDir();
    mkdirSync(dir, { recursive: true });
    if (!existsSync(join(dir, 'package.json'))) {
        writeFileSync(join(dir, 'package.json'), JSON.stringify({ name: 'detent-vscode-host', private: true }, null, 2));
    }
    const timings = {};
    const step = (name, fn) => {
        const s = Date.now();
        fn();
        timings[name] = Math.round((Date.now() - s) / 100) / 10;
    };
    const gyp = nodeGypScript();
    const nodedir = nodeDir();
    const gypEnv = { npm_config_nodedir: nodedir, JOBS: '2' };

    step('npm install code-server', () =>
        run('npm', ['install', `code-server@${CODE_SERVER_VERSION}`, '--ignore-scripts', '--no-save'], dir));
    const cs = codeServerDir();
    const vs = join(cs, 'lib', 'vscode');
    step('npm install lib/vscode', () => run('npm', ['install', '--omit=dev', '--ignore-scripts'], vs));
    const natives = ['@parcel/watcher', '@vscode/spdlog', 'kerberos', 'native-watchdog', 'node-pty', '@vscode/deviceid'];
    for (const mod of natives) {
        const modDir = join(vs, 'node_modules', mod);
        if (!existsSync(modDir)) {
            log(`  (skip ${mod}: not present)`);
            continue;
        }
        step(`node-gyp ${mod}`, () => run(process.execPath, [gyp, 'rebuild', `--nodedir=${nodedir}`, '-j', '2'], modDir, 15 * 60_000, gypEnv));
    }
    const argon2 = join(hostDir(), 'node_modules', 'argon2');
    if (existsSync(argon2)) {
        const preGyp = [join(hostDir(), 'node_modules', '@mapbox', 'node-pre-gyp', 'bin', 'node-pre-gyp'),
            join(argon2, 'node_modules', '@mapbox', 'node-pre-gyp', 'bin', 'node-pre-gyp')].find((p) => existsSync(p));
        step('argon2', () => {
            if (preGyp) run(process.execPath, [preGyp, 'rebuild', '--build-from-source', `--nodedir=${nodedir}`], argon2, 15 * 60_000, gypEnv);
            else run(process.execPath, [gyp, 'rebuild', `--nodedir=${nodedir}`, '-j', '2'], argon2, 15 * 60_000, gypEnv);
        });
    }
    // ripgrep: the npm package would download its binary; use Debian's instead.
    step('ripgrep', () => {
        const rg = spawnSync('sh', ['-c', 'command -v rg'], { encoding: 'utf8' }).stdout.trim();
        if (!rg) throw new Error('ripgrep (rg) is not installed: apt-get install -y ripgrep');
        const binDir = join(vs, 'node_modules', '@vscode', 'ripgrep', 'bin');
        mkdirSync(binDir, { recursive: true });
        rmSync(join(binDir, 'rg'), { force: true });
        symlinkSync(rg, join(binDir, 'rg'));
    });
    step('node_modules.asar', () => {
        const asar = join(vs, 'node_modules.asar');
        let exists = false;
        try { lstatSync(asar); exists = true; } catch { /* absent */ }
        if (!exists) symlinkSync('node_modules', asar);
    });
    step('npm install lib/vscode/extensions', () => run('npm', ['install', '--omit=dev', '--ignore-scripts'], join(vs, 'extensions')));
    const seconds = Math.round((Date.now() - t0) / 1000);
    const info = { version: CODE_SERVER_VERSION, seconds, timings, node: process.version, date: new Date().toISOString() };
    writeFileSync(join(dir, MARKER), JSON.stringify(info, null, 2));
    log(`installed code-server ${CODE_SERVER_VERSION} in ${seconds}s: ${JSON.stringify(timings)}`);
    return { entry: entryPath(), dir, info };
}

const isMain = process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
    const cmd = process.argv[2] ?? 'install';
    if (cmd === 'install') {
        try {
            const h = install();
            process.stdout.write(`${h.entry}\n`);
        } catch (e) {
            log(String(e instanceof Error ? e.message : e));
            process.exit(1);
        }
    } else if (cmd === 'path') {
        const h = installedHost();
        if (!h) process.exit(1);
        process.stdout.write(`${h.entry}\n`);
    } else {
        log(`unknown command ${cmd} (install | path)`);
        process.exit(2);
    }
}
