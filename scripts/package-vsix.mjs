#!/usr/bin/env node
// Builds the self-contained Detent .vsix: the client bundle, the language-server bundle (copied
// into the extension as server/server.mjs), the TextMate grammar, snippets and language
// configuration, packaged offline by @vscode/vsce with --no-dependencies (everything is bundled).
//
//   node scripts/package-vsix.mjs [--skip-build] [--out FILE]
//
// DETENT_SERVER_BUNDLE=FILE packages FILE as the server instead of server/dist/server.mjs (used by the
// E2E harness only while the real server is not built).
import { spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { inflateRawSync } from 'node:zlib';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');

class PackagingError extends Error {}

/** Throws, so the staging folder is still removed (`finally`) before the process exits 1. */
function fail(msg) {
    throw new PackagingError(msg);
}

function runNode(args, cwd, timeoutMs) {
    const r = spawnSync(process.execPath, args, { cwd, stdio: 'inherit', timeout: timeoutMs });
    return r.status === 0;
}

/** Entry names of a zip file, read from its central directory (no unzip tool needed). */
export function zipEntries(file) {
    const buf = readFileSync(file);
    let eocd = -1;
    for (let i = buf.length - 22; i >= Math.max(0, buf.length - 65_557); i--) {
        if (buf.readUInt32LE(i) === 0x06054b50) { eocd = i; break; }
    }
    if (eocd < 0) throw new Error(`${file} is not a zip file`);
    const count = buf.readUInt16LE(eocd + 10);
    let p = buf.readUInt32LE(eocd + 16);
    const entries = [];
    for (let n = 0; n < count; n++) {
        if (buf.readUInt32LE(p) !== 0x02014b50) throw new Error('bad central directory');
        const method = buf.readUInt16LE(p + 10);
        const compSize = buf.readUInt32LE(p + 20);
        const nameLen = buf.readUInt16LE(p + 28);
        const extraLen = buf.readUInt16LE(p + 30);
        const commentLen = buf.readUInt16LE(p + 32);
        const localOff = buf.readUInt32LE(p + 42);
        const name = buf.toString('utf8', p + 46, p + 46 + nameLen);
        entries.push({ name, method, compSize, localOff });
        p += 46 + nameLen + extraLen + commentLen;
    }
    const read = (entry) => {
        const lp = entry.localOff;
        const start = lp + 30 + buf.readUInt16LE(lp + 26) + buf.readUInt16LE(lp + 28);
        const data = buf.subarray(start, start + entry.compSize);
        return entry.method === 0 ? data : inflateRawSync(data);
    };
    return { names: entries.map((e) => e.name), read: (name) => { const e = entries.find((x) => x.name === name); return e ? read(e) : undefined; } };
}

function main() {
    const argv = process.argv.slice(2);
    const skipBuild = argv.includes('--skip-build');
    const outIdx = argv.indexOf('--out');
    const manifest = JSON.parse(readFileSync(join(root, 'client', 'package.json'), 'utf8'));
    const out = outIdx >= 0 ? resolve(argv[outIdx + 1]) : join(root, 'dist', `${manifest.name}-${manifest.version}.vsix`);
    const serverOverride = process.env.DETENT_SERVER_BUNDLE ? resolve(process.env.DETENT_SERVER_BUNDLE) : undefined;

    if (!skipBuild) {
        if (!runNode([join(root, 'scripts', 'build.mjs'), 'client'], root, 300_000)) fail('building the client bundle failed');
        if (!serverOverride && !runNode([join(root, 'scripts', 'build.mjs'), 'server'], root, 300_000)) fail('building the server bundle failed');
    }
    const clientBundle = join(root, 'client', 'dist', 'extension.cjs');
    const serverDist = join(root, 'server', 'dist');
    const serverBundle = serverOverride ?? join(serverDist, 'server.mjs');
    if (!existsSync(clientBundle)) fail(`missing ${clientBundle}`);
    if (!existsSync(serverBundle)) fail(`missing ${serverBundle} (build the language server first)`);

    const stage = mkdtempSync(join(tmpdir(), 'detent-vsix-'));
    try {
        for (const f of ['package.json', 'language-configuration.json', 'README.md', 'LICENSE', '.vscodeignore']) {
            cpSync(join(root, 'client', f), join(stage, f));
        }
        cpSync(join(root, 'client', 'snippets'), join(stage, 'snippets'), { recursive: true });
        cpSync(join(root, 'syntaxes'), join(stage, 'syntaxes'), { recursive: true });
        mkdirSync(join(stage, 'dist'));
        cpSync(clientBundle, join(stage, 'dist', 'extension.cjs'));
        mkdirSync(join(stage, 'server'));
        if (serverOverride) {
            cpSync(serverOverride, join(stage, 'server', 'server.mjs'));
        } else {
            // Everything the server bundle emitted except source maps (e.g. a .wasm beside it, if any).
            for (const f of readdirSync(serverDist)) {
                if (f.endsWith('.map')) continue;
                cpSync(join(serverDist, f), join(stage, 'server', f), { recursive: statSync(join(serverDist, f)).isDirectory() });
            }
        }
        // The staged manifest is a copy: `private` and the dev-only fields do not belong in a published package.
        const staged = { ...manifest };
        delete staged.private;
        writeFileSync(join(stage, 'package.json'), `${JSON.stringify(staged, null, 2)}\n`);

        mkdirSync(dirname(out), { recursive: true });
        rmSync(out, { force: true });
        const vsce = join(root, 'node_modules', '@vscode', 'vsce', 'vsce');
        const t0 = Date.now();
        const r = spawnSync(process.execPath, [vsce, 'package', '--no-dependencies', '--allow-missing-repository', '--no-update-package-json', '--out', out], {
            cwd: stage,
            stdio: ['ignore', 'inherit', 'inherit'],
            timeout: 180_000,
        });
        if (r.status !== 0) fail(`vsce package failed (status ${r.status}, signal ${r.signal})`);
        const { names } = zipEntries(out);
        const required = ['extension/package.json', 'extension/dist/extension.cjs', 'extension/server/server.mjs', 'extension/syntaxes/detent.tmLanguage.json',
            'extension/language-configuration.json', 'extension/snippets/detent.json', 'extension/README.md', 'extension/LICENSE.txt'];
        const lower = new Set(names.map((n) => n.toLowerCase()));
        const missing = required.filter((n) => !lower.has(n.toLowerCase()) && !(n.endsWith('LICENSE.txt') && lower.has('extension/license')));
        if (missing.length > 0) fail(`the .vsix lacks ${missing.join(', ')}`);
        const leaked = names.filter((n) => n.endsWith('.map') || n.endsWith('.ts'));
        if (leaked.length > 0) fail(`the .vsix contains files it should not: ${leaked.join(', ')}`);
        process.stderr.write(`[package-vsix] ${out} (${names.length} files, ${(statSync(out).size / 1024).toFixed(0)} KiB, vsce ${((Date.now() - t0) / 1000).toFixed(1)}s)\n`);
        process.stdout.write(`${out}\n`);
    } finally {
        rmSync(stage, { recursive: true, force: true });
    }
}

const isMain = process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
    try {
        main();
    } catch (e) {
        process.stderr.write(`[package-vsix] ${e instanceof PackagingError ? e.message : e instanceof Error ? e.stack : String(e)}\n`);
        process.exit(1);
    }
}
