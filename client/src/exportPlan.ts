// Decisions of the Export command that need no VS Code: where the files go and which existing
// files may be overwritten. Kept pure so unit tests reach them.
import * as path from 'node:path';
import { GENERATED_PHRASE as CORE_GENERATED_PHRASE, isDetentGenerated } from '../../packages/core/src/export/common.js';

/** Every exporter starts its files with a comment line carrying this phrase (core's export/common.ts). */
export const GENERATED_PHRASE: string = CORE_GENERATED_PHRASE;

/**
 * True when `existing` (a file's text) carries Detent's generated-file header. The rule is core's
 * (`isDetentGenerated`: the phrase in the first lines), so the editor and `detent export` agree on
 * which files they may overwrite.
 */
export function hasGeneratedHeader(existing: string): boolean {
    return isDetentGenerated(existing.replace(/^\uFEFF/, ''));
}

/**
 * The export folder: `setting` empty → beside the machine file; absolute → itself; relative → from
 * the workspace folder (or, without one, from the machine file's folder). `${workspaceFolder}` is expanded.
 */
export function resolveExportFolder(machineFile: string, setting: string | undefined, workspaceFolder: string | undefined): string {
    const beside = path.dirname(machineFile);
    const raw = (setting ?? '').trim();
    if (raw === '') return beside;
    const base = workspaceFolder ?? beside;
    const expanded = raw.replace(/\$\{workspaceFolder\}/g, base);
    return path.isAbsolute(expanded) ? path.normalize(expanded) : path.resolve(base, expanded);
}

/** A generated file name must stay inside the export folder. */
export function safeJoin(folder: string, name: string): string | undefined {
    if (name === '' || path.isAbsolute(name) || name.split(/[\\/]/).includes('..')) return undefined;
    const full = path.resolve(folder, name);
    const rel = path.relative(folder, full);
    return rel.startsWith('..') || path.isAbsolute(rel) ? undefined : full;
}

export interface PlannedFile { name: string; target: string; content: string; exists: boolean }
export interface ExportPlan { write: PlannedFile[]; refused: { target: string; reason: string }[] }

/**
 * Splits the server's files into those that may be written and those refused. `readExisting`
 * returns the file's text, or undefined when there is none.
 */
export function planExport(folder: string, files: { name: string; content: string }[], readExisting: (target: string) => string | undefined): ExportPlan {
    const plan: ExportPlan = { write: [], refused: [] };
    for (const f of files) {
        const target = safeJoin(folder, f.name);
        if (!target) {
            plan.refused.push({ target: f.name, reason: 'the name leaves the export folder' });
            continue;
        }
        const existing = readExisting(target);
        if (existing !== undefined && !hasGeneratedHeader(existing)) {
            plan.refused.push({ target, reason: `it exists and does not start with the "${GENERATED_PHRASE}" header` });
            continue;
        }
        plan.write.push({ name: f.name, target, content: f.content, exists: existing !== undefined });
    }
    return plan;
}
