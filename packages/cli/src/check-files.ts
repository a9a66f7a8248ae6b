/**
 * Which files `detent check` reads, and reading them: folders recurse into `*.detent` (sorted,
 * skipping node_modules and .git); a file that is missing, unreadable or not UTF-8 is a usage/I-O
 * error (exit 2) with a one-line message.
 */
import { readFileSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { UsageError } from './io.js';

const SKIPPED_FOLDERS = new Set(['node_modules', '.git']);

export interface SourceFile {
    readonly path: string;
    readonly text: string;
}

/** Expands the command-line paths to the list of files to check, in a stable order. */
export function collectFiles(command: string, paths: readonly string[]): string[] {
    const files: string[] = [];
    for (const path of paths) {
        let stats;
        try {
            stats = statSync(path);
        } catch (err) {
            throw new UsageError(`detent ${command}: ${path}: ${describe(err, 'no such file or folder')}`);
        }
        if (stats.isDirectory()) {
            const found = findDetentFiles(command, path);
            if (found.length === 0) throw new UsageError(`detent ${command}: ${path}: no .detent files in this folder`);
            files.push(...found);
        } else {
            files.push(path);
        }
    }
    return [...new Set(files)];
}

function findDetentFiles(command: string, folder: string): string[] {
    let entries;
    try {
        entries = readdirSync(folder, { withFileTypes: true });
    } catch (err) {
        throw new UsageError(`detent ${command}: ${folder}: ${describe(err, 'cannot read folder')}`);
    }
    const names = entries.map((e) => e.name).sort();
    const found: string[] = [];
    for (const name of names) {
        const entry = entries.find((e) => e.name === name)!;
        const path = join(folder, name);
        if (entry.isDirectory()) {
            if (!SKIPPED_FOLDERS.has(name)) found.push(...findDetentFiles(command, path));
        } else if (name.endsWith('.detent') && (entry.isFile() || entry.isSymbolicLink())) {
            found.push(path);
        }
    }
    return found;
}

const utf8 = new TextDecoder('utf-8', { fatal: true });

export function readSource(command: string, path: string): SourceFile {
    let bytes: Buffer;
    try {
        bytes = readFileSync(path);
    } catch (err) {
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
