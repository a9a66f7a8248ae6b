// The state-diagram webview's HTML and the SVG clean-up, kept free of the `vscode` module so unit
// tests can check the Content-Security-Policy and the sanitizer directly.
import { randomBytes } from 'node:crypto';

export function makeNonce(): string {
    return randomBytes(18).toString('base64').replace(/[^A-Za-z0-9]/g, '');
}

/** The policy of the diagram webview: nothing remote, scripts and styles only with the nonce. */
export function diagramCsp(cspSource: string, nonce: string): string {
    return [
        "default-src 'none'",
        `style-src ${cspSource} 'nonce-${nonce}'`,
        `script-src 'nonce-${nonce}'`,
        `img-src ${cspSource} data:`,
    ].join('; ');
}

/**
 * Graphviz's SVG is made from DOT the server wrote from the user's file; state names are identifiers,
 * but labels may carry doc text. Drop everything that could run or load: scripts, foreignObject,
 * event-handler attributes, and links that leave the document.
 */
export function sanitizeSvg(svg: string): string {
    let s = svg.replace(/<\?xml[^>]*\?>/g, '').replace(/<!DOCTYPE[^>]*>/gi, '');
    s = s.replace(/<script\b[\s\S]*?<\/script\s*>/gi, '').replace(/<script\b[^>]*\/>/gi, '');
    s = s.replace(/<foreignObject\b[\s\S]*?<\/foreignObject\s*>/gi, '');
    s = s.replace(/\son[a-z]+\s*=\s*("[^"]*"|'[^']*')/gi, '');
    s = s.replace(/\s(xlink:)?href\s*=\s*("(?!#)[^"]*"|'(?!#)[^']*')/gi, '');
    // Graphviz wraps linked nodes in <a>; without href they are inert, keep the children.
    return s.trim();
}

const STYLE = `
body { margin: 0; padding: 8px 12px; color: var(--vscode-editor-foreground); background: var(--vscode-editor-background);
       font-family: var(--vscode-font-family); font-size: var(--vscode-font-size); }
h2 { font-size: 1.05em; font-weight: 600; margin: 10px 0 4px; }
.note { opacity: .75; font-style: italic; margin: 4px 0; }
.machine svg { max-width: 100%; height: auto; }
.machine svg .graph > polygon { fill: transparent; stroke: none; }
.machine svg .node polygon, .machine svg .node ellipse, .machine svg .node path { fill: var(--vscode-editor-background); stroke: var(--vscode-editor-foreground); }
.machine svg text { fill: var(--vscode-editor-foreground); }
.machine svg .edge path { stroke: var(--vscode-editor-foreground); fill: none; }
.machine svg .edge polygon { fill: var(--vscode-editor-foreground); stroke: var(--vscode-editor-foreground); }
.machine svg .node { cursor: pointer; }
.machine svg .node.marker { cursor: default; }
.machine svg .node.current polygon, .machine svg .node.current ellipse, .machine svg .node.current path {
    fill: var(--vscode-editor-selectionBackground, #264f78); stroke: var(--vscode-focusBorder, #007fd4); stroke-width: 2px; }
.caution { opacity: .6; font-size: .85em; margin-top: 12px; }
`;

const SCRIPT = `
(function () {
    const vscode = acquireVsCodeApi();
    const ZOOM = 1.4;
    const root = document.getElementById('detent-diagram');
    const note = document.getElementById('detent-note');
    let current = { machine: undefined, state: undefined };
    function nodeName(g) { const t = g.querySelector('title'); return t ? t.textContent : ''; }
    function applyHighlight() {
        for (const g of root.querySelectorAll('g.node')) {
            const m = g.closest('[data-machine]');
            const on = !!m && m.getAttribute('data-machine') === current.machine && nodeName(g) === current.state;
            g.classList.toggle('current', on);
        }
    }
    function render(msg) {
        root.textContent = '';
        note.textContent = msg.note || '';
        const parser = new DOMParser();
        for (const m of msg.machines) {
            const box = document.createElement('section');
            box.className = 'machine';
            box.setAttribute('data-machine', m.name);
            const h = document.createElement('h2');
            h.textContent = m.name;
            box.appendChild(h);
            if (m.svg) {
                const doc = parser.parseFromString(m.svg, 'image/svg+xml');
                const svg = doc.documentElement;
                if (svg && svg.nodeName.toLowerCase() === 'svg') {
                    const node = document.importNode(svg, true);
                    // Graphviz sizes in points; draw small machines a little larger, never wider than the panel.
                    const pt = parseFloat(node.getAttribute('width') || '0');
                    if (pt > 0) { node.style.width = Math.round(pt * 1.333 * ZOOM) + 'px'; node.style.height = 'auto'; }
                    box.appendChild(node);
                }
            } else if (m.error) {
                const p = document.createElement('p'); p.className = 'note'; p.textContent = m.error; box.appendChild(p);
            }
            const states = new Set(m.states || []);
            for (const g of box.querySelectorAll('g.node')) {
                // Only real states are clickable; the drawing may add markers such as the reset arrow's source.
                if (!states.has(nodeName(g))) { g.classList.add('marker'); continue; }
                g.setAttribute('data-state', nodeName(g));
                g.addEventListener('click', () => vscode.postMessage({ type: 'reveal', machine: m.name, state: nodeName(g) }));
            }
            root.appendChild(box);
        }
        applyHighlight();
    }
    window.addEventListener('message', (e) => {
        const msg = e.data;
        if (!msg || typeof msg !== 'object') return;
        if (msg.type === 'render') render(msg);
        else if (msg.type === 'highlight') { current = { machine: msg.machine, state: msg.state }; applyHighlight(); }
    });
    vscode.postMessage({ type: 'ready' });
})();
`;

export function diagramHtml(cspSource: string, nonce: string): string {
    return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="UTF-8">
<meta http-equiv="Content-Security-Policy" content="${diagramCsp(cspSource, nonce)}">
<meta name="viewport" content="width=device-width, initial-scale=1.0">
<title>Detent state diagram</title>
<style nonce="${nonce}">${STYLE}</style>
</head>
<body>
<p id="detent-note" class="note"></p>
<div id="detent-diagram"><p class="note">Waiting for the language server…</p></div>
<p class="caution">Detent checks logic, not safety certification; defer to the applicable codes and licensed practice.</p>
<script nonce="${nonce}">${SCRIPT}</script>
</body>
</html>`;
}
