// The codemap's invariants (DEVELOPERS.md), checked on the import statements of every source file.
import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

const root = join(__dirname, '..', '..');

function sources(dir: string): string[] {
    const out: string[] = [];
    for (const name of readdirSync(dir)) {
        const path = join(dir, name);
        if (statSync(path).isDirectory()) out.push(...sources(path));
        else if (/\.ts$/.test(name)) out.push(path);
    }
    return out;
}

/** Module specifiers of `import … from '…'`, `export … from '…'` and `import('…')`, with whether the import is type-only. */
function importsOf(file: string): { spec: string; typeOnly: boolean }[] {
    const text = readFileSync(file, 'utf8');
    const found: { spec: string; typeOnly: boolean }[] = [];
    const re = /(?:^|\n)\s*(import|export)\s+(type\s+)?[^'";]*?from\s+['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)|(?:^|\n)\s*import\s+['"]([^'"]+)['"]/g;
    for (let m = re.exec(text); m; m = re.exec(text)) {
        const spec = m[3] ?? m[4] ?? m[5]!;
        found.push({ spec, typeOnly: Boolean(m[2]) });
    }
    return found;
}

function violations(dir: string, forbidden: (spec: string, typeOnly: boolean) => boolean): string[] {
    const bad: string[] = [];
    for (const file of sources(join(root, dir))) {
        for (const { spec, typeOnly } of importsOf(file)) {
            if (forbidden(spec, typeOnly)) bad.push(`${relative(root, file)} imports '${spec}'`);
        }
    }
    return bad;
}

describe('architecture invariants (DEVELOPERS.md)', () => {
    it('core is pure: nothing from language, Langium, VS Code, the LSP libraries or any Node built-in', () => {
        expect(violations('packages/core/src', (s) =>
            s.startsWith('node:') || ['fs', 'path', 'os', 'child_process', 'crypto', 'http', 'https', 'net'].includes(s)
            || s.startsWith('langium') || s.startsWith('vscode') || s.startsWith('@detent/') || s.includes('/language/') || s.includes('/cli/'),
        )).toEqual([]);
    });
    it('the language package never imports the CLI, the server, the client or VS Code itself', () => {
        expect(violations('packages/language/src', (s) =>
            s === 'vscode' || s.startsWith('@detent/cli') || s.includes('/cli/') || s.includes('/client/') || s.includes('/server/'),
        )).toEqual([]);
    });
    it('the extension is thin: no Langium and no analysis; only protocol.ts and the generated-header rule are shared', () => {
        // The generated-header rule is core's, so the editor and `detent export` refuse to clobber the same files.
        const shared = ['packages/language/src/lsp/protocol.js', 'packages/core/src/export/common.js'];
        expect(violations('client/src', (s, typeOnly) =>
            s.startsWith('langium') || s.startsWith('@detent/')
            || (!typeOnly && s.includes('packages/') && !shared.some((allowed) => s.endsWith(allowed))),
        )).toEqual([]);
        // protocol.ts is what the client may share with the server because it imports nothing itself.
        expect(importsOf(join(root, 'packages/language/src/lsp/protocol.ts'))).toEqual([]);
    });
    it('the import scanner itself sees imports (guards the checks above against a broken pattern)', () => {
        const specs = importsOf(join(root, 'packages/core/src/check.ts')).map((i) => i.spec);
        expect(specs.length).toBeGreaterThan(0);
    });
});
