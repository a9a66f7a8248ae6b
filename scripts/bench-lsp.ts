// Editor latency over LSP with the real bundled server (spawned with --stdio, as an editor does):
// - edit → diagnostics: a full-text change to a generated 64-state machine until the server
//   publishes diagnostics for it (includes the debounce), 50 edits, median and p95;
// - hover on a state and code lenses right after an edit (cold: the synthesis cache was dropped
//   by the edit), after an edit and a typing pause (the idle phase has synthesized), and warm.
// Targets: edit → diagnostics median ≤ 100 ms; hover and code lens ≤ 200 ms.
import { loadavg, cpus } from 'node:os';
import { LspSession } from '../tests/lsp/harness.js';

const STATES = Number(process.argv[2] ?? 64);
const EDITS = Number(process.argv[3] ?? 50);

/** A conveyor of STATES zones: advance on `go`, back up on `back`, home on `fault`. */
function conveyor(variant: number): string {
    const lines = [
        '/** Conveyor zone sequencer (generated for the editor benchmark). */',
        'machine Conveyor {',
        '    clock clk;',
        '    reset rst -> Z0;',
        `    input go, back, fault, spare${variant % 2};`,
        '    input [4] load;',
        '    output running, alarm;',
        '    output [3] lamp;',
    ];
    for (let i = 0; i < STATES; i++) {
        const next = `Z${(i + 1) % STATES}`;
        const prev = `Z${(i + STATES - 1) % STATES}`;
        lines.push(`    state Z${i} {`);
        lines.push(`        emit lamp = ${i % 8}${i % 2 ? ', running' : ''};`);
        lines.push('        when fault -> Z0 emit alarm;');
        lines.push(`        when !fault & go & !back & load < ${8 + (i % 8)} -> ${next};`);
        lines.push(`        when !fault & back -> ${prev};`);
        // every 8th edit removes one `otherwise`, which makes an `incomplete` appear
        if (!(variant % 8 === 7 && i === variant % STATES)) lines.push('        otherwise stay;');
        lines.push('    }');
    }
    lines.push('    scenario advances {', '        reset;', '        step go;', '        expect Z1;', '    }');
    lines.push('}', '');
    return lines.join('\n');
}

function stats(samples: number[]): { median: number; p95: number; max: number } {
    const s = [...samples].sort((a, b) => a - b);
    const at = (q: number) => s[Math.min(s.length - 1, Math.ceil(q * s.length) - 1)]!;
    return { median: at(0.5), p95: at(0.95), max: s[s.length - 1]! };
}

const fmt = (x: number) => `${x.toFixed(1)} ms`;

console.log(`machine: ${cpus().length} CPUs, load average ${loadavg().map((l) => l.toFixed(1)).join(' / ')} (1/5/15 min) — figures scale with load`);
const session = await LspSession.start();
const uri = 'file:///tmp/detent-bench/conveyor.detent';
try {
    let t = performance.now();
    await session.open(uri, conveyor(0));
    console.log(`open → first diagnostics (${STATES} states): ${fmt(performance.now() - t)}`);
    // warm-up edits (JIT) are not counted
    for (let k = 1; k <= 3; k++) await session.change(uri, conveyor(k));

    const edit: number[] = [];
    for (let k = 0; k < EDITS; k++) {
        t = performance.now();
        await session.change(uri, conveyor(k + 4));
        edit.push(performance.now() - t);
    }
    const hoverCold: number[] = [];
    const hoverWarm: number[] = [];
    const hoverPaused: number[] = [];
    const lensCold: number[] = [];
    const lensWarm: number[] = [];
    const statePosition = (text: string, name: string) => {
        const lines = text.split('\n');
        const line = lines.findIndex((l) => l.includes(`state ${name} {`));
        return { line, character: lines[line]!.indexOf(name) };
    };
    for (let k = 0; k < 10; k++) {
        const text = conveyor(100 + k);
        await session.change(uri, text);
        const position = statePosition(text, `Z${(k * 7) % STATES}`);
        t = performance.now();
        await session.request('textDocument/hover', { textDocument: { uri }, position });
        hoverCold.push(performance.now() - t);
        t = performance.now();
        await session.request('textDocument/hover', { textDocument: { uri }, position });
        hoverWarm.push(performance.now() - t);
        // typing pause: the idle phase (as-built, synthesis for the editor) has run
        const paused = conveyor(300 + k);
        await session.change(uri, paused);
        await new Promise((r) => setTimeout(r, 900));
        t = performance.now();
        await session.request('textDocument/hover', { textDocument: { uri }, position: statePosition(paused, `Z${(k * 5) % STATES}`) });
        hoverPaused.push(performance.now() - t);
        await session.change(uri, conveyor(200 + k));
        t = performance.now();
        await session.request('textDocument/codeLens', { textDocument: { uri } });
        lensCold.push(performance.now() - t);
        t = performance.now();
        await session.request('textDocument/codeLens', { textDocument: { uri } });
        lensWarm.push(performance.now() - t);
    }
    const report = (name: string, samples: number[], target?: number) => {
        const s = stats(samples);
        const verdict = target === undefined ? '' : s.median <= target ? `  (target median ≤ ${target} ms: met)` : `  (target median ≤ ${target} ms: MISSED)`;
        console.log(`${name.padEnd(34)} median ${fmt(s.median)}  p95 ${fmt(s.p95)}  max ${fmt(s.max)}  n=${samples.length}${verdict}`);
    };
    report('edit → diagnostics', edit, 100);
    report('hover on a state, after an edit', hoverCold, 200);
    report('hover on a state, warm', hoverWarm, 200);
    report('hover after an edit and a pause', hoverPaused, 200);
    report('code lenses, after an edit', lensCold, 200);
    report('code lenses, warm', lensWarm, 200);
} finally {
    await session.stop();
}
