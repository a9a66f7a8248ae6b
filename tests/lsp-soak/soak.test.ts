/**
 * LSP soak: the bundled server (server/dist/server.mjs --stdio) takes 2,000 seeded random edits
 * (insertions, deletions, replacements) to one document and stays up, keeps answering, ends with
 * a correct hover, and its memory does not grow without bound.
 * Oracle for the hover: the state's code from LANGUAGE.md "State assignment" (gray: i XOR (i >> 1),
 * width ⌈log2 n⌉), computed here.
 * Memory: the server's RSS (VmRSS of /proc/PID/status, Linux proc(5)) every 200 edits.
 */
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { existsSync, readFileSync } from 'node:fs';
import { DidChangeTextDocumentNotification, type Hover } from 'vscode-languageserver-protocol/node';
import { LspSession } from '../lsp/harness.js';
import { mulberry32 } from '../../packages/core/test/support/random-machine.js';

const EDITS = 2000;
const SAMPLE_EVERY = 200;

const rng = mulberry32;

const STATES = ['Standby', 'Priming', 'Running', 'Flushing', 'Draining', 'Stopped'];
const BASE = [
    '/** Wash-down pump for a food line. */',
    'machine WashPump {',
    '    clock clk;',
    '    reset rst -> Standby;',
    '    input start, stop, primed, [3] level;',
    '    output motor, valve;',
    '    encoding gray;',
    ...STATES.map((s, i) => `    state ${s} {${i % 2 ? ' emit motor;' : ''}\n        when start & !stop & level > ${i} -> ${STATES[(i + 1) % STATES.length]};\n        when stop -> Stopped emit valve;\n        otherwise stay;\n    }`),
    '}',
    '',
].join('\n').replace('input start, stop, primed, [3] level;', 'input start, stop;\n    input [3] level;');

const TOKENS = ['state', 'when', '->', 'emit', ';', '{', '}', '(', ')', '&', '|', '!', 'otherwise stay;', 'level', '==', '3', 'start', 'X', '\n', ' ', '/*', '*/', '//', 'machine', 'Q', '0b101'];

function offsetToPosition(text: string, offset: number) {
    let line = 0;
    let start = 0;
    for (let i = 0; i < offset; i++) if (text.charCodeAt(i) === 10) { line++; start = i + 1; }
    return { line, character: offset - start };
}

function rss(pid: number): number {
    const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) * 1024 : NaN;
}

let session: LspSession;
beforeAll(async () => { session = await LspSession.start(); }, 180_000);
afterAll(async () => { await session?.stop(); });

describe('LSP soak', () => {
    test(`${EDITS} random edits: the server stays up, answers a correct hover, memory is bounded`, async () => {
        const uri = 'file:///soak/wash-pump.detent';
        const pid = session.process.pid!;
        const canSample = existsSync(`/proc/${pid}/status`);
        await session.open(uri, BASE);
        const random = rng(0x50a4);
        let text = BASE;
        let version = 1;
        const samples: number[] = [];
        const t0 = Date.now();
        for (let k = 1; k <= EDITS; k++) {
            const r = random();
            const at = Math.floor(random() * (text.length + 1));
            const len = Math.min(text.length - at, 1 + Math.floor(random() * 12));
            const insert = Array.from({ length: 1 + Math.floor(random() * 3) }, () => TOKENS[Math.floor(random() * TOKENS.length)]!).join(' ');
            // keep the document near its original size: delete more when it has grown
            const grow = text.length < BASE.length * 1.5;
            let from = at;
            let to = at;
            let newText = '';
            if (r < 0.4 && grow) newText = insert;
            else if (r < 0.7) to = at + len;
            else { to = at + len; newText = insert; }
            const range = { start: offsetToPosition(text, from), end: offsetToPosition(text, to) };
            text = text.slice(0, from) + newText + text.slice(to);
            version++;
            void session.connection.sendNotification(DidChangeTextDocumentNotification.type, { textDocument: { uri, version }, contentChanges: [{ range, text: newText }] });
            if (k % 25 === 0) {
                // pace the client and prove the server still answers requests mid-storm
                const pos = offsetToPosition(text, Math.floor(random() * text.length));
                await session.request<Hover | null>('textDocument/hover', { textDocument: { uri }, position: pos });
            }
            if (k % SAMPLE_EVERY === 0) {
                // let a full build (parse, analyses, as-built) of the current text run and publish
                const before = session.publications(uri);
                const deadline = Date.now() + 30_000;
                while (session.publications(uri) === before && Date.now() < deadline) await new Promise((r) => setTimeout(r, 20));
                expect(session.publications(uri), `a build after edit ${k}`).toBeGreaterThan(before);
                if (canSample) samples.push(rss(pid));
            }
        }
        const editSeconds = (Date.now() - t0) / 1000;
        expect(session.process.exitCode).toBeNull();
        // Back to the known machine (one full-text change), then hover on every state.
        version++;
        const settled = session.waitFor(uri, (ds) => ds.every((d) => d.severity !== 1), 60_000);
        void session.connection.sendNotification(DidChangeTextDocumentNotification.type, { textDocument: { uri, version }, contentChanges: [{ text: BASE }] });
        await settled;
        const width = Math.ceil(Math.log2(STATES.length));
        for (const [i, name] of STATES.entries()) {
            const code = (i ^ (i >> 1)).toString(2).padStart(width, '0');
            const position = offsetToPosition(BASE, BASE.indexOf(`state ${name} `) + 'state '.length);
            const hover = await session.request<Hover>('textDocument/hover', { textDocument: { uri }, position });
            const value = typeof hover.contents === 'string' ? hover.contents : (hover.contents as { value: string }).value;
            expect(value, `hover of ${name}`).toContain(`\`${code}\``);
        }
        const mb = (b: number) => (b / 1048576).toFixed(1);
        process.stdout.write(`lsp soak: ${EDITS} edits in ${editSeconds.toFixed(1)} s; server RSS every ${SAMPLE_EVERY} edits (MB): ${samples.map(mb).join(', ')}\n`);
        if (canSample) {
            expect(samples.length).toBe(EDITS / SAMPLE_EVERY);
            const third = Math.floor(samples.length / 3);
            const middle = Math.max(...samples.slice(third, 2 * third));
            const last = Math.max(...samples.slice(2 * third));
            expect(last, `last third max ${mb(last)} MB vs middle third max ${mb(middle)} MB`).toBeLessThanOrEqual(1.5 * middle + 30 * 1048576);
        }
    }, 180_000);

    test('hostile documents: the server answers, every diagnostic range lies inside the document', async () => {
        const docs: [string, string][] = [
            ['parens', `machine P {\n    input a;\n    state S0 { when ${'('.repeat(10_000)}a${')'.repeat(10_000)} -> S0; otherwise stay; }\n}\n`],
            ['nots', `machine P {\n    input a;\n    state S0 { when ${'!'.repeat(10_000)}a -> S0; }\n}\n`],
            ['huge', `machine H {\n${'    // generated filler\n'.repeat(110_000)}}\n`],
            ['xor', `machine X {\n    input ${Array.from({ length: 40 }, (_, i) => `a${i}`).join(', ')};\n    state S0 { when ${Array.from({ length: 40 }, (_, i) => `a${i}`).join(' ^ ')} -> S0; otherwise stay; }\n}\n`],
            ['nul-surrogate-crlf', 'machine N\0 {\r\n    input a;\r\n    state S0 { when a -> S0; } // \uD800\r\n}\r\n\uDFFF'],
        ];
        for (const [name, text] of docs) {
            const uri = `file:///soak/${name}.detent`;
            const t0 = Date.now();
            const ds = await session.open(uri, text);
            const lines = text.split(/\r\n|\r|\n/);
            for (const d of ds) {
                for (const p of [d.range.start, d.range.end]) {
                    expect(p.line, `${name}: ${d.message}`).toBeLessThan(lines.length);
                    expect(p.character, `${name}: ${d.message}`).toBeLessThanOrEqual(lines[p.line]!.length);
                }
            }
            expect(ds.some((d) => d.severity === 1), `${name} has an error`).toBe(true);
            await session.request('textDocument/hover', { textDocument: { uri }, position: { line: 0, character: 9 } });
            process.stdout.write(`lsp soak: ${name} (${text.length} chars) diagnosed in ${Date.now() - t0} ms: ${ds.length} diagnostics\n`);
        }
        expect(session.process.exitCode).toBeNull();
    }, 180_000);
});
