/**
 * Security properties checked on the sources themselves (common practice for extension and tool
 * hardening; the CSP directives follow the W3C Content Security Policy Level 3 recommendation).
 */
import { describe, expect, test } from 'vitest';
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { diagramCsp, diagramHtml } from '../../client/src/diagramHtml.js';

const root = join(__dirname, '..', '..');

function sources(dir: string): string[] {
    const out: string[] = [];
    const walk = (d: string) => {
        for (const name of readdirSync(d)) {
            if (name === 'node_modules' || name === 'dist' || name === 'generated') continue;
            const p = join(d, name);
            if (statSync(p).isDirectory()) walk(p);
            else if (/\.(ts|mts|cts|js|mjs|cjs)$/.test(name)) out.push(p);
        }
    };
    walk(join(root, dir));
    return out;
}

/** The text without comments, so a comment that names a forbidden call does not count. */
function code(file: string): string {
    return readFileSync(file, 'utf8').replace(/\/\*[\s\S]*?\*\//g, '').replace(/(^|[^:'"`])\/\/.*$/gm, '$1');
}

const PRODUCT = ['packages/core/src', 'packages/language/src', 'packages/cli/src', 'server/src', 'client/src'];

describe('no dynamic code', () => {
    test('no eval or new Function in any source file', () => {
        const files = [...PRODUCT, 'scripts'].flatMap(sources);
        expect(files.length).toBeGreaterThan(50);
        const hits = files.filter((f) => /\beval\s*\(|\bnew\s+Function\s*\(|\bFunction\s*\(\s*['"`]/.test(code(f))).map((f) => relative(root, f));
        expect(hits).toEqual([]);
    });
});

describe('no network in the toolchain', () => {
    test('core, language, cli and server import no network module and call no fetch', () => {
        const files = ['packages/core/src', 'packages/language/src', 'packages/cli/src', 'server/src'].flatMap(sources);
        const network = /from\s+['"](node:)?(http|https|http2|net|tls|dgram|dns|undici)['"]|require\(\s*['"](node:)?(http|https|http2|net|tls|dgram|dns)['"]\s*\)|\bfetch\s*\(|\bWebSocket\b|\bXMLHttpRequest\b/;
        const hits = files.filter((f) => network.test(code(f))).map((f) => relative(root, f));
        expect(hits).toEqual([]);
    });
});

describe('Restricted Mode runs no external program', () => {
    test('the extension and the server never start a process', () => {
        // VS Code's Restricted Mode contract: an extension in an untrusted workspace must not run
        // code from the workspace. Ours starts no program at all (the server is started by
        // vscode-languageclient as a Node module, the diagram uses Graphviz compiled to wasm).
        const files = [...sources('client/src'), ...sources('packages/language/src'), ...sources('server/src')];
        const spawning = /from\s+['"](node:)?child_process['"]|require\(\s*['"](node:)?child_process['"]\s*\)|\b(execSync|spawnSync|execFile|execFileSync)\s*\(/;
        expect(files.filter((f) => spawning.test(code(f))).map((f) => relative(root, f))).toEqual([]);
    });

    test('export checks workspace trust before writing', () => {
        const text = code(join(root, 'client/src/exportCommand.ts'));
        expect(text).toMatch(/workspace\.isTrusted/);
        const manifest = JSON.parse(readFileSync(join(root, 'client/package.json'), 'utf8')) as { capabilities?: { untrustedWorkspaces?: { supported?: unknown; restrictedConfigurations?: string[] } } };
        expect(manifest.capabilities?.untrustedWorkspaces?.supported).toBe('limited');
        expect(manifest.capabilities?.untrustedWorkspaces?.restrictedConfigurations ?? []).toContain('detent.exportFolder');
    });
});

describe('diagram webview', () => {
    const nonce = 'AbC123nonceXYZ';
    const cspSource = 'https://file+.vscode-resource.vscode-cdn.net';
    const directives = new Map(diagramCsp(cspSource, nonce).split(';').map((d) => d.trim().split(/\s+/)).map(([k, ...v]) => [k!, v]));

    test('strict CSP: nothing by default, scripts only with the nonce', () => {
        expect(directives.get('default-src')).toEqual(["'none'"]);
        expect(directives.get('script-src')).toEqual([`'nonce-${nonce}'`]);
        for (const values of directives.values()) {
            expect(values).not.toContain("'unsafe-inline'");
            expect(values).not.toContain("'unsafe-eval'");
            expect(values).not.toContain('*');
            expect(values.filter((v) => /^https?:/.test(v) && v !== cspSource)).toEqual([]);
        }
        expect(directives.has('connect-src')).toBe(false); // falls back to default-src 'none'
    });

    test('the HTML carries that CSP, every script and style has the nonce, and no remote URL', () => {
        const html = diagramHtml(cspSource, nonce);
        expect(html).toContain('http-equiv="Content-Security-Policy"');
        const scripts = html.match(/<script\b[^>]*>/g) ?? [];
        expect(scripts.length).toBeGreaterThan(0);
        for (const s of scripts) expect(s).toContain(`nonce="${nonce}"`);
        for (const s of html.match(/<style\b[^>]*>/g) ?? []) expect(s).toContain(`nonce="${nonce}"`);
        const urls = (html.match(/\b(?:https?|wss?):\/\/[^\s"'<>)]+/g) ?? []).filter((u) => !u.startsWith(cspSource) && u !== 'http://www.w3.org/2000/svg');
        expect(urls).toEqual([]);
        expect(html).not.toMatch(/<script\b[^>]*\bsrc=/);
        expect(html).not.toMatch(/<link\b[^>]*\bhref=["']https?:/);
    });
});
