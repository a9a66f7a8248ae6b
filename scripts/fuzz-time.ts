// Times the pipeline per input (a development aid for keeping the fuzz run bounded).
import { corpus, pathologicalInputs } from './fuzz-lib.js';
import { runPipeline } from './fuzz-worker.js';
const root = process.cwd();
const which = process.argv[2] ?? 'seeds';
const inputs = which === 'seeds' ? corpus({ seed: 1, count: 0, root }) : which === 'mut' ? corpus({ seed: 1, count: 200, root }).slice(-200) : pathologicalInputs().filter((p) => p.id.includes(which));
for (const input of inputs) {
    const t0 = performance.now();
    const r = runPipeline(input.text, { root, parseOnly: input.parseOnly });
    const ms = performance.now() - t0;
    if (ms > 200 || r.problems.length) console.log(`${ms.toFixed(0).padStart(7)} ms ${input.id} usable=${r.usable} ${r.problems.slice(0, 2).join(' | ').slice(0, 300)}`);
}
