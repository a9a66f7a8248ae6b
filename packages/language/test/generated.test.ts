/**
 * The checked-in parser/AST (src/generated) is exactly what `langium generate` (langium-cli, the
 * reference generator) produces from src/grammar/detent.langium: regenerate into a temp folder
 * and compare byte for byte.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { expect, test } from 'vitest';

const pkg = fileURLToPath(new URL('..', import.meta.url));
const root = join(pkg, '..', '..');

test('regenerating from the grammar yields the checked-in files byte for byte', () => {
    const work = mkdtempSync(join(tmpdir(), 'detent-gen-'));
    const out = join(work, 'generated');
    try {
        const config = JSON.parse(readFileSync(join(pkg, 'langium-config.json'), 'utf8')) as { languages: { grammar: string }[]; out: string };
        config.languages[0]!.grammar = join(pkg, config.languages[0]!.grammar);
        config.out = out;
        const configPath = join(work, 'langium-config.json');
        writeFileSync(configPath, JSON.stringify(config));
        const log = execFileSync(process.execPath, ['--import', join(pkg, 'scripts', 'node20-compat.mjs'), join(root, 'node_modules', 'langium-cli', 'bin', 'langium.js'), 'generate', '-f', configPath], { cwd: work, encoding: 'utf8' });
        expect(log).toContain('finished successfully');
        const checkedIn = readdirSync(join(pkg, 'src', 'generated')).sort();
        const fresh = readdirSync(out).sort();
        expect(fresh).toEqual(checkedIn);
        for (const f of checkedIn) {
            expect(readFileSync(join(out, f)).equals(readFileSync(join(pkg, 'src', 'generated', f))), `${f} differs; run npm run langium:generate`).toBe(true);
        }
    } finally {
        rmSync(work, { recursive: true, force: true });
    }
});
