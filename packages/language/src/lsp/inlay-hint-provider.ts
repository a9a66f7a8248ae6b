/**
 * Inlay hints: each state's code under the active encoding, after the state's name
 * (`state Idle = 001 {`), so a designer sees the assignment while editing transitions.
 */
import type { LangiumDocument } from 'langium';
import type { InlayHintProvider, LangiumServices } from 'langium/lsp';
import { type InlayHint, type InlayHintParams, InlayHintKind } from 'vscode-languageserver-protocol';
import type { DetentDocumentModel } from './document-model.js';
import { failSoft } from './fail-soft.js';

export class DetentInlayHintProvider implements InlayHintProvider {
    constructor(private readonly services: LangiumServices, private readonly model: DetentDocumentModel) {}

    getInlayHints(document: LangiumDocument, params: InlayHintParams): Promise<InlayHint[]> {
        return failSoft(this.services, 'inlay hints', [], () => {
            const hints: InlayHint[] = [];
            const { start, end } = params.range;
            for (const entry of this.model.machines(document)) {
                if (entry.machine.range.end.line < start.line || entry.machine.range.start.line > end.line) continue;
                const outcome = this.model.synthesis(document, entry);
                const codes = outcome.result?.assignment.codes;
                if (!codes) continue;
                entry.machine.states.forEach((state, i) => {
                    const code = codes[i];
                    if (code === undefined || state.nameRange.end.line < start.line || state.nameRange.end.line > end.line) return;
                    hints.push({
                        position: state.nameRange.end,
                        label: `= ${code}`,
                        kind: InlayHintKind.Type,
                        paddingLeft: true,
                        tooltip: `code of ${state.name} (${outcome.encoding} encoding, bit q0 rightmost)`,
                    });
                });
            }
            return hints;
        });
    }
}
