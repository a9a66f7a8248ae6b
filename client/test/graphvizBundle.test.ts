// The diagram renders DOT to SVG in the extension host with @hpcc-js/wasm-graphviz. This checks that
// the WASM loads from an esbuild bundle made like the client's (CommonJS, platform node) in a folder
// with no node_modules, so the packaged .vsix needs no file beside the bundle. The SVG structure
// checked (one <g class="node"> with a <title> per node, <g class="edge"> per edge) is Graphviz's
// documented SVG output.
import { describe, expect, it } from 'vitest';
import { build } from 'esbuild';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const entry = fileURLToPath(new URL('../src/graphviz.ts', import.meta.url));

describe('Graphviz WASM from the bundle', () => {
    it('lays out a DOT graph to SVG from a standalone CommonJS bundle', async () => {
        const dir = mkdtempSync(join(tmpdir(), 'detent-gv-'));
        try {
            const bundle = join(dir, 'gv.cjs');
            await build({ entryPoints: [entry], outfile: bundle, bundle: true, platform: 'node', target: 'node20', format: 'cjs', mainFields: ['module', 'main'], logLevel: 'silent' });
            expect(readFileSync(bundle, 'utf8')).not.toMatch(/\.wasm['"]/); // inlined, not read from a file
            const runner = join(dir, 'run.cjs');
            writeFileSync(runner, `const g = require('./gv.cjs');
g.dotToSvg('digraph G { Idle -> Pumping; Pumping -> Fault; Fault -> Idle; }').then((svg) => process.stdout.write(svg));`);
            const svg = execFileSync(process.execPath, [runner], { cwd: dir, encoding: 'utf8', timeout: 30_000 });
            expect(svg).toMatch(/<svg\b/);
            const nodes = [...svg.matchAll(/<g id="node\d+" class="node">\s*<title>([^<]*)<\/title>/g)].map((m) => m[1]).sort();
            expect(nodes).toEqual(['Fault', 'Idle', 'Pumping']);
            expect([...svg.matchAll(/<g id="edge\d+" class="edge">/g)].length).toBe(3);
        } finally {
            rmSync(dir, { recursive: true, force: true });
        }
    });
});
