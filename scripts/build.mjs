#!/usr/bin/env node
// Bundles every runnable artifact with esbuild. Sources are TypeScript; packages export their
// src/ directly and only these bundles ever run under plain Node or VS Code.
import { build } from 'esbuild';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { dirname, join } from 'node:path';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const watch = process.argv.includes('--watch');
void watch;

const esmBanner = {
    js: "import { createRequire as __detentCreateRequire } from 'node:module'; const require = __detentCreateRequire(import.meta.url);",
};

// One copy of the LSP protocol stack in the server bundles. vscode-languageserver ships its own
// nested vscode-languageserver-protocol/vscode-jsonrpc while Langium imports the root copies; with
// two copies a ResponseError (e.g. a refused rename, a cancelled request) fails the connection's
// instanceof test and is sent as a *result*. Resolve every import to the copy the connection uses.
const lspHome = join(root, 'node_modules', 'vscode-languageserver');
const singleLspStack = {
    name: 'single-lsp-stack',
    setup(b) {
        if (!existsSync(join(lspHome, 'node_modules'))) return;
        b.onResolve({ filter: /^vscode-(languageserver-protocol|jsonrpc|languageserver-types)(\/.*)?$/ }, async (args) => {
            if (args.pluginData === 'single-lsp-stack' || args.resolveDir.startsWith(lspHome)) return undefined;
            const r = await b.resolve(args.path, { resolveDir: lspHome, kind: args.kind, pluginData: 'single-lsp-stack' });
            return r.errors.length > 0 ? undefined : { path: r.path, external: r.external };
        });
    },
};

const targets = [
    { entry: 'packages/cli/src/entry.ts', outfile: 'packages/cli/dist/detent.mjs', format: 'esm', banner: esmBanner, plugins: [singleLspStack] },
    { entry: 'server/src/main.ts', outfile: 'server/dist/server.mjs', format: 'esm', banner: esmBanner, plugins: [singleLspStack] },
    { entry: 'client/src/extension.ts', outfile: 'client/dist/extension.cjs', format: 'cjs', external: ['vscode'] },
];

// Optional target filter, e.g. `node scripts/build.mjs client` (matches the entry path's first folder).
const only = process.argv.slice(2).filter((a) => !a.startsWith('--'));

for (const t of targets) {
    const entry = join(root, t.entry);
    if (!existsSync(entry)) continue;
    if (only.length > 0 && !only.some((o) => t.entry.startsWith(`${o}/`) || t.entry.startsWith(`packages/${o}/`))) continue;
    await build({
        entryPoints: [entry],
        outfile: join(root, t.outfile),
        bundle: true,
        platform: 'node',
        target: 'node20',
        format: t.format,
        banner: t.banner,
        external: t.external ?? [],
        plugins: t.plugins ?? [],
        sourcemap: true,
        logLevel: 'warning',
        mainFields: ['module', 'main'],
    });
}
