// The diagram webview's security: the Content-Security-Policy the brief prescribes (VS Code's
// webview guide: default-src 'none', nonce-gated scripts/styles) and the SVG clean-up.
import { describe, expect, it } from 'vitest';
import { diagramCsp, diagramHtml, makeNonce, sanitizeSvg } from '../src/diagramHtml.js';

describe('diagram webview HTML', () => {
    const cspSource = 'https://file+.vscode-resource.vscode-cdn.net';
    const nonce = 'abc123XYZ';
    const html = diagramHtml(cspSource, nonce);

    it('carries exactly the prescribed policy', () => {
        expect(diagramCsp(cspSource, nonce)).toBe(
            `default-src 'none'; style-src ${cspSource} 'nonce-${nonce}'; script-src 'nonce-${nonce}'; img-src ${cspSource} data:`,
        );
        expect(html).toContain(`<meta http-equiv="Content-Security-Policy" content="${diagramCsp(cspSource, nonce)}">`);
    });
    it('gates every script and style element by the nonce and loads nothing remote', () => {
        const scripts = [...html.matchAll(/<script\b([^>]*)>/g)];
        const styles = [...html.matchAll(/<style\b([^>]*)>/g)];
        expect(scripts.length).toBeGreaterThan(0);
        for (const m of [...scripts, ...styles]) expect(m[1]).toContain(`nonce="${nonce}"`);
        const withoutCsp = html.replace(/<meta http-equiv="Content-Security-Policy"[^>]*>/, '');
        expect(withoutCsp).not.toMatch(/https?:\/\//);
        expect(html).not.toMatch(/\bsrc=/);
        expect(html).not.toMatch(/\beval\(|new Function/);
    });
    it('makes fresh, attribute-safe nonces', () => {
        const a = makeNonce();
        const b = makeNonce();
        expect(a).not.toBe(b);
        expect(a).toMatch(/^[A-Za-z0-9]{16,}$/);
    });
});

describe('sanitizeSvg', () => {
    it('removes scripts, event handlers, foreignObject and outside links but keeps the drawing', () => {
        const dirty = `<?xml version="1.0"?><!DOCTYPE svg><svg onload="alert(1)"><script>alert(2)</script>
<g class="node" onclick='x()'><title>Idle</title><a xlink:href="https://example.invalid/x"><ellipse rx="3"/></a>
<a href="#local"><text>ok</text></a></g><foreignObject><div>html</div></foreignObject></svg>`;
        const clean = sanitizeSvg(dirty);
        expect(clean).not.toMatch(/<script|onload|onclick|foreignObject|https:|<\?xml|DOCTYPE/i);
        expect(clean).toContain('<title>Idle</title>');
        expect(clean).toContain('<ellipse rx="3"/>');
        expect(clean).toContain('href="#local"');
        expect(clean.startsWith('<svg')).toBe(true);
    });
});
