/**
 * The example of LANGUAGE.md (the contract, in ../shared beside the repository) is read verbatim
 * and must be free of errors and warnings, its scenario included.
 */
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { expect, test } from 'vitest';
import { checkText, parseDetent } from '@detent/language';

const contract = fileURLToPath(new URL('../../../shared/LANGUAGE.md', import.meta.url));

test.skipIf(!existsSync(contract))('the LANGUAGE.md example checks clean', () => {
    const md = readFileSync(contract, 'utf8');
    const block = /## Example\s+```[^\n]*\n([\s\S]*?)```/.exec(md);
    expect(block).not.toBeNull();
    const text = block![1]!;
    const parsed = parseDetent(text);
    expect(parsed.findings).toEqual([]);
    expect(parsed.machines.map((m) => [m.machine.name, m.machine.states.length, m.machine.scenarios.length])).toEqual([['SumpPump', 3, 1]]);
    expect(checkText(text).filter((f) => f.severity !== 'info').map((f) => `${f.code}: ${f.message}`)).toEqual([]);
});
