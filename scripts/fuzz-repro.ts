// Re-runs one saved fuzz failure (test-results/fuzz-failures/N.detent) and prints its machines and findings.
import { readFileSync } from 'node:fs';
import { parseDetent } from '@detent/language';
const text = readFileSync(process.argv[2]!, 'utf8');
const p = parseDetent(text);
for (const m of p.machines) console.log(`machine '${m.machine.name}' usable=${m.usable} findings=${m.findings.map((f) => `${f.code}@${f.range.start.line}:${f.range.start.character}`).join(',')}`);
console.log(p.findings.map((f) => `${f.severity} ${f.code} ${f.range.start.line}:${f.range.start.character} ${f.message}`).join('\n'));
