// Protocol tests: the real bundled server (scripts/build.mjs → server/dist/server.mjs --stdio),
// spoken to over LSP exactly as an editor would. Expected ranges and positions are computed here
// from the document text (by locating the names), never taken from the server's own code.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { existsSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { CodeAction, CodeLens, CompletionItem, CompletionList, Diagnostic, DocumentSymbol, Hover, TextEdit, WorkspaceEdit } from 'vscode-languageserver-protocol';
import { LspSession, ROOT, applyEdits, positionOf, wordRange } from './harness.js';

let session: LspSession;
let counter = 0;
const freshUri = (name: string) => `file:///tmp/detent-lsp-test/${name}-${++counter}.detent`;

beforeAll(async () => { session = await LspSession.start(); }, 120_000);
afterAll(async () => { await session?.stop(); });

const BARRIER = `/** Barrier at a car park exit. */
machine BarrierGate {
    clock clk;
    reset rst -> Closed;
    input car, open_cmd, spare;
    output motor_up;

    state Closed {
        when car -> Opening;
    }
    /** Motor runs the barrier up. */
    state Opening {
        emit motor_up;
        when open_cmd -> Open;
        when car -> Closed;
        otherwise stay;
    }
    state Open {
        otherwise -> Closed;
    }
}
`;

const PRESS = `machine PressGuard {
    reset rst -> Idle;
    input hands, done;
    output press;
    state Idle {
        when hands & !done -> StrokeA;
        when hands & done -> StrokeB;
        otherwise stay;
    }
    state StrokeA {
        emit press;
        when done -> Idle;
        otherwise stay;
    }
    state StrokeB {
        emit press;
        when done -> Idle;
        otherwise stay;
    }
    scenario both_hands {
        reset;
        step hands, done;
        expect StrokeB with press;
    }
}
`;

const codes = (ds: readonly Diagnostic[]) => ds.map((d) => String(d.code)).sort();
const errors = (ds: readonly Diagnostic[]) => ds.filter((d) => d.severity === 1);

function applyWorkspaceEdit(text: string, uri: string, edit: WorkspaceEdit | undefined): string {
    const edits: TextEdit[] = edit?.changes?.[uri] ?? [];
    return applyEdits(text, edits);
}

describe('diagnostics', () => {
    it('reports codes with exact ranges and witnesses (defects written here)', async () => {
        const uri = freshUri('barrier');
        const ds = await session.open(uri, BARRIER);
        // incomplete: on the state's name (LANGUAGE.md: a diagnostic about a state carries it)
        const incomplete = ds.find((d) => d.code === 'incomplete');
        expect(incomplete?.range).toEqual(wordRange(BARRIER, 'Closed', 1));
        expect(incomplete?.severity).toBe(2);
        // the witness is an input assignment that no guard of Closed takes: car = 0
        expect(JSON.stringify(incomplete?.data)).toMatch(/"car":0/);
        expect(incomplete?.relatedInformation?.some((r) => /witness/.test(r.message))).toBe(true);
        // overlap: open_cmd & car both true in Opening, different targets; reported on the later guard
        const overlap = ds.find((d) => d.code === 'overlap');
        const carGuard = positionOf(BARRIER, 'car -> Closed');
        expect(overlap?.range).toEqual({ start: carGuard, end: { line: carGuard.line, character: carGuard.character + 3 } });
        expect(overlap?.severity).toBe(1);
        expect(JSON.stringify(overlap?.data)).toMatch(/"open_cmd":1/);
        // unused-input: the declared name
        const unused = ds.find((d) => d.code === 'unused-input');
        expect(unused?.range).toEqual(wordRange(BARRIER, 'spare'));
    });

    it('reports syntax errors and recovers when the text is fixed', async () => {
        const uri = freshUri('syntax');
        const broken = BARRIER.replace('when car -> Opening;', 'when car -> ;');
        const ds = await session.open(uri, broken);
        expect(codes(ds)).toContain('syntax');
        const fixed = await session.change(uri, BARRIER);
        expect(codes(fixed)).not.toContain('syntax');
    });

    it('every file of examples/defects reports the code it is named for', async () => {
        const dir = join(ROOT, 'examples', 'defects');
        const files = existsSync(dir) ? readdirSync(dir).filter((f) => f.endsWith('.detent')) : [];
        for (const file of files) {
            const code = file.replace(/\.detent$/, '').replace(/^\d+[-_]/, '');
            const text = readFileSync(join(dir, file), 'utf8');
            const uri = `file:///tmp/detent-lsp-test/defects/${file}`;
            await session.open(uri, text);
            // Files may be named `<code>.detent` or `<code>-<detail>.detent`; as-built codes arrive in the idle-time phase
            const matches = (ds: Diagnostic[]) => ds.some((d) => code === String(d.code) || code.startsWith(`${String(d.code)}-`));
            const ds = await session.waitFor(uri, matches, 8000).catch(() => session.settle(uri));
            const known = ds.map((d) => String(d.code));
            expect(known.some((k) => code === k || code.startsWith(`${k}-`)), `${file}: got ${known.join(', ')}`).toBe(true);
            // Ranges: the text under a diagnostic about a named state or signal is that name
            // (LANGUAGE.md: state findings carry `state`, signal findings `signal`; ranges exact).
            const lines = text.split('\n');
            const under = (d: Diagnostic) => d.range.start.line === d.range.end.line ? lines[d.range.start.line]!.slice(d.range.start.character, d.range.end.character) : undefined;
            for (const d of ds) {
                const data = d.data as { state?: string; signal?: string } | undefined;
                if (['incomplete', 'unreachable', 'equivalent', 'no-return'].includes(String(d.code)) && data?.state) expect(under(d), `${file} ${d.code}`).toBe(data.state);
                if (['unused-input', 'unused-output'].includes(String(d.code)) && data?.signal) expect(under(d), `${file} ${d.code}`).toBe(data.signal);
                expect(d.range.end.line * 1e6 + d.range.end.character).toBeGreaterThan(d.range.start.line * 1e6 + d.range.start.character);
            }
        }
    });

    it('publishes only the newest text after a burst of edits (stale builds superseded)', async () => {
        const uri = freshUri('burst');
        await session.open(uri, BARRIER);
        const before = session.publications(uri);
        for (let k = 0; k < 8; k++) session.sendChange(uri, BARRIER.replace('spare', `spare${k}`));
        // last text: the only input with a changed name is spare7 — no other variant may linger
        const final = BARRIER.replace('spare', 'spare7');
        session.sendChange(uri, final);
        const ds = await session.settle(uri);
        const unused = ds.filter((d) => d.code === 'unused-input');
        expect(unused.map((d) => d.range)).toEqual([wordRange(final, 'spare7')]);
        // nine texts, far fewer builds: the burst was coalesced and superseded builds never published
        expect(session.publications(uri) - before).toBeLessThan(5);
    });

    it('applies severity overrides from the settings', async () => {
        const uri = freshUri('severity');
        await session.open(uri, BARRIER);
        await session.configure({ severity: { 'incomplete': 'off', 'unused-input': 'error' } });
        let ds = await session.settle(uri);
        // wait for the rebuild the configuration triggers
        for (let k = 0; k < 20 && ds.some((d) => d.code === 'incomplete'); k++) ds = await session.settle(uri, 200);
        expect(codes(ds)).not.toContain('incomplete');
        expect(ds.find((d) => d.code === 'unused-input')?.severity).toBe(1);
        await session.configure({ severity: {} });
        for (let k = 0; k < 20 && !ds.some((d) => d.code === 'incomplete'); k++) ds = await session.settle(uri, 200);
        expect(codes(ds)).toContain('incomplete');
    });
});

/** Evaluates a textbook sum of products (`a'·b + c`, `0`, `1`) — the test's own reading of the notation. */
function evalTextbook(text: string, env: Record<string, number>): boolean {
    if (text === '0') return false;
    if (text === '1') return true;
    return text.split(' + ').some((p) => p.split('·').every((lit) => (lit.endsWith("'") ? env[lit.slice(0, -1)] === 0 : env[lit] === 1)));
}

describe('hover', () => {
    // A small machine described by a table here; the expected next states come from the table.
    // Inputs a, b; D flip-flops; binary codes (LANGUAGE.md: code i, width ceil(log2 n)).
    const table: { name: string; rows: { guard: string; holds: (a: number, b: number) => boolean; to: string }[]; otherwise: string }[] = [
        { name: 'Rest', rows: [{ guard: 'a & !b', holds: (a, b) => a === 1 && b === 0, to: 'Fill' }], otherwise: 'Rest' },
        { name: 'Fill', rows: [{ guard: 'b', holds: (_a, b) => b === 1, to: 'Drain' }], otherwise: 'Fill' },
        { name: 'Drain', rows: [{ guard: '!a', holds: (a) => a === 0, to: 'Rest' }, { guard: 'a & b', holds: (a, b) => a === 1 && b === 1, to: 'Fill' }], otherwise: 'Drain' },
    ];
    const text = [
        'machine Tank {',
        '    reset rst -> Rest;',
        '    input a, b;',
        '    output busy;',
        '    encoding binary;',
        '    flipflop D;',
        ...table.flatMap((s) => [
            `    /** The ${s.name.toLowerCase()} phase. */`,
            `    state ${s.name} {`,
            ...(s.name === 'Rest' ? [] : ['        emit busy;']),
            ...s.rows.map((r) => `        when ${r.guard} -> ${r.to};`),
            '        otherwise stay;',
            '    }',
        ]),
        '}',
        '',
    ].join('\n');

    it('shows code, documentation, next-state rows, excitation slice and the caution on a state', async () => {
        const uri = freshUri('tank');
        const ds = await session.open(uri, text);
        expect(errors(ds)).toEqual([]);
        for (const [i, s] of table.entries()) {
            const code = i.toString(2).padStart(2, '0');
            const hover = await session.request<Hover>('textDocument/hover', { textDocument: { uri }, position: wordRange(text, s.name, 0).start });
            const value = (hover.contents as { value: string }).value;
            expect(value).toContain(`\`${code}\``);
            expect(value).toContain(`The ${s.name.toLowerCase()} phase.`);
            expect(value).toContain('Detent checks logic, not safety certification; defer to the applicable codes and licensed practice');
            // excitation slice: d1, d0 over a, b must give the next state's code bits (brute force over the table)
            for (const bit of [1, 0]) {
                const line = value.split('\n').find((l) => l.startsWith(`d${bit} = `));
                expect(line, `d${bit} in hover of ${s.name}`).toBeDefined();
                const rhs = line!.slice(`d${bit} = `.length);
                for (const a of [0, 1]) for (const b of [0, 1]) {
                    const row = s.rows.find((r) => r.holds(a, b));
                    const next = table.findIndex((t) => t.name === (row ? row.to : s.otherwise));
                    expect(evalTextbook(rhs, { a, b }), `${s.name} d${bit} a=${a} b=${b}`).toBe(((next >> bit) & 1) === 1);
                }
            }
        }
    });

    it('shows size, codes and cost on a machine name', async () => {
        const uri = freshUri('machine-hover');
        await session.open(uri, BARRIER);
        const hover = await session.request<Hover>('textDocument/hover', { textDocument: { uri }, position: wordRange(BARRIER, 'BarrierGate').start });
        const value = (hover.contents as { value: string }).value;
        expect(value).toContain('**machine BarrierGate** — 3 states, 3 inputs, 1 output, 0 scenarios');
        expect(value).toContain('Barrier at a car park exit.');
        // binary codes by declaration order
        expect(value).toContain('Closed `00`, Opening `01`, Open `10`');
        expect(value).toContain('Detent checks logic, not safety certification');
    });

    it('shows width and uses on a signal, and the witness on a diagnostic', async () => {
        const uri = freshUri('barrier-hover');
        await session.open(uri, BARRIER);
        const onInput = await session.request<Hover>('textDocument/hover', { textDocument: { uri }, position: wordRange(BARRIER, 'open_cmd', 0).start });
        const inputText = (onInput.contents as { value: string }).value;
        expect(inputText).toContain('input open_cmd');
        expect(inputText).toContain('1 bit');
        // read in state Opening on the line of `when open_cmd -> Open;` (1-based in the text)
        expect(inputText).toContain(`state Opening (line ${positionOf(BARRIER, 'when open_cmd').line + 1})`);
        const onOverlap = await session.request<Hover>('textDocument/hover', { textDocument: { uri }, position: positionOf(BARRIER, 'car -> Closed') });
        const overlapText = (onOverlap.contents as { value: string }).value;
        expect(overlapText).toMatch(/overlap/);
        expect(overlapText).toMatch(/Witness: inputs .*open_cmd = 1/);
    });
});

describe('code lenses and custom requests', () => {
    it('shows cost and commands above the machine, pass/fail above scenarios', async () => {
        const failing = PRESS.replace('expect StrokeB with press;', 'expect Idle;');
        const text = `${PRESS}\n${failing.replace('PressGuard', 'PressGuard2')}`;
        const uri = freshUri('press');
        await session.open(uri, text);
        const lenses = await session.request<CodeLens[]>('textDocument/codeLens', { textDocument: { uri } });
        const at = (line: number) => lenses.filter((l) => l.range.start.line === line).map((l) => l.command?.title ?? '');
        const first = at(positionOf(text, 'machine PressGuard').line);
        // 3 states, binary: ceil(log2 3) = 2 flip-flops (LANGUAGE.md state assignment), D by default
        expect(first[0]).toMatch(/^2 flip-flops · \d+ literals · \d+ gate inputs \(binary, D\)$/);
        expect(first.slice(1)).toEqual(['Equations', 'Compare encodings', 'Export…']);
        expect(lenses.find((l) => l.command?.title === 'Equations')?.command?.command).toBe('detent.showEquations');
        expect(lenses.find((l) => l.command?.title === 'Equations')?.command?.arguments?.[0]).toEqual({ uri, machine: 'PressGuard' });
        const passing = at(positionOf(text, 'scenario both_hands', 0).line);
        expect(passing[0]).toMatch(/^✓/);
        expect(passing[1]).toBe('Run');
        // the second machine's scenario expects Idle after both hands: it is in StrokeB
        const failingLens = at(positionOf(text, 'scenario both_hands', 1).line);
        expect(failingLens[0]).toMatch(/^✗.*StrokeB/);
        const run = await session.request<{ results: { scenario: string; passed: boolean; message: string }[] }>('detent/runScenarios', { uri, machine: 'PressGuard2' });
        expect(run.results).toHaveLength(1);
        expect(run.results[0]!.passed).toBe(false);
        const scen = await session.request<{ machines: { name: string; scenarios: { name: string }[] }[] }>('detent/scenarios', { uri });
        expect(scen.machines.map((m) => m.name)).toEqual(['PressGuard', 'PressGuard2']);
    });

    it('answers equations (codes, both notations, Karnaugh maps), compare and status', async () => {
        const uri = freshUri('press-eq');
        await session.open(uri, PRESS);
        const eq = await session.request<{ text: string }>('detent/equations', { uri, machine: 'PressGuard' });
        // binary codes by declaration order
        expect(eq.text).toMatch(/Idle\s+00/);
        expect(eq.text).toMatch(/StrokeA\s+01/);
        expect(eq.text).toMatch(/StrokeB\s+10/);
        expect(eq.text).toMatch(/^ {2}d0 = /m);
        expect(eq.text).toContain('Equations (HDL):');
        expect(eq.text).toMatch(/│ 00 +01 +11 +10/);
        const compare = await session.request<{ markdown: string }>('detent/compare', { uri, machine: 'PressGuard' });
        expect(compare.markdown).toContain('| binary | D |');
        expect(compare.markdown).toContain('**best**');
        const status = await session.request<{ machine?: string; text?: string }>('detent/status', { uri, position: positionOf(PRESS, 'state StrokeA') });
        expect(status.machine).toBe('PressGuard');
        expect(status.text).toMatch(/flip-flops/);
    });
});

describe('code actions', () => {
    async function fixesFor(uri: string, text: string, code: string): Promise<{ diagnostic: Diagnostic; actions: CodeAction[] }> {
        const ds = await session.change(uri, text).catch(async () => session.open(uri, text));
        const diagnostic = ds.find((d) => d.code === code);
        expect(diagnostic, `${code} in ${JSON.stringify(codes(ds))}`).toBeDefined();
        const actions = await session.request<CodeAction[]>('textDocument/codeAction', {
            textDocument: { uri }, range: diagnostic!.range, context: { diagnostics: [diagnostic] },
        });
        return { diagnostic: diagnostic!, actions };
    }

    async function applyAndRecheck(uri: string, text: string, code: string, title: RegExp): Promise<{ fixed: string; after: Diagnostic[]; before: Diagnostic[] }> {
        const before = await session.change(uri, text);
        const { actions } = await fixesFor(uri, text, code);
        const action = actions.find((a) => title.test(a.title));
        expect(action, `${title} among ${actions.map((a) => a.title).join(' | ')}`).toBeDefined();
        const fixed = applyWorkspaceEdit(text, uri, action!.edit);
        const after = await session.change(uri, fixed);
        return { fixed, after, before };
    }

    it('fixes each finding without introducing an error', async () => {
        const uri = freshUri('fixes');
        await session.open(uri, BARRIER);
        const cases: { code: string; title: RegExp; text: string }[] = [
            { code: 'incomplete', title: /otherwise stay/, text: BARRIER },
            { code: 'incomplete', title: /otherwise -> Open;/, text: BARRIER },
            { code: 'incomplete', title: /^Add `when/, text: BARRIER },
            { code: 'overlap', title: /priority/, text: BARRIER },
            { code: 'unused-input', title: /Remove unused input spare/, text: BARRIER },
            { code: 'equivalent', title: /Merge state StrokeB into StrokeA/, text: PRESS },
        ];
        for (const c of cases) {
            const { fixed, after, before } = await applyAndRecheck(uri, c.text, c.code, c.title);
            const count = (ds: Diagnostic[]) => ds.filter((d) => d.code === c.code).length;
            expect(count(after), `${c.code} after '${c.title}':\n${fixed}`).toBeLessThan(count(before));
            const newErrors = errors(after).filter((d) => !errors(before).some((b) => b.code === d.code));
            expect(newErrors, `${c.title}:\n${fixed}`).toEqual([]);
        }
    });

    it('merging equivalent states rewrites references in transitions and scenarios', async () => {
        const uri = freshUri('merge');
        await session.open(uri, PRESS);
        const { fixed, after } = await applyAndRecheck(uri, PRESS, 'equivalent', /Merge/);
        expect(fixed).not.toMatch(/\bStrokeB\b/);
        expect(fixed).toContain('when hands & done -> StrokeA;');
        expect(fixed).toContain('expect StrokeA with press;');
        expect(codes(after)).not.toContain('scenario');
    });
});

describe('editing features', () => {
    it('completes state names after ->, inputs in guards, encodings and flip-flop types', async () => {
        const uri = freshUri('complete');
        const text = BARRIER.replace('    output motor_up;', '    output motor_up;\n    encoding binary;\n    flipflop D;');
        await session.open(uri, text);
        const labels = async (needle: string, delta: number) => {
            const p = positionOf(text, needle);
            const r = await session.request<CompletionList | CompletionItem[]>('textDocument/completion', { textDocument: { uri }, position: { line: p.line, character: p.character + delta } });
            return (Array.isArray(r) ? r : r.items).map((i) => i.label);
        };
        const targets = await labels('-> Opening;', 3);
        expect(targets).toEqual(expect.arrayContaining(['Closed', 'Opening', 'Open']));
        const guards = await labels('car -> Opening', 0);
        expect(guards).toEqual(expect.arrayContaining(['car', 'open_cmd', 'spare']));
        const encodings = await labels('binary;', 0);
        expect(encodings).toEqual(expect.arrayContaining(['binary', 'gray', 'onehot', 'onecold', 'johnson', 'explicit', 'auto']));
        const flipflops = await labels('D;', 0);
        expect(flipflops).toEqual(expect.arrayContaining(['D', 'T', 'JK', 'SR']));
        // keywords in context (LANGUAGE.md grammar): state items at the start of a state's line,
        // declarations at the start of a machine's line — and not the other way round
        const inState = await labels('when open_cmd -> Open;', 0);
        expect(inState).toEqual(expect.arrayContaining(['emit', 'when', 'otherwise']));
        expect(inState).not.toContain('input');
        const inMachine = await labels('state Open {', 0);
        expect(inMachine).toEqual(expect.arrayContaining(['input', 'output', 'state', 'scenario', 'encoding', 'flipflop', 'recover']));
        expect(inMachine).not.toContain('when');
    });

    it('renames a state everywhere and refuses reserved or taken names', async () => {
        const uri = freshUri('rename');
        await session.open(uri, PRESS);
        const edit = await session.request<WorkspaceEdit>('textDocument/rename', { textDocument: { uri }, position: wordRange(PRESS, 'StrokeB', 0).start, newName: 'Hold' });
        const renamed = applyWorkspaceEdit(PRESS, uri, edit);
        // oracle: a plain whole-word substitution of the name
        expect(renamed).toBe(PRESS.replace(/\bStrokeB\b/g, 'Hold'));
        await expect(session.request('textDocument/rename', { textDocument: { uri }, position: wordRange(PRESS, 'StrokeB', 0).start, newName: 'begin' })).rejects.toThrow(/reserved/);
        await expect(session.request('textDocument/rename', { textDocument: { uri }, position: wordRange(PRESS, 'StrokeB', 0).start, newName: 'StrokeA' })).rejects.toThrow(/already declared/);
        await expect(session.request('textDocument/rename', { textDocument: { uri }, position: wordRange(PRESS, 'StrokeB', 0).start, newName: '9lives' })).rejects.toThrow(/identifier/);
        // names are compared ignoring case (VHDL): `strokea` clashes with StrokeA; a case change of the name itself does not
        await expect(session.request('textDocument/rename', { textDocument: { uri }, position: wordRange(PRESS, 'StrokeB', 0).start, newName: 'strokea' })).rejects.toThrow(/already declared/);
        const recase = await session.request<WorkspaceEdit>('textDocument/rename', { textDocument: { uri }, position: wordRange(PRESS, 'StrokeB', 1).start, newName: 'STROKEB' });
        expect(applyWorkspaceEdit(PRESS, uri, recase)).toBe(PRESS.replace(/\bStrokeB\b/g, 'STROKEB'));
        const signal = await session.request<WorkspaceEdit>('textDocument/rename', { textDocument: { uri }, position: wordRange(PRESS, 'hands', 0).start, newName: 'two_hands' });
        expect(applyWorkspaceEdit(PRESS, uri, signal)).toBe(PRESS.replace(/\bhands\b/g, 'two_hands'));
    });

    it('goes to the definition of a state and finds every reference to it', async () => {
        const uri = freshUri('definition');
        await session.open(uri, PRESS);
        // from the target of `when hands & done -> StrokeB;` to the declaration `state StrokeB`
        const use = positionOf(PRESS, 'StrokeB;');
        const defs = await session.request<{ uri?: string; targetUri?: string; range?: unknown; targetSelectionRange?: unknown }[]>('textDocument/definition', { textDocument: { uri }, position: use });
        const target = defs[0]!;
        expect(target.targetSelectionRange ?? target.range).toEqual(wordRange(PRESS, 'StrokeB', 1));
        const refs = await session.request<{ range: unknown }[]>('textDocument/references', { textDocument: { uri }, position: wordRange(PRESS, 'StrokeB', 1).start, context: { includeDeclaration: true } });
        // oracle: every whole-word occurrence of the name in the text
        const expected = [0, 1, 2].map((k) => wordRange(PRESS, 'StrokeB', k));
        expect(refs.map((r) => r.range)).toEqual(expect.arrayContaining(expected));
        expect(refs).toHaveLength(expected.length);
    });

    it('lists machines and states as document symbols', async () => {
        const uri = freshUri('symbols');
        await session.open(uri, PRESS);
        const symbols = await session.request<DocumentSymbol[]>('textDocument/documentSymbol', { textDocument: { uri } });
        expect(symbols.map((s) => s.name)).toEqual(['PressGuard']);
        const children = symbols[0]!.children!.map((c) => c.name);
        expect(children).toEqual(expect.arrayContaining(['Idle', 'StrokeA', 'StrokeB', 'both_hands', 'hands', 'done', 'press']));
        const idle = symbols[0]!.children!.find((c) => c.name === 'Idle')!;
        expect(idle.selectionRange).toEqual(wordRange(PRESS, 'Idle', 1));
        // SymbolKind numbers of the LSP 3.17 specification: Class 5, Method 6, Property 7, Field 8, EnumMember 22
        const kind = (name: string) => symbols[0]!.children!.find((c) => c.name === name)?.kind;
        expect(symbols[0]!.kind).toBe(5);
        expect([kind('Idle'), kind('hands'), kind('press'), kind('both_hands')]).toEqual([22, 8, 7, 6]);
    });

    it('formats idempotently and keeps comments and meaning', async () => {
        const uri = freshUri('format');
        const messy = BARRIER
            .replace('    input car, open_cmd, spare;', 'input   car ,open_cmd,spare ; // sensors')
            .replace('        when car -> Opening;', '  when car->Opening;   /* note */')
            .replace('    state Open {', '\n\n\n    state Open{');
        const before = await session.open(uri, messy);
        const edits = await session.request<TextEdit[]>('textDocument/formatting', { textDocument: { uri }, options: { tabSize: 4, insertSpaces: true } });
        const once = applyEdits(messy, edits);
        expect(once).toContain('// sensors');
        expect(once).toContain('/* note */');
        expect(once).toContain('    input car, open_cmd, spare; // sensors');
        expect(once).toContain('        when car -> Opening;   /* note */');
        const after = await session.change(uri, once);
        // meaning: the same findings at the same names (ranges move with the text, codes do not)
        expect(codes(after)).toEqual(codes(before));
        const again = await session.request<TextEdit[]>('textDocument/formatting', { textDocument: { uri }, options: { tabSize: 4, insertSpaces: true } });
        expect(applyEdits(once, again)).toBe(once);
    });

    it('provides folding ranges, semantic tokens and inlay hints with state codes', async () => {
        const uri = freshUri('misc');
        await session.open(uri, PRESS);
        const folds = await session.request<{ startLine: number }[]>('textDocument/foldingRange', { textDocument: { uri } });
        expect(folds.map((f) => f.startLine)).toEqual(expect.arrayContaining([positionOf(PRESS, 'state Idle').line]));
        const tokens = await session.request<{ data: number[] }>('textDocument/semanticTokens/full', { textDocument: { uri } });
        // decode per the LSP 3.17 specification: relative (line, start), length, type index, modifiers
        const legend = (session.capabilities.semanticTokensProvider as { legend: { tokenTypes: string[] } }).legend;
        const decoded: { line: number; character: number; length: number; type: string }[] = [];
        let line = 0;
        let character = 0;
        for (let i = 0; i < tokens.data.length; i += 5) {
            const [dl, dc, length, type] = tokens.data.slice(i, i + 4) as [number, number, number, number];
            line += dl;
            character = dl === 0 ? character + dc : dc;
            decoded.push({ line, character, length, type: legend.tokenTypes[type]! });
        }
        const at = (r: { start: { line: number; character: number } }) => decoded.find((t) => t.line === r.start.line && t.character === r.start.character)?.type;
        expect(at(wordRange(PRESS, 'Idle', 1))).toBe('enumMember');
        expect(at(wordRange(PRESS, 'StrokeA', 0))).toBe('enumMember');
        expect(at(wordRange(PRESS, 'hands', 0))).toBe('parameter');
        expect(at(wordRange(PRESS, 'hands', 1))).toBe('parameter');
        expect(at(wordRange(PRESS, 'press', 1))).toBe('variable');
        const hints = await session.request<{ position: { line: number; character: number }; label: string }[]>('textDocument/inlayHint', {
            textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 100, character: 0 } },
        });
        const idleName = wordRange(PRESS, 'Idle', 1);
        expect(hints.find((h) => h.position.line === idleName.end.line && h.position.character === idleName.end.character)?.label).toBe('= 00');
    });
});

describe('as-built diagnostics (idle-time phase)', () => {
    // Binary codes Hold 00, Dose 01, Flush 10 leave 11 unused (a don't-care). Worked by hand:
    // d1's ON-set is {01}, OFF {00, 10}, so its one minimal cover is q0; d0's ON-set is Hold·go
    // and Flush·!stop, and its minimal cover must use q1·!stop (two literals, through 11). So
    // in every minimal solution 11 goes to 11 while stop = 0: the lock-up does not depend on
    // which of several equal covers the minimizer picks.
    const DOSING = `machine Dosing {
    reset rst -> Hold;
    input go, stop;
    output pump, drain_valve;
    state Hold  { when go -> Dose; otherwise stay; }
    state Dose  { emit pump; otherwise -> Flush; }
    state Flush { emit drain_valve; when stop -> Hold; otherwise -> Dose; }
}
`;
    it('publishes lockup after the fast diagnostics and the recover fix removes it', async () => {
        const uri = freshUri('dosing');
        const fast = await session.open(uri, DOSING);
        expect(codes(fast)).not.toContain('lockup');
        const later = await session.waitFor(uri, (ds) => ds.some((d) => d.code === 'lockup'));
        const lockup = later.find((d) => d.code === 'lockup')!;
        expect(lockup.range.start.line).toBeGreaterThanOrEqual(0);
        expect(lockup.range.end.line).toBeLessThanOrEqual(positionOf(DOSING, '}\n', 3).line);
        const actions = await session.request<CodeAction[]>('textDocument/codeAction', { textDocument: { uri }, range: lockup.range, context: { diagnostics: [lockup] } });
        const recover = actions.find((a) => /recover -> Hold;/.test(a.title));
        expect(recover, actions.map((a) => a.title).join(' | ')).toBeDefined();
        const fixed = applyWorkspaceEdit(DOSING, uri, recover!.edit);
        expect(fixed).toContain('    recover -> Hold;\n    state Hold');
        await session.change(uri, fixed);
        // give the idle phase time to run, then check the lock-up is gone and no error appeared
        await new Promise((r) => setTimeout(r, 1500));
        const after = await session.settle(uri);
        expect(codes(after)).not.toContain('lockup');
        expect(errors(after)).toEqual([]);
    });
});

describe('diagram and export requests', () => {
    it('exports Verilog from core and refuses a machine with errors', async () => {
        const uri = freshUri('export');
        await session.open(uri, PRESS);
        const result = await session.request<{ files: { name: string; content: string }[] }>('detent/export', { uri, machine: 'PressGuard', to: 'verilog' });
        expect(result.files.length).toBeGreaterThan(0);
        // LANGUAGE.md: one module per machine, named as the machine
        expect(result.files[0]!.content).toMatch(/\bmodule\s+PressGuard\b/);
        const broken = PRESS.replace('-> StrokeA;', '-> Nowhere;');
        await session.change(uri, broken);
        await expect(session.request('detent/export', { uri, machine: 'PressGuard', to: 'verilog' })).rejects.toThrow(/errors/);
    });

    it('draws the diagram with every state and its code', async () => {
        const uri = freshUri('diagram');
        await session.open(uri, PRESS);
        const d = await session.request<{ machines: { name: string; dot: string; states: { name: string; code: string; range: unknown }[] }[] }>('detent/diagram', { uri });
        expect(d.machines.map((m) => m.name)).toEqual(['PressGuard']);
        const m = d.machines[0]!;
        // binary codes in declaration order (LANGUAGE.md state assignment)
        expect(m.states.map((s) => [s.name, s.code])).toEqual([['Idle', '00'], ['StrokeA', '01'], ['StrokeB', '10']]);
        expect(m.states[1]!.range).toEqual(wordRange(PRESS, 'StrokeA', 1));
    });

    it('diagram DOT (core exporter) lays out in Graphviz with every state and transition', async () => {
        const uri = freshUri('diagram-dot');
        await session.open(uri, PRESS);
        const d = await session.request<{ machines: { dot: string }[] }>('detent/diagram', { uri });
        const dot = d.machines[0]!.dot;
        expect(dot).toMatch(/digraph/);
        // outside oracle: Graphviz itself (the WASM build the extension also uses) must accept the DOT
        const { Graphviz } = await import('@hpcc-js/wasm-graphviz');
        const graphviz = await Graphviz.load();
        const svg = graphviz.dot(dot);
        for (const s of ['Idle', 'StrokeA', 'StrokeB']) expect(svg).toContain(`<title>${s}</title>`);
        // the transitions of PRESS, read off the text above (`->` is escaped in SVG titles)
        for (const [from, to] of [['Idle', 'StrokeA'], ['Idle', 'StrokeB'], ['StrokeA', 'Idle'], ['StrokeB', 'Idle']]) {
            expect(svg).toContain(`<title>${from}&#45;&gt;${to}</title>`);
        }
    });
});

describe('active encoding from the settings', () => {
    it('hover and inlay hints follow detent.encoding / detent.flipflop', async () => {
        const uri = freshUri('settings-encoding');
        await session.open(uri, PRESS);
        await session.configure({ encoding: 'gray', flipflop: 'JK' });
        try {
            // LANGUAGE.md: gray code of index i is i XOR (i >> 1); StrokeB is index 2 → 3 → "11"
            const gray = (i: number) => (i ^ (i >> 1)).toString(2).padStart(2, '0');
            let value = '';
            for (let k = 0; k < 40 && !value.includes(`\`${gray(2)}\``); k++) {
                const hover = await session.request<Hover>('textDocument/hover', { textDocument: { uri }, position: wordRange(PRESS, 'StrokeB', 1).start });
                value = (hover.contents as { value: string }).value;
                if (!value.includes(`\`${gray(2)}\``)) await new Promise((r) => setTimeout(r, 50));
            }
            expect(value).toContain(`\`${gray(2)}\` (gray, JK flip-flops)`);
            // JK excitation names (LANGUAGE.md synthesis): j1, k1, j0, k0
            expect(value).toMatch(/^j1 = /m);
            expect(value).toMatch(/^k0 = /m);
            const hints = await session.request<{ label: string }[]>('textDocument/inlayHint', {
                textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 100, character: 0 } },
            });
            expect(hints.map((h) => h.label)).toEqual([0, 1, 2].map((i) => `= ${gray(i)}`));
        } finally {
            await session.configure({ encoding: 'machine', flipflop: 'machine' });
        }
    });
});

describe('fails soft', () => {
    it('answers every request while a file is typed from scratch', async () => {
        const uri = freshUri('typing');
        await session.open(uri, '');
        const text = `${PRESS}\n${BARRIER}`;
        for (let n = 7; n <= text.length; n += 23) {
            const prefix = text.slice(0, n);
            await session.change(uri, prefix);
            const lines = prefix.split('\n');
            const end = { line: lines.length - 1, character: lines[lines.length - 1]!.length };
            const mid = { line: Math.floor(lines.length / 2), character: 6 };
            // any answer (possibly empty) is fine; an error response or a dead server is not
            await session.request('textDocument/hover', { textDocument: { uri }, position: mid });
            await session.request('textDocument/codeLens', { textDocument: { uri } });
            await session.request('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end } });
            await session.request('textDocument/completion', { textDocument: { uri }, position: end });
            await session.request('textDocument/formatting', { textDocument: { uri }, options: { tabSize: 4, insertSpaces: true } });
            await session.request('detent/status', { uri, position: mid });
            await session.request('detent/diagram', { uri });
        }
        expect(session.process.exitCode).toBeNull();
        expect(session.stderr.join('')).not.toMatch(/TypeError|ReferenceError/);
        // fail-soft catches are logged: none may have been needed
        expect(session.logs.filter((l) => /^detent: .* failed/.test(l))).toEqual([]);
    });
});

describe('transports', () => {
    it('serves over --node-ipc (how the VS Code client starts it)', async () => {
        const ipc = await LspSession.start({ via: 'ipc' });
        try {
            const uri = freshUri('ipc');
            const ds = await ipc.open(uri, BARRIER);
            expect(codes(ds)).toEqual(expect.arrayContaining(['incomplete', 'overlap', 'unused-input']));
        } finally {
            await ipc.stop();
        }
    });
});

describe('detent lsp --stdio', () => {
    it('runs the same server from the CLI bundle', async () => {
        const cli = await LspSession.start({ via: 'cli' });
        try {
            expect(cli.capabilities.hoverProvider).toBeTruthy();
            expect(cli.capabilities.codeLensProvider).toBeTruthy();
            const uri = freshUri('cli');
            const ds = await cli.open(uri, BARRIER);
            expect(codes(ds)).toEqual(expect.arrayContaining(['incomplete', 'overlap', 'unused-input']));
        } finally {
            await cli.stop();
        }
    });
});
