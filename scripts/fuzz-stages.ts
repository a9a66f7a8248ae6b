// Times each pipeline stage of one pathological input (a development aid for the limits).
import { parseDetent } from '@detent/language';
import { analyzeMachine, analyzeAsBuilt, scenarioFindings, synthesize } from '@detent/core';
import { pathologicalInputs } from './fuzz-lib.js';
const input = pathologicalInputs().find((p) => p.id.includes(process.argv[2]!))!;
const time = <T>(name: string, fn: () => T): T => {
    process.stdout.write(`${name}… `);
    const t0 = performance.now();
    const r = fn();
    process.stdout.write(`${(performance.now() - t0).toFixed(0)} ms\n`);
    return r;
};
const parsed = time('parse', () => parseDetent(input.text));
console.log(`machines ${parsed.machines.length}, findings ${parsed.findings.length}: ${parsed.findings.slice(0, 3).map((f) => `${f.code} ${f.message}`).join(' | ')}`);
for (const m of parsed.machines.slice(0, 3)) {
    if (!m.usable) continue;
    const a = time('analyze', () => analyzeMachine(m.machine));
    console.log(a.slice(0, 3).map((f) => `${f.code} ${f.message}`).join(' | ').slice(0, 300));
    const b = time('asbuilt', () => analyzeAsBuilt(m.machine));
    console.log(b.slice(0, 3).map((f) => `${f.code} ${f.message}`).join(' | ').slice(0, 300));
    time('scenarios', () => scenarioFindings(m.machine));
    time('synth', () => synthesize(m.machine));
}
