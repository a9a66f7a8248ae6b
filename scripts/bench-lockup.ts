/**
 * Lock-up analysis and synthesis time for one-hot machines with 16, 32 and 64 flip-flops
 * (target: < 1 s for the lock-up analysis of 64). The machine: a multi-station indexing table —
 * each station advances on `step`, skips a station on `skip`, returns home on `abort`, and
 * raises `busy` (Moore) and `fault` (Mealy, on abort).
 *   node scripts/run-ts.mjs scripts/bench-lockup.ts
 */
import type { Guard, Machine, SourceRange, State } from '../packages/core/src/model/machine.js';
import { NO_RANGE } from '../packages/core/src/model/machine.js';
import { synthesize } from '../packages/core/src/synthesis/run.js';
import { explicitSafety, symbolicSafety } from '../packages/core/src/asbuilt/safety.js';
import { recoveryReport } from '../packages/core/src/asbuilt/report.js';
import { analyzeAsBuilt } from '../packages/core/src/asbuilt/index.js';

const R: SourceRange = NO_RANGE;
const input = (i: number): Guard => ({ kind: 'input', input: i, range: R });
const not = (g: Guard): Guard => ({ kind: 'not', operand: g, range: R });
const and = (...operands: Guard[]): Guard => ({ kind: 'and', operands, range: R });

export function indexingTable(n: number, flipflop: Machine['flipflop'] = 'D', recover = false): Machine {
    const states: State[] = Array.from({ length: n }, (_, i) => ({
        name: `Station${i}`,
        index: i,
        priority: true,
        emits: i % 3 === 0 ? [{ output: 0, value: 1, range: R }] : [],
        transitions: [
            { guard: input(0), target: 0, emits: [{ output: 1, value: 1, range: R }], range: R, targetRange: R },
            { guard: and(input(1), input(2)), target: (i + 2) % n, emits: [], range: R, targetRange: R },
            { guard: and(input(1), not(input(3))), target: (i + 1) % n, emits: [], range: R, targetRange: R },
        ],
        otherwise: { kind: 'stay', range: R },
        range: R,
        nameRange: R,
    }));
    return {
        name: `IndexingTable${n}`,
        clock: { name: 'clk', edge: 'rising', range: R },
        reset: { name: 'rst', activeHigh: true, async: false, target: 0, range: R, nameRange: R },
        inputs: ['abort', 'step', 'skip', 'hold'].map((name) => ({ name, width: 1, isBus: false, async: false, range: R, nameRange: R })),
        outputs: ['busy', 'fault'].map((name) => ({ name, width: 1, isBus: false, registered: false, range: R, nameRange: R })),
        states,
        encoding: 'onehot',
        encodingRange: R,
        flipflop,
        flipflopRange: R,
        recover: recover ? { target: 0, range: R } : undefined,
        scenarios: [],
        range: R,
        nameRange: R,
    };
}

const time = <T>(f: () => T): [T, number] => { const t = performance.now(); const r = f(); return [r, performance.now() - t]; };

const isMain = process.argv[1]?.endsWith('bench-lockup.ts');
if (isMain) {
    console.log('one-hot lock-up analysis (symbolic BDD) and synthesis, ms (median of 3)');
    console.log('flip-flops  ff  synth  lockup  method    lockup?  worst-latency  bdd-vs-explicit');
    for (const n of [16, 32, 64]) {
        for (const ff of ['D', 'T', 'JK', 'SR'] as const) {
            const synthTimes: number[] = [];
            const lockTimes: number[] = [];
            let result = synthesize(indexingTable(n, ff));
            let analysis = symbolicSafety(result);
            for (let k = 0; k < 3; k++) {
                const [r, ts] = time(() => synthesize(indexingTable(n, ff)));
                const [a, tl] = time(() => symbolicSafety(r));
                result = r; analysis = a;
                synthTimes.push(ts); lockTimes.push(tl);
            }
            const med = (xs: number[]) => [...xs].sort((a, b) => a - b)[1]!.toFixed(1);
            let agree = 'n/a';
            if (n <= 16) {
                const e = explicitSafety(result);
                agree = e.lockup === analysis.lockup && e.worstLatency === analysis.worstLatency ? 'agree' : 'DISAGREE';
            }
            console.log(`${String(n).padStart(10)}  ${ff.padEnd(2)}  ${med(synthTimes).padStart(5)}  ${med(lockTimes).padStart(6)}  ${analysis.method.padEnd(8)}  ${String(analysis.lockup).padEnd(7)}  ${String(analysis.worstLatency ?? '-').padStart(13)}  ${agree}`);
        }
    }
    console.log('with recover -> Station0 (unused codes specified; no lock-up expected, latency 1):');
    for (const n of [16, 32, 64]) {
        for (const ff of ['D', 'T', 'JK', 'SR'] as const) {
            const [r, ts] = time(() => synthesize(indexingTable(n, ff, true)));
            const [a, tl] = time(() => symbolicSafety(r));
            console.log(`${String(n).padStart(10)}  ${ff.padEnd(2)}  ${ts.toFixed(1).padStart(7)}  ${tl.toFixed(1).padStart(6)}  ${a.method.padEnd(8)}  ${String(a.lockup).padEnd(7)}  ${String(a.worstLatency ?? '-').padStart(13)}`);
        }
    }
    for (const n of [16, 32, 64]) {
        const [findings, tf] = time(() => analyzeAsBuilt(indexingTable(n, 'T')));
        console.log(`analyzeAsBuilt (editor keystroke path), ${n} one-hot T: ${tf.toFixed(1)} ms → ${findings.map((f) => f.code).join(', ') || 'no findings'}`);
    }
    const [report, t] = time(() => recoveryReport(indexingTable(64, 'D', true)));
    console.log(`recovery report (2 syntheses + analysis), 64 one-hot D with recover: ${t.toFixed(1)} ms; cost delta of recover ${JSON.stringify(report.recoverCostDelta)}`);
}
