/**
 * DOT export: Graphviz itself (@hpcc-js/wasm-graphviz, the reference implementation compiled to
 * WebAssembly) lays out every example's and 60 random machines' diagrams; its JSON output must list
 * exactly the state names (plus the two pseudo nodes) and one edge per transition/otherwise/reset.
 * Guard labels are read back by the language's own parser (@detent/language) and must mean the
 * same function as the model guard on every input valuation (evalGuard, the shared test oracle).
 */
import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';
import { Graphviz } from '@hpcc-js/wasm-graphviz';
import { parseDetent } from '@detent/language';
import { exportDot, guardSource } from '../../src/export/dot.js';
import type { Machine } from '../../src/model/machine.js';
import { clearResetState } from '../../src/synthesis/encoding.js';
import { defaultAssignment } from '../../src/simulation/simulator.js';
import { allInputValuations, evalGuard, mulberry32, randomMachine } from '../support/random-machine.js';

const opts = { sourceName: 'x.detent', sourceText: '' };

function examples(): Machine[] {
    const dir = new URL('../../../../examples/', import.meta.url);
    return readdirSync(dir).filter((n) => n.endsWith('.detent')).flatMap((n) => parseDetent(readFileSync(new URL(n, dir), 'utf8')).machines.map((m) => m.machine));
}

describe('DOT export', () => {
    it('Graphviz reads it; node ids are the state names; one edge per transition', async () => {
        const gv = await Graphviz.load();
        const rng = mulberry32(4242);
        const machines = [...examples(), ...Array.from({ length: 60 }, (_, i) => randomMachine(rng, {}, `D${i}`))];
        for (const m of machines) {
            const json = JSON.parse(gv.layout(exportDot(m, opts).text, 'json', 'dot')) as { objects?: { name: string }[]; edges?: unknown[] };
            const names = (json.objects ?? []).map((o) => o.name).sort();
            const pseudo = ['(reset)', ...(m.recover ? ['(unused codes)'] : [])];
            expect(names).toEqual([...m.states.map((s) => s.name), ...pseudo].sort());
            const transitions = m.states.reduce((n, s) => n + s.transitions.length + (s.otherwise?.kind === 'goto' ? 1 : 0), 0);
            // The reset arrow exists unless a clear reset lands on a code that is no state.
            const resetEdge = m.reset?.target === 'clear' && clearResetState(defaultAssignment(m)) === undefined ? 0 : 1;
            expect(json.edges?.length ?? 0).toBe(transitions + resetEdge + (m.recover ? 1 : 0));
        }
    });

    it('guard labels parse back to the same Boolean function', () => {
        const rng = mulberry32(77);
        let checked = 0;
        for (let n = 0; n < 80; n++) {
            const m = randomMachine(rng, { minStates: 2 }, 'G');
            if (m.inputs.length === 0) continue;
            const guards = m.states.flatMap((s) => s.transitions.map((t) => t.guard));
            if (guards.length === 0) continue;
            const decl = m.inputs.map((i) => (i.isBus ? `input [${i.width}] ${i.name};` : `input ${i.name};`)).join(' ');
            const body = guards.map((g) => `when ${guardSource(g, m)} -> B;`).join(' ');
            const text = `machine G { ${decl} state A priority { ${body} } state B { } }`;
            const parsed = parseDetent(text).machines[0]!;
            expect(parsed.findings.filter((f) => f.code === 'syntax')).toEqual([]);
            const back = parsed.machine.states[0]!.transitions.map((t) => t.guard);
            expect(back.length).toBe(guards.length);
            for (const values of allInputValuations(m)) {
                guards.forEach((g, k) => expect(evalGuard(back[k]!, values)).toBe(evalGuard(g, values)));
            }
            checked += guards.length;
        }
        expect(checked).toBeGreaterThan(50);
    });
});
