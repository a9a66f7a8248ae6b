#!/usr/bin/env node
// Runs a TypeScript script (benchmarks, fuzzing): bundles it with esbuild into a temporary ESM file, then imports it.
import { build } from 'esbuild';
import { scriptBundleOptions } from './script-bundle.mjs';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { join, resolve, dirname } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const [file, ...rest] = process.argv.slice(2);
if (!file) {
    process.stderr.write('usage: node scripts/run-ts.mjs FILE.ts [args…]\n');
    process.exit(2);
}
const root = join(dirname(fileURLToPath(import.meta.url)), '..');
// Inside node_modules so that bare imports of external packages resolve from the bundle.
const cache = join(root, 'node_modules', '.cache');
mkdirSync(cache, { recursive: true });
const dir = mkdtempSync(join(cache, 'detent-run-'));
const outfile = join(dir, 'script.mjs');
await build({
    entryPoints: [resolve(file)],
    outfile,
    ...scriptBundleOptions(root),
    sourcemap: 'inline',
});
process.argv = [process.argv[0], resolve(file), ...rest];
try {
    await import(pathToFileURL(outfile).href);
} finally {
    process.on('exit', () => rmSync(dir, { recursive: true, force: true }));
}
