#!/usr/bin/env node
// Thin launcher: the CLI is bundled by scripts/build.mjs into dist/detent.mjs.
import { existsSync } from 'node:fs';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { dirname, join } from 'node:path';

const bundle = join(dirname(fileURLToPath(import.meta.url)), '..', 'dist', 'detent.mjs');
if (!existsSync(bundle)) {
    process.stderr.write('detent: the CLI is not built; run `npm run build` at the repository root\n');
    process.exit(2);
}
await import(pathToFileURL(bundle).href);
