/**
 * `detent check` through the built CLI (`node packages/cli/bin/detent.js`, bundled by
 * scripts/build.mjs): output formats, exit codes (LANGUAGE.md "Command line": 0 no errors,
 * 1 errors, 2 usage or I/O) and each error path. SARIF output is validated with ajv (an
 * independent JSON Schema validator) against the OASIS SARIF 2.1.0 JSON schema vendored in
 * tests/fixtures (source repository, path and commit in tests/fixtures/README.md).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import Ajv from 'ajv';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';

const root = fileURLToPath(new URL('../../', import.meta.url));
const bin = join(root, 'packages', 'cli', 'bin', 'detent.js');

function detent(...args: string[]): { status: number | null; stdout: string; stderr: string } {
    const r = spawnSync(process.execPath, [bin, ...args], { cwd: root, encoding: 'utf8' });
    return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

let work: string;

beforeAll(() => {
    // `npm test` builds first (scripts/test.mjs); build here only when run on its own
    if (!existsSync(join(root, 'packages', 'cli', 'dist', 'detent.mjs'))) {
        spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { cwd: root, stdio: 'inherit' });
    }
    work = mkdtempSync(join(tmpdir(), 'detent-check-'));
});

afterAll(() => rmSync(work, { recursive: true, force: true }));

/** 1-based line:col of the first occurrence of `snippet`, computed from the text. */
function lineCol(text: string, snippet: string): string {
    const offset = text.indexOf(snippet);
    const before = text.slice(0, offset);
    return `${before.split('\n').length}:${offset - before.lastIndexOf('\n')}`;
}

describe('text output and exit codes', () => {
    test('a clean file: exit 0, nothing on stdout, a summary on stderr', () => {
        const r = detent('check', join('examples', 'press-guard.detent'));
        expect(r.status).toBe(0);
        expect(r.stdout).toBe('');
        expect(r.stderr).toContain('1 file checked: 0 errors');
    });

    test('an error: exit 1, `file:line:col: severity code: message` with 1-based positions', () => {
        const path = join('examples', 'defects', 'unknown-name.detent');
        const text = readFileSync(join(root, path), 'utf8');
        const r = detent('check', path);
        expect(r.status).toBe(1);
        expect(r.stdout).toBe(`${path}:${lineCol(text, 'Ful;')}: error unknown-name: no state named 'Ful' (did you mean 'Full'?)\n`);
    });

    test('only warnings/infos: exit 0 with the lines printed', () => {
        const path = join('examples', 'defects', 'unused-output.detent');
        const r = detent('check', path);
        expect(r.status).toBe(0);
        expect(r.stdout).toMatch(/^examples[/\\]defects[/\\]unused-output\.detent:\d+:\d+: info unused-output: /);
    });

    test('--help prints the usage and exits 0', () => {
        const r = detent('check', '--help');
        expect(r.status).toBe(0);
        expect(r.stdout).toContain('--format text');
        expect(r.stdout).toContain('Exit status');
    });
});

describe('paths', () => {
    test('folders recurse into *.detent, sorted, skipping node_modules and .git', () => {
        const dir = join(work, 'tree');
        mkdirSync(join(dir, 'b', 'deep'), { recursive: true });
        mkdirSync(join(dir, 'node_modules'), { recursive: true });
        mkdirSync(join(dir, '.git'), { recursive: true });
        const machine = 'machine M { reset r -> A1; input go; output lit; state A1 { when go -> B1; otherwise stay; } state B1 { emit lit; when !go -> A1; otherwise stay; } }\n';
        for (const f of ['z.detent', 'a.detent', join('b', 'deep', 'm.detent'), join('b', 'c.detent'), join('node_modules', 'x.detent'), join('.git', 'y.detent')]) {
            writeFileSync(join(dir, f), machine);
        }
        writeFileSync(join(dir, 'notes.txt'), 'not a machine');
        const r = detent('check', '--format', 'json', dir);
        expect(r.status).toBe(0);
        const paths = (JSON.parse(r.stdout) as { files: { path: string }[] }).files.map((f) => f.path);
        expect(paths).toEqual([join(dir, 'a.detent'), join(dir, 'b', 'c.detent'), join(dir, 'b', 'deep', 'm.detent'), join(dir, 'z.detent')]);
    });

    test('several paths: every file reported, exit 1 when any has an error', () => {
        const r = detent('check', '--format', 'json', join('examples', 'press-guard.detent'), join('examples', 'defects', 'width.detent'));
        expect(r.status).toBe(1);
        expect((JSON.parse(r.stdout) as { files: unknown[] }).files).toHaveLength(2);
    });
});

describe('usage and I/O errors: exit 2 with one clear line', () => {
    const oneLine = (r: { stderr: string }) => expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);

    test('missing path', () => {
        const r = detent('check');
        expect(r.status).toBe(2);
        expect(r.stderr).toContain('missing PATH');
        oneLine(r);
    });
    test('a path that does not exist', () => {
        const r = detent('check', join(work, 'nope.detent'));
        expect(r.status).toBe(2);
        expect(r.stderr).toContain('no such file or folder');
        oneLine(r);
    });
    test('an unreadable file (a dangling link inside a folder)', () => {
        const dir = join(work, 'dangling');
        mkdirSync(dir);
        symlinkSync(join(work, 'missing-target.detent'), join(dir, 'broken.detent'));
        const r = detent('check', dir);
        expect(r.status).toBe(2);
        expect(r.stderr).toMatch(/broken\.detent: (no such file or folder|cannot read file)/);
        oneLine(r);
    });
    test('a file that is not UTF-8', () => {
        const file = join(work, 'latin1.detent');
        writeFileSync(file, Buffer.from([0x2f, 0x2f, 0x20, 0xe9, 0xe8, 0x0a, 0xff, 0xfe]));
        const r = detent('check', file);
        expect(r.status).toBe(2);
        expect(r.stderr).toContain('not UTF-8 text');
        oneLine(r);
    });
    test('a folder without .detent files', () => {
        const dir = join(work, 'empty');
        mkdirSync(dir);
        writeFileSync(join(dir, 'readme.txt'), 'x');
        const r = detent('check', dir);
        expect(r.status).toBe(2);
        expect(r.stderr).toContain('no .detent files');
        oneLine(r);
    });
    test('an unknown flag lists the valid ones', () => {
        const r = detent('check', '--colour', 'examples');
        expect(r.status).toBe(2);
        expect(r.stderr).toContain("unknown option '--colour' (valid: --format, --help)");
        oneLine(r);
    });
    test('a bad --format value lists the choices', () => {
        const r = detent('check', '--format', 'xml', 'examples');
        expect(r.status).toBe(2);
        expect(r.stderr).toContain('one of: text, json, sarif');
        oneLine(r);
    });
});

describe('JSON', () => {
    test('exactly {"files":[{"path","diagnostics":[{"code","severity","message","range","state","signal","witness"}]}]} with 0-based LSP ranges', () => {
        const path = join('examples', 'defects', 'duplicate-name.detent');
        const text = readFileSync(join(root, path), 'utf8');
        const r = detent('check', '--format', 'json', path);
        expect(r.status).toBe(1);
        const json = JSON.parse(r.stdout) as Record<string, unknown>;
        expect(Object.keys(json)).toEqual(['files']);
        const files = json.files as Record<string, unknown>[];
        expect(Object.keys(files[0]!).sort()).toEqual(['diagnostics', 'path']);
        expect(files[0]!.path).toBe(path);
        const d = (files[0]!.diagnostics as Record<string, unknown>[])[0]!;
        expect(Object.keys(d).sort()).toEqual(['code', 'message', 'range', 'severity', 'signal', 'state', 'witness']);
        // 0-based position of `Valve` in `output valve, Valve;`, computed from the text
        const offset = text.indexOf('Valve;');
        const line = text.slice(0, offset).split('\n').length - 1;
        const character = offset - (text.lastIndexOf('\n', offset) + 1);
        expect(d).toEqual({
            code: 'duplicate-name', severity: 'error', message: expect.stringContaining('only in case'),
            range: { start: { line, character }, end: { line, character: character + 5 } },
            state: null, signal: 'Valve', witness: null,
        });
    });
});

describe('SARIF', () => {
    function validator() {
        // The OASIS SARIF 2.1.0 schema (Committee Specification text, JSON Schema draft-07). Ajv 8's
        // default export implements draft-07, and with ajv's default strictness the schema compiles
        // unchanged: no keyword is removed and strict mode is not switched off.
        const schema = JSON.parse(readFileSync(join(root, 'tests', 'fixtures', 'sarif-schema-2.1.0.json'), 'utf8')) as Record<string, unknown>;
        expect(schema.$schema).toBe('http://json-schema.org/draft-07/schema#');
        const ajv = new Ajv({ allErrors: true });
        // ajv itself ships no format checks (ajv-formats is not installed): the schema's three formats
        // are checked with the WHATWG URL parser and an RFC 3339 date-time pattern (from memory)
        ajv.addFormat('uri', (s: string) => URL.canParse(s));
        ajv.addFormat('uri-reference', (s: string) => URL.canParse(s, 'file:///'));
        ajv.addFormat('date-time', /^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d(\.\d+)?(Z|[+-]\d\d:\d\d)$/i);
        return ajv.compile(schema);
    }

    type Log = { version: string; runs: { tool: { driver: { rules: { id: string }[] } }; results: { ruleId: string; level: string; message?: unknown; locations: { physicalLocation: { region: { startLine: number } } }[]; properties: Record<string, unknown> }[] }[] };

    function sarifOf(...paths: string[]): { status: number | null; log: Log } {
        const r = detent('check', '--format', 'sarif', ...paths);
        return { status: r.status, log: JSON.parse(r.stdout) as Log };
    }

    test('valid SARIF 2.1.0 for a run with results of every severity, related locations and witnesses', () => {
        const { status, log } = sarifOf(join('examples', 'defects'), join('examples', 'sump-pump.detent'));
        expect(status).toBe(1);
        const validate = validator();
        const ok = validate(log);
        expect(validate.errors ?? []).toEqual([]);
        expect(ok).toBe(true);
        expect(log.version).toBe('2.1.0');
        const run = log.runs[0]!;
        const ruleIds = run.tool.driver.rules.map((x) => x.id);
        for (const res of run.results) expect(ruleIds).toContain(res.ruleId);
        expect(new Set(run.results.map((x) => x.level))).toEqual(new Set(['error', 'warning', 'note']));
        expect(run.results.every((x) => x.locations[0]!.physicalLocation.region.startLine >= 1)).toBe(true);
    });

    test('the validator is not vacuous: it rejects a broken log', () => {
        const validate = validator();
        expect(validate({ version: '2.1.0', runs: [{ tool: { driver: {} }, results: [] }] })).toBe(false);
        expect(validate({ version: '2.0.0', runs: [] })).toBe(false);
    });

    test('a result without `message` is rejected (SARIF 2.1.0: result.message is required)', () => {
        const validate = validator();
        const { log } = sarifOf(join('examples', 'defects', 'overlap.detent'));
        expect(validate(log)).toBe(true);
        delete log.runs[0]!.results[0]!.message;
        expect(validate(log)).toBe(false);
        expect(validate.errors).toContainEqual(expect.objectContaining({
            instancePath: '/runs/0/results/0', keyword: 'required', params: { missingProperty: 'message' },
        }));
    });

    test('a region with a 0 line (SARIF lines are 1-based) is rejected', () => {
        const validate = validator();
        const { log } = sarifOf(join('examples', 'defects', 'overlap.detent'));
        log.runs[0]!.results[0]!.locations[0]!.physicalLocation.region.startLine = 0;
        expect(validate(log)).toBe(false);
    });
});

describe('.detentignore (folder recursion only)', () => {
    const machine = 'machine M { reset r -> A1; input go; output lit; state A1 { when go -> B1; otherwise stay; } state B1 { emit lit; when !go -> A1; otherwise stay; } }\n';

    function tree(name: string, files: readonly string[], ignores: Readonly<Record<string, string>>): string {
        const dir = join(work, name);
        for (const f of files) {
            mkdirSync(join(dir, f, '..'), { recursive: true });
            writeFileSync(join(dir, f), machine);
        }
        for (const [folder, text] of Object.entries(ignores)) {
            mkdirSync(join(dir, folder), { recursive: true });
            writeFileSync(join(dir, folder, '.detentignore'), text);
        }
        return dir;
    }

    function jsonPaths(stdout: string): string[] {
        return (JSON.parse(stdout) as { files: { path: string }[] }).files.map((f) => f.path);
    }

    test('`detent check examples`: exit 0, no error line; every defect file counted as skipped', () => {
        const r = detent('check', 'examples');
        expect(r.status).toBe(0);
        expect(r.stdout.split('\n').filter((l) => / error /.test(l))).toEqual([]);
        // the count comes from the file system, not from our output
        const defects = readdirSync(join(root, 'examples', 'defects')).filter((f) => f.endsWith('.detent')).length;
        expect(defects).toBeGreaterThan(0);
        expect(r.stderr).toMatch(new RegExp(`^\\d+ files checked: 0 errors, .*; ${defects} files skipped by \\.detentignore\\n$`));
    });

    test('named paths are always checked: `detent check examples/defects` and one defect file exit 1', () => {
        const folder = detent('check', join('examples', 'defects'));
        expect(folder.status).toBe(1);
        expect(folder.stderr).not.toContain('skipped');
        const file = detent('check', join('examples', 'defects', 'overlap.detent'));
        expect(file.status).toBe(1);
        expect(file.stdout).toContain(' error overlap: ');
    });

    test('globs (* and ?), folder-only patterns, nested ignore files, comments, CRLF lines', () => {
        const dir = tree('ignore-tree', [
            'keep.detent', 'skip.detent', 'draft-1.detent', 'draft-10.detent', 'a.wip.detent', 'archive.detent',
            join('archive', 'old1.detent'), join('archive', 'old2.detent'), join('build', 'gen.detent'),
            join('sub', 'x.detent'), join('sub', 'b.wip.detent'), join('sub', 'c.detent'),
            join('sub', 'deep', 'x.detent'), join('sub', 'deep', 'y.detent'), join('node_modules', 'n.detent'),
        ], {
            '.': [
                '# skip.detent is only named in this comment, so it is still checked',
                '',
                '   # an indented comment',
                'draft-?.detent',
                '*.wip.detent',
                'arch*/',
                'build',
                'sub/deep/x.detent',
            ].join('\n'),
            sub: 'c.detent\r\n# CRLF line endings\r\n',
        });
        const r = detent('check', '--format', 'json', dir);
        expect(r.status).toBe(0);
        // expected by reading the rules above: `?` is one character (draft-10 stays), `*` stops at `/`
        // (sub/b.wip stays), `arch*/` skips the folder but not archive.detent, `build` skips the folder,
        // a slash pattern is relative to its own folder (sub/x stays), sub/.detentignore skips sub/c
        expect(jsonPaths(r.stdout)).toEqual([
            'archive.detent', 'draft-10.detent', 'keep.detent', 'skip.detent',
            join('sub', 'b.wip.detent'), join('sub', 'deep', 'y.detent'), join('sub', 'x.detent'),
        ].map((f) => join(dir, f)));
        // skipped: draft-1, a.wip, archive/old1, archive/old2, build/gen, sub/deep/x, sub/c (node_modules is not counted)
        expect(r.stderr).toBe('detent check: 7 files skipped by .detentignore\n');
        const text = detent('check', dir);
        expect(text.stderr).toBe('7 files checked: 0 errors, 0 warnings, 0 info; 7 files skipped by .detentignore\n');
    });

    test('an ignored file or folder named on the command line is checked', () => {
        const dir = tree('ignore-explicit', ['keep.detent', 'draft-1.detent', join('vendor', 'v.detent')], { '.': 'draft-?.detent\nvendor/\n' });
        const file = detent('check', '--format', 'json', join(dir, 'draft-1.detent'));
        expect(jsonPaths(file.stdout)).toEqual([join(dir, 'draft-1.detent')]);
        const folder = detent('check', '--format', 'json', join(dir, 'vendor'));
        expect(jsonPaths(folder.stdout)).toEqual([join(dir, 'vendor', 'v.detent')]);
        expect(folder.stderr).toBe('');
    });

    test('a folder whose every file is ignored: exit 2, saying how many were skipped', () => {
        const dir = tree('ignore-all', ['a.detent', 'b.detent'], { '.': '*.detent\n' });
        const r = detent('check', dir);
        expect(r.status).toBe(2);
        expect(r.stderr).toBe(`detent check: ${dir}: no .detent files to check (2 files skipped by .detentignore)\n`);
    });

    test("a '!' (re-include) line is refused with its line number, exit 2", () => {
        const dir = tree('ignore-bang', ['a.detent'], { '.': '# fine\n*.detent\n!a.detent\n' });
        const r = detent('check', dir);
        expect(r.status).toBe(2);
        expect(r.stderr).toBe(`detent check: ${join(dir, '.detentignore')}:3: '!' (re-include) is not supported; list only what to skip\n`);
    });

    test('`detent test` walks folders the same way', () => {
        const all = detent('test', 'examples');
        expect(all.status).toBe(0);
        expect(all.stdout).not.toContain('defects');
        expect(detent('test', join('examples', 'defects')).status).toBe(1);
    });
});
