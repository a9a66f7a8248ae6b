/**
 * Error paths of the `detent` command line, through the built bundle (node scripts/build.mjs):
 * exit codes 0/1/2 as LANGUAGE.md "Command line" specifies, one-line messages, never a stack
 * trace; export's no-clobber rule, --force, path confinement and atomic writes.
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { spawn, spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdirSync, mkdtempSync, readFileSync, readdirSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { confinedPath, writeAtomic } from '../../packages/cli/src/commands/export.js';

const root = join(__dirname, '..', '..');
const bin = join(root, 'packages', 'cli', 'bin', 'detent.js');
const work = mkdtempSync(join(tmpdir(), 'detent-cli-robust-'));

function detent(...args: string[]) {
    const r = spawnSync(process.execPath, [bin, ...args], { cwd: work, encoding: 'utf8', timeout: 60_000 });
    return { status: r.status, stdout: r.stdout, stderr: r.stderr, signal: r.signal };
}

/** A V8 stack frame line (`    at fn (file:1:2)`): never shown to a user. */
const STACK = /^\s+at .+(:\d+:\d+\)?|\(native\))$/m;

function expectUsage(r: ReturnType<typeof detent>, message: RegExp) {
    expect(r.signal).toBeNull();
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(message);
    expect(r.stderr).not.toMatch(STACK);
    expect(r.stderr.trim().split('\n').length).toBeLessThanOrEqual(2);
}

const GOOD = `machine Latch {
    clock clk;
    reset rst -> Dark;
    input set_btn, clear_btn;
    output lamp;
    state Dark { when set_btn & !clear_btn -> Lit; otherwise stay; }
    state Lit { emit lamp; when clear_btn -> Dark; otherwise stay; }
}
`;

beforeAll(() => {
    if (!existsSync(join(root, 'packages', 'cli', 'dist', 'detent.mjs'))) spawnSync(process.execPath, [join(root, 'scripts', 'build.mjs')], { stdio: 'inherit' });
    writeFileSync(join(work, 'good.detent'), GOOD);
    writeFileSync(join(work, 'bad.detent'), GOOD.replace('-> Lit;', '-> Nowhere;'));
});

describe('I/O errors exit 2 with one line', () => {
    test('missing path', () => {
        expectUsage(detent('check', 'missing.detent'), /missing\.detent: no such file/);
        expectUsage(detent('synth', 'missing.detent'), /missing\.detent: no such file/);
        expectUsage(detent('export', 'missing.detent', '--to', 'verilog'), /missing\.detent: no such file/);
    });

    test('a folder where a FILE is expected', () => {
        mkdirSync(join(work, 'folder.detent'), { recursive: true });
        expectUsage(detent('synth', 'folder.detent'), /is a folder/);
        expectUsage(detent('export', 'folder.detent', '--to', 'vhdl'), /is a folder/);
    });

    test('a FIFO does not block the reader (reads would wait for a writer forever)', () => {
        const fifo = join(work, 'pipe.detent');
        if (!existsSync(fifo)) spawnSync('mkfifo', [fifo]);
        if (!existsSync(fifo)) return; // mkfifo missing: nothing to test on this host
        expectUsage(detent('check', fifo), /not a regular file/);
        expectUsage(detent('synth', fifo), /not a regular file/);
    });

    test('sim and test: missing or blocking stimulus and sources', () => {
        const fifo = join(work, 'pipe.detent');
        if (!existsSync(fifo)) spawnSync('mkfifo', [fifo]);
        expectUsage(detent('sim', 'good.detent', '--stimulus', 'missing.stim'), /missing\.stim: no such file/);
        if (existsSync(fifo)) expectUsage(detent('sim', 'good.detent', '--stimulus', fifo), /not a regular file/);
        expectUsage(detent('test', 'missing.detent'), /missing\.detent: no such file/);
        expectUsage(detent('sim', 'good.detent', '--stimulus'), /needs a value/);
    });

    test('an unreadable file', () => {
        const locked = join(work, 'locked.detent');
        writeFileSync(locked, GOOD);
        chmodSync(locked, 0o000);
        let readable = true;
        try { readFileSync(locked); } catch { readable = false; }
        if (readable) return; // running as root: permissions do not block reads (covered by the FIFO and folder cases)
        expectUsage(detent('check', locked), /permission denied/);
    });

    test('text that is not UTF-8', () => {
        writeFileSync(join(work, 'latin1.detent'), Buffer.from([0x6d, 0x61, 0x63, 0x68, 0x69, 0x6e, 0x65, 0x20, 0xe9, 0xff, 0xfe, 0x0a]));
        expectUsage(detent('check', 'latin1.detent'), /not UTF-8/);
        expectUsage(detent('synth', 'latin1.detent'), /not UTF-8/);
    });

    test('a folder without machines', () => {
        mkdirSync(join(work, 'empty'), { recursive: true });
        writeFileSync(join(work, 'empty', 'notes.txt'), 'no machines here\n');
        expectUsage(detent('check', 'empty'), /empty: no \.detent files/);
    });

    test('a file without a machine', () => {
        writeFileSync(join(work, 'comment.detent'), '// nothing yet\n');
        expectUsage(detent('synth', 'comment.detent'), /no machine in this file/);
    });
});

describe('usage errors list the valid choices', () => {
    test('unknown command', () => expectUsage(detent('frobnicate'), /unknown command 'frobnicate' \(valid: .*check.*synth.*export/));
    test('unknown flag', () => expectUsage(detent('check', '--colour', 'good.detent'), /unknown option '--colour' \(valid: .*--format/));
    test('unknown short flag', () => expectUsage(detent('export', 'good.detent', '-z'), /unknown option '-z' \(valid: .*--to/));
    test('unknown value', () => {
        expectUsage(detent('check', '--format', 'xml', 'good.detent'), /'xml'.*one of: text, json, sarif/);
        expectUsage(detent('export', 'good.detent', '--to', 'pascal'), /'pascal'.*one of: verilog, systemverilog, vhdl, c, dot/);
        expectUsage(detent('synth', 'good.detent', '--encoding', 'random'), /'random'.*one of: .*binary.*onehot/);
    });
    test('a value missing at the end', () => expectUsage(detent('synth', 'good.detent', '--flipflop'), /needs a value \(one of: D, T, JK, SR\)/));
    test('missing PATH', () => expectUsage(detent('check'), /missing PATH/));
});

describe('exit codes', () => {
    test('0 without errors, 1 with errors', () => {
        const ok = detent('check', 'good.detent');
        expect(ok.status).toBe(0);
        const bad = detent('check', '--format', 'json', 'bad.detent');
        expect(bad.status).toBe(1);
        const report = JSON.parse(bad.stdout) as { files: { diagnostics: { code: string }[] }[] };
        expect(report.files[0]!.diagnostics.map((d) => d.code)).toContain('unknown-name');
        expect(detent('synth', 'bad.detent').status).toBe(1);
        expect(detent('export', 'bad.detent', '--to', 'verilog', '-o', 'out-bad').status).toBe(1);
        expect(existsSync(join(work, 'out-bad', 'Latch.v'))).toBe(false);
    });

    test('limits are errors with a message, not hangs', () => {
        writeFileSync(join(work, 'deep.detent'), `machine Deep {\n    input a;\n    state S0 { when ${'('.repeat(10_000)}a${')'.repeat(10_000)} -> S0; otherwise stay; }\n}\n`);
        const r = detent('check', 'deep.detent');
        expect(r.status).toBe(1);
        expect(r.stdout).toMatch(/deep\.detent:3:\d+: error syntax: guard nested deeper than \d+ levels/);
        expect(r.stderr).not.toMatch(STACK);
    });
});

describe('export writes safely', () => {
    test('refuses to overwrite a file without the generated header; --force overrides', () => {
        mkdirSync(join(work, 'hdl'), { recursive: true });
        const target = join(work, 'hdl', 'Latch.v');
        writeFileSync(target, '// hand-written, keep\nmodule Latch; endmodule\n');
        const r = detent('export', 'good.detent', '--to', 'verilog', '-o', 'hdl');
        expectUsage(r, /Latch\.v: exists and was not generated by Detent; not overwriting \(use --force\)/);
        expect(readFileSync(target, 'utf8')).toBe('// hand-written, keep\nmodule Latch; endmodule\n');
        const forced = detent('export', 'good.detent', '--to', 'verilog', '-o', 'hdl', '--force');
        expect(forced.status).toBe(0);
        expect(readFileSync(target, 'utf8')).toMatch(/Generated by Detent/);
        // regenerating over our own output needs no --force
        expect(detent('export', 'good.detent', '--to', 'verilog', '-o', 'hdl').status).toBe(0);
        expect(readdirSync(join(work, 'hdl')).filter((n) => n.endsWith('.tmp'))).toEqual([]);
    });

    test('-o naming a file is a usage error', () => {
        writeFileSync(join(work, 'plain-file'), 'x');
        const r = detent('export', 'good.detent', '--to', 'c', '-o', 'plain-file');
        expect(r.status).toBe(2);
        expect(r.stderr).not.toMatch(STACK);
    });

    test('file names cannot leave the output folder', () => {
        const dir = join(work, 'confined');
        for (const name of ['../escape.v', '/etc/passwd', 'a/b.v', '..', '.', 'sub\\x.v', '', 'x\0.v']) {
            expect(() => confinedPath(dir, name), name).toThrow();
        }
        expect(confinedPath(dir, 'Latch.v')).toBe(join(dir, 'Latch.v'));
        // -o with `..` in it is the user's own choice; the files still land inside that folder
        const r = detent('export', 'good.detent', '--to', 'vhdl', '-o', 'nested/../vhd');
        expect(r.status).toBe(0);
        expect(existsSync(join(work, 'vhd', 'Latch.vhd'))).toBe(true);
    });

    test('a failed write leaves the old file intact and no temporary file behind', () => {
        const dir = mkdtempSync(join(work, 'atomic-'));
        const target = join(dir, 'Keep.v');
        writeFileSync(target, 'old contents\n');
        // inject a failure at the temporary write: a folder sits where the temporary file goes
        mkdirSync(join(dir, `.Keep.v.${process.pid}.tmp`));
        expect(() => writeAtomic('export', target, 'new contents\n')).toThrow(/cannot write/);
        expect(readFileSync(target, 'utf8')).toBe('old contents\n');
        // inject a failure at the rename: the target is a non-empty folder
        const folderTarget = join(dir, 'Busy.v');
        mkdirSync(folderTarget);
        writeFileSync(join(folderTarget, 'inside'), 'x');
        expect(() => writeAtomic('export', folderTarget, 'new\n')).toThrow(/cannot write/);
        expect(readFileSync(join(folderTarget, 'inside'), 'utf8')).toBe('x');
        expect(readdirSync(dir).filter((n) => n.endsWith('.tmp') && n !== `.Keep.v.${process.pid}.tmp`)).toEqual([]);
        rmSync(join(dir, `.Keep.v.${process.pid}.tmp`), { recursive: true });
        writeAtomic('export', target, 'new contents\n');
        expect(readFileSync(target, 'utf8')).toBe('new contents\n');
    });

    test('a symlink planted at the temporary name does not redirect the write', () => {
        const dir = mkdtempSync(join(work, 'link-'));
        const victim = join(dir, 'victim.txt');
        writeFileSync(victim, 'precious\n');
        symlinkSync(victim, join(dir, `.Out.v.${process.pid}.tmp`));
        writeAtomic('export', join(dir, 'Out.v'), 'generated\n');
        expect(readFileSync(victim, 'utf8')).toBe('precious\n');
        expect(readFileSync(join(dir, 'Out.v'), 'utf8')).toBe('generated\n');
    });

    test('an export killed at any moment leaves the old file or the whole new one', async () => {
        const states = 200;
        const big = `machine Big {\n    clock clk;\n    reset rst -> S0;\n    input a, b;\n    output y;\n    encoding onehot;\n${Array.from({ length: states }, (_, i) => `    state S${i} { ${i % 3 === 0 ? 'emit y; ' : ''}when a & !b -> S${(i + 1) % states}; when b -> S${(i + 7) % states}; otherwise stay; }`).join('\n')}\n}\n`;
        const dir = mkdtempSync(join(work, 'kill-'));
        writeFileSync(join(dir, 'big.detent'), big);
        const target = join(dir, 'Big.vhd');
        // the whole new file: what an export that is not interrupted writes (same source, same name)
        const refDir = mkdtempSync(join(work, 'kill-ref-'));
        writeFileSync(join(refDir, 'big.detent'), big);
        expect(detent('export', join(refDir, 'big.detent'), '--to', 'vhdl', '--style', 'structural', '-o', refDir).status).toBe(0);
        const whole = readFileSync(join(refDir, 'Big.vhd'), 'utf8');
        const old = '-- Generated by Detent (old run)\n';
        const seen = new Set<string>();
        for (const delay of [50, 150, 300, 450, 600, 800, 1000, 1300, 1700, 2500]) {
            writeFileSync(target, old);
            const child = spawn(process.execPath, [bin, 'export', join(dir, 'big.detent'), '--to', 'vhdl', '--style', 'structural', '-o', dir], { stdio: 'ignore' });
            const exited = new Promise((r) => child.once('exit', r));
            await new Promise((r) => setTimeout(r, delay));
            child.kill('SIGKILL');
            await exited;
            const now = readFileSync(target, 'utf8');
            expect([old, whole], `after SIGKILL at ${delay} ms`).toContain(now);
            seen.add(now === old ? 'old' : 'new');
            expect(readdirSync(dir).filter((n) => n.endsWith('.vhd'))).toEqual(['Big.vhd']);
        }
        process.stdout.write(`kill test: outcomes ${[...seen].join(', ')}\n`);
    }, 60_000);
});
