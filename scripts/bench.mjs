#!/usr/bin/env node
// `npm run bench`: runs every scripts/bench-*.ts in turn; each prints its own figures (ratios measured in one run).
import { readdirSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const only = process.argv.slice(2);
const benches = readdirSync(here).filter((f) => /^bench-.*\.ts$/.test(f)).filter((f) => only.length === 0 || only.some((o) => f.includes(o))).sort();
let failures = 0;
for (const bench of benches) {
    process.stdout.write(`\n### ${bench}\n`);
    const r = spawnSync(process.execPath, [join(here, 'run-ts.mjs'), join(here, bench)], { stdio: 'inherit' });
    if (r.status !== 0) failures++;
}
process.exitCode = failures === 0 ? 0 : 1;
