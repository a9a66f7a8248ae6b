/**
 * Which files `detent check` / `detent test` read, and reading them: folders recurse into
 * `*.detent` (sorted, skipping node_modules, .git and what a `.detentignore` lists); a file that
 * is missing, unreadable or not UTF-8 is a usage/I-O error (exit 2) with a one-line message.
 *
 * `.detentignore` (in any folder the walk enters): one pattern per line, relative to that folder;
 * blank lines and lines starting with `#` are skipped; `*` matches any run of characters except
 * `/`, `?` one such character; a trailing `/` matches folders only. Paths named on the command
 * line are always read, whatever an ignore file says — the file only steers folder recursion.
 */
import { readFileSync, readdirSync, statSync, type Dirent } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { UsageError } from './io.js';

const SKIPPED_FOLDERS = new Set(['node_modules', '.git']);

/** Name of the per-folder ignore file. */
export const IGNORE_FILE = '.detentignore';

export interface SourceFile {
    readonly path: string;
    readonly text: string;
}

export interface CollectedFiles {
    /** Files to read, in a stable order, without duplicates. */
    readonly files: string[];
    /** `.detent` files left out by a `.detentignore` (those inside ignored folders included). */
    readonly ignored: number;
}

/** Expands the command-line paths to the list of files to check, in a stable order. */
export function collectFiles(command: string, paths: readonly string[]): string[] {
    return collectFilesWithIgnored(command, paths).files;
}

/** Like `collectFiles`, and also counts what `.detentignore` files left out, so callers can say so. */
export function collectFilesWithIgnored(command: string, paths: readonly string[]): CollectedFiles {
    const files: string[] = [];
    let ignored = 0;
    for (const path of paths) {
        let stats;
        try {
            stats = statSync(path);
        } catch (err) {
            throw new UsageError(`detent ${command}: ${path}: ${describe(err, 'no such file or folder')}`);
        }
        if (stats.isDirectory()) {
            const walk: Walk = { command, found: [], ignored: 0 };
            findDetentFiles(walk, path, []);
            if (walk.found.length === 0) {
                const why = walk.ignored > 0 ? `no .detent files to check (${plural(walk.ignored, 'file')} skipped by ${IGNORE_FILE})` : 'no .detent files in this folder';
                throw new UsageError(`detent ${command}: ${path}: ${why}`);
            }
            files.push(...walk.found);
            ignored += walk.ignored;
        } else {
            files.push(path);
        }
    }
    return { files: [...new Set(files)], ignored };
}

interface Walk {
    readonly command: string;
    readonly found: string[];
    ignored: number;
}

/** The patterns of one `.detentignore`, matched against paths relative to `base`. */
interface IgnoreRules {
    readonly base: string;
    readonly patterns: readonly IgnorePattern[];
}

interface IgnorePattern {
    readonly regex: RegExp;
    readonly foldersOnly: boolean;
}

function findDetentFiles(walk: Walk, folder: string, inherited: readonly IgnoreRules[]): void {
    const entries = readFolder(walk.command, folder);
    const ignoreEntry = entries.find((e) => e.name === IGNORE_FILE && (e.isFile() || e.isSymbolicLink()));
    const rules = ignoreEntry ? [...inherited, readIgnoreFile(walk.command, folder)] : inherited;
    for (const entry of entries) {
        const path = join(folder, entry.name);
        if (entry.isDirectory()) {
            if (SKIPPED_FOLDERS.has(entry.name)) continue;
            if (isIgnored(rules, path, true)) walk.ignored += countDetentFiles(path);
            else findDetentFiles(walk, path, rules);
        } else if (isDetentFile(entry)) {
            if (isIgnored(rules, path, false)) walk.ignored++;
            else walk.found.push(path);
        }
    }
}

function readFolder(command: string, folder: string): Dirent[] {
    let entries: Dirent[];
    try {
        entries = readdirSync(folder, { withFileTypes: true });
    } catch (err) {
        throw new UsageError(`detent ${command}: ${folder}: ${describe(err, 'cannot read folder')}`);
    }
    // code-unit order, not locale order, so every machine lists the same sequence
    return entries.sort((a, b) => (a.name < b.name ? -1 : a.name > b.name ? 1 : 0));
}

function isDetentFile(entry: Dirent): boolean {
    return entry.name.endsWith('.detent') && (entry.isFile() || entry.isSymbolicLink());
}

/** Counts the `.detent` files under an ignored folder (best effort: an unreadable folder counts 0). */
function countDetentFiles(folder: string): number {
    let entries: Dirent[];
    try {
        entries = readdirSync(folder, { withFileTypes: true });
    } catch {
        return 0;
    }
    let n = 0;
    for (const entry of entries) {
        if (entry.isDirectory()) {
            if (!SKIPPED_FOLDERS.has(entry.name)) n += countDetentFiles(join(folder, entry.name));
        } else if (isDetentFile(entry)) {
            n++;
        }
    }
    return n;
}

function isIgnored(rules: readonly IgnoreRules[], path: string, isFolder: boolean): boolean {
    for (const r of rules) {
        const rel = relative(r.base, path).split(sep).join('/');
        if (r.patterns.some((p) => (isFolder || !p.foldersOnly) && p.regex.test(rel))) return true;
    }
    return false;
}

function readIgnoreFile(command: string, folder: string): IgnoreRules {
    const path = join(folder, IGNORE_FILE);
    const text = readSource(command, path).text;
    const patterns: IgnorePattern[] = [];
    text.split('\n').forEach((raw, index) => {
        const line = raw.trim();
        if (line === '' || line.startsWith('#')) return;
        const where = `detent ${command}: ${path}:${index + 1}`;
        if (line.startsWith('!')) throw new UsageError(`${where}: '!' (re-include) is not supported; list only what to skip`);
        const foldersOnly = line.endsWith('/');
        // a leading `/` changes nothing (patterns are relative to this folder already)
        const glob = line.replace(/\/+$/, '').replace(/^\/+/, '');
        if (glob === '') throw new UsageError(`${where}: empty pattern '${line}'`);
        patterns.push({ regex: globToRegExp(glob), foldersOnly });
    });
    return { base: folder, patterns };
}

/** `*` → any run of non-`/` characters, `?` → one non-`/` character, everything else literal. */
function globToRegExp(glob: string): RegExp {
    let source = '';
    for (const ch of glob) {
        if (ch === '*') source += '[^/]*';
        else if (ch === '?') source += '[^/]';
        else source += ch.replace(/[.+^${}()|[\]\\]/g, '\\$&');
    }
    return new RegExp(`^${source}$`, 'u');
}

function plural(n: number, word: string): string {
    return `${n} ${word}${n === 1 ? '' : 's'}`;
}

const utf8 = new TextDecoder('utf-8', { fatal: true });

/** Bytes read from one file at most; the parser refuses far less (docs/limits.md), this only bounds memory. */
export const MAX_FILE_BYTES = 16 * 1024 * 1024;

export function readSource(command: string, path: string): SourceFile {
    let bytes: Buffer;
    try {
        // A FIFO or a device would block readFileSync forever (or never end): only regular files.
        const stats = statSync(path);
        if (stats.isDirectory()) throw Object.assign(new Error('is a folder'), { code: 'EISDIR' });
        if (!stats.isFile()) throw new UsageError(`detent ${command}: ${path}: not a regular file`);
        if (stats.size > MAX_FILE_BYTES) throw new UsageError(`detent ${command}: ${path}: ${stats.size} bytes; Detent reads files of up to ${MAX_FILE_BYTES} bytes`);
        bytes = readFileSync(path);
    } catch (err) {
        if (err instanceof UsageError) throw err;
        throw new UsageError(`detent ${command}: ${path}: ${describe(err, 'cannot read file')}`);
    }
    let text: string;
    try {
        text = utf8.decode(bytes);
    } catch {
        throw new UsageError(`detent ${command}: ${path}: not UTF-8 text`);
    }
    if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
    return { path, text };
}

function describe(err: unknown, fallback: string): string {
    const code = (err as { code?: string } | undefined)?.code;
    switch (code) {
        case 'ENOENT': return 'no such file or folder';
        case 'EACCES':
        case 'EPERM': return 'permission denied';
        case 'EISDIR': return 'is a folder';
        case 'ENOTDIR': return 'not a folder';
        default: return fallback;
    }
}
