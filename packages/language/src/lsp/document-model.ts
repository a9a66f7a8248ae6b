/**
 * What the editor features know about a document: each machine's AST node, its lowered core model,
 * and (on demand, time-budgeted, cached until the document changes) its synthesis under the
 * encoding and flip-flop the settings select. Every provider goes through this service, so a
 * hover, a lens and a request on the same text never synthesize the same machine twice.
 */
import { AstUtils, CstUtils, DocumentCache, type LangiumDocument } from 'langium';
import {
    type BehaviourTable, type EncodingKind, type FlipFlopKind, type Machine, type SynthesisResult,
    ENCODING_KINDS, FLIPFLOP_KINDS, behaviourTable, inputVariables, synthesize,
} from '@detent/core';
import * as ast from '../generated/ast.js';
import { lowerMachine } from '../lowering/lower-machine.js';
import { modelLimitFindings } from '../syntax/model-limits.js';
import type { DetentServices } from '../detent-module.js';
import type { DetentSettingsStore } from './settings.js';

export interface MachineEntry {
    readonly node: ast.Machine;
    /** Position among the document's machines. */
    readonly index: number;
    readonly machine: Machine;
    /** True when lowering found errors that make analyses and synthesis meaningless. */
    readonly blocked: boolean;
}

export interface SynthesisOutcome {
    readonly result?: SynthesisResult;
    /** Why there is no result, in words for the user. */
    readonly note?: string;
    readonly encoding: EncodingKind;
    readonly flipflop: FlipFlopKind;
}

/** Wall-clock budget for one synthesis made for the editor (hover, lens, equations). */
export const EDITOR_SYNTHESIS_BUDGET_MS = 400;

export class DetentDocumentModel {
    private readonly lowered: DocumentCache<string, MachineEntry[]>;
    private readonly synthesized: DocumentCache<string, SynthesisOutcome>;
    private readonly tables: DocumentCache<number, BehaviourTable | undefined>;

    constructor(services: DetentServices, private readonly settings: DetentSettingsStore) {
        this.lowered = new DocumentCache(services.shared);
        this.synthesized = new DocumentCache(services.shared);
        this.tables = new DocumentCache(services.shared);
        // A settings change alters what "the active encoding" means: forget every synthesis.
        settings.onDidChange(() => this.synthesized.clear());
    }

    machines(document: LangiumDocument): MachineEntry[] {
        return this.lowered.get(document.uri, 'machines', () => {
            const root = document.parseResult.value;
            if (!ast.isModel(root)) return [];
            const text = document.textDocument.getText();
            return root.machines.map((node, index) => {
                const { machine, ctx } = lowerMachine(node, text);
                // past a size limit (docs/limits.md) synthesis and tables would hang the server
                return { node, index, machine, blocked: ctx.blocked || modelLimitFindings(machine).length > 0 };
            });
        });
    }

    machineNamed(document: LangiumDocument, name: string): MachineEntry | undefined {
        return this.machines(document).find((m) => m.machine.name === name);
    }

    /** The machine whose text contains the offset (or the first one when the offset is outside every machine). */
    machineAt(document: LangiumDocument, offset: number): MachineEntry | undefined {
        const machines = this.machines(document);
        const root = document.parseResult.value.$cstNode;
        const leaf = root ? CstUtils.findLeafNodeAtOffset(root, offset) : undefined;
        const node = leaf ? AstUtils.getContainerOfType(leaf.astNode, ast.isMachine) : undefined;
        return machines.find((m) => m.node === node) ?? machines[0];
    }

    /** Encoding and flip-flop the editor shows: the settings, or the machine's own ('machine'). */
    activeChoice(machine: Machine): { encoding: EncodingKind; flipflop: FlipFlopKind } {
        const s = this.settings.settings;
        const encoding = (ENCODING_KINDS as readonly string[]).includes(s.encoding) ? s.encoding as EncodingKind : machine.encoding;
        const flipflop = (FLIPFLOP_KINDS as readonly string[]).includes(s.flipflop) ? s.flipflop as FlipFlopKind : machine.flipflop;
        // An explicit encoding without codes cannot be synthesized: fall back to the declaration.
        if (encoding === 'explicit' && machine.states.some((st) => !st.code)) return { encoding: machine.encoding, flipflop };
        return { encoding, flipflop };
    }

    synthesis(document: LangiumDocument, entry: MachineEntry, choice?: { encoding?: EncodingKind; flipflop?: FlipFlopKind }): SynthesisOutcome {
        const active = this.activeChoice(entry.machine);
        const encoding = choice?.encoding ?? active.encoding;
        const flipflop = choice?.flipflop ?? active.flipflop;
        return this.synthesized.get(document.uri, `${entry.index}|${encoding}|${flipflop}`, () => {
            if (entry.blocked) return { encoding, flipflop, note: 'No synthesis: fix the errors in this machine first.' };
            if (entry.machine.states.length === 0) return { encoding, flipflop, note: 'No synthesis: the machine has no states.' };
            try {
                const result = synthesize(entry.machine, { encoding, flipflop, budgetMs: EDITOR_SYNTHESIS_BUDGET_MS });
                return { encoding, flipflop, result };
            } catch (err) {
                return { encoding, flipflop, note: `No synthesis: ${err instanceof Error ? err.message : String(err)}` };
            }
        });
    }

    /** The next-state/output table (no state assignment needed). */
    table(document: LangiumDocument, entry: MachineEntry): BehaviourTable | undefined {
        return this.tables.get(document.uri, entry.index, () => {
            if (entry.blocked) return undefined;
            try {
                return behaviourTable(entry.machine, inputVariables(entry.machine).length);
            } catch {
                return undefined;
            }
        });
    }
}
