/**
 * Hover: on a state (declaration or any reference) its code under the active encoding, its
 * documentation, its next-state rows and its slice of the excitation logic; on a signal its
 * width and where it is read and assigned; on a diagnostic's range the witness spelled out.
 */
import { AstUtils, CstUtils, type AstNode, type LangiumDocument } from 'langium';
import type { HoverProvider, LangiumServices } from 'langium/lsp';
import type { Hover, HoverParams, Diagnostic } from 'vscode-languageserver-protocol';
import * as ast from '../generated/ast.js';
import type { DetentDocumentModel, MachineEntry } from './document-model.js';
import { SAFETY_CAUTION, machineHoverMarkdown, stateHoverMarkdown, witnessText } from './machine-text.js';
import { failSoft } from './fail-soft.js';
import type { Witness } from '@detent/core';

/** The declaration a leaf denotes: the node itself when it is a name, the target when it is a reference. */
export function declarationAt(document: LangiumDocument, offset: number): AstNode | undefined {
    const root = document.parseResult.value.$cstNode;
    if (!root) return undefined;
    const leaf = CstUtils.findLeafNodeAtOffset(root, offset) ?? CstUtils.findLeafNodeAtOffset(root, Math.max(0, offset - 1));
    if (!leaf) return undefined;
    const node = leaf.astNode;
    for (const [, value] of Object.entries(node)) {
        if (typeof value === 'object' && value !== null && '$refNode' in value) {
            const ref = value as { $refNode?: { offset: number; end: number }; ref?: AstNode };
            if (ref.$refNode && ref.$refNode.offset <= leaf.offset && leaf.end <= ref.$refNode.end) return ref.ref;
        }
    }
    if ((ast.isState(node) || ast.isInputSignal(node) || ast.isOutputSignal(node) || ast.isMachine(node) || ast.isScenario(node))
        && leaf.grammarSource && (leaf.grammarSource as { $container?: { feature?: string } }).$container?.feature === 'name') return node;
    // A name rule call (`Name returns string`) wraps the token: accept the leaf when it is the node's name text.
    if ((ast.isState(node) || ast.isInputSignal(node) || ast.isOutputSignal(node)) && leaf.text === node.name) return node;
    return undefined;
}

interface Use { readonly line: number; readonly where: string }

function describeUses(uses: readonly Use[]): string {
    if (uses.length === 0) return 'nowhere';
    const byWhere = new Map<string, number[]>();
    for (const u of uses) byWhere.set(u.where, [...(byWhere.get(u.where) ?? []), u.line + 1]);
    return [...byWhere].map(([where, lines]) => `${where} (line${lines.length > 1 ? 's' : ''} ${[...new Set(lines)].join(', ')})`).join('; ');
}

function placeOf(node: AstNode): string {
    const state = AstUtils.getContainerOfType(node, ast.isState);
    if (state) return `state ${state.name}`;
    const scenario = AstUtils.getContainerOfType(node, ast.isScenario);
    if (scenario) return `scenario ${scenario.name}`;
    return 'declarations';
}

/** `width` comes from the lowered model (the declaration's number, already checked). */
export function signalHoverMarkdown(signal: ast.InputSignal | ast.OutputSignal, width: number): string {
    const machine = AstUtils.getContainerOfType(signal, ast.isMachine);
    const reads: Use[] = [];
    const writes: Use[] = [];
    const checks: Use[] = [];
    if (machine) {
        for (const node of AstUtils.streamAllContents(machine)) {
            const line = node.$cstNode?.range.start.line ?? 0;
            if (ast.isSignalGuard(node) && node.signal.ref === signal) reads.push({ line, where: placeOf(node) });
            if (ast.isInputAssignment(node) && node.signal.ref === signal) writes.push({ line, where: placeOf(node) });
            if (ast.isEmitItem(node) && node.output.ref === signal) {
                const kind = ast.isMooreEmit(node.$container) ? 'Moore' : 'Mealy';
                writes.push({ line, where: `${placeOf(node)} (${kind})` });
            }
            if (ast.isOutputExpectation(node) && node.output.ref === signal) checks.push({ line, where: placeOf(node) });
        }
    }
    const parts: string[] = [];
    if (ast.isInputSignal(signal)) {
        const d = signal.$container;
        parts.push(`**input ${signal.name}**${d.width ? ` — ${width}-bit unsigned bus \`${signal.name}[${width - 1}..0]\`` : ' — 1 bit'}${d.async ? ', asynchronous to the clock' : ''}`);
        parts.push(`Read in: ${describeUses(reads)}`);
        parts.push(`Driven by scenarios: ${describeUses(writes)}`);
    } else {
        const d = signal.$container;
        parts.push(`**output ${signal.name}**${d.width ? ` — ${width}-bit bus` : ' — 1 bit'}${d.registered ? ', registered (from a flip-flop)' : ''}`);
        parts.push(`Assigned in: ${describeUses(writes)}`);
        if (checks.length) parts.push(`Checked by: ${describeUses(checks)}`);
    }
    return parts.join('\n\n');
}

function diagnosticHover(diagnostics: readonly Diagnostic[]): string[] {
    return diagnostics.map((d) => {
        const data = d.data as { witness?: Witness } | undefined;
        const witness = witnessText(data?.witness);
        return `**${d.code ?? 'detent'}**: ${d.message}${witness ? `\n\nWitness: ${witness}` : ''}`;
    });
}

function contains(range: Diagnostic['range'], line: number, character: number): boolean {
    if (line < range.start.line || line > range.end.line) return false;
    if (line === range.start.line && character < range.start.character) return false;
    if (line === range.end.line && character > range.end.character) return false;
    return true;
}

export class DetentHoverProvider implements HoverProvider {
    constructor(private readonly services: LangiumServices, private readonly model: DetentDocumentModel) {}

    getHoverContent(document: LangiumDocument, params: HoverParams): Promise<Hover | undefined> {
        return failSoft(this.services, 'hover', undefined, () => this.hover(document, params));
    }

    private hover(document: LangiumDocument, params: HoverParams): Hover | undefined {
        const offset = document.textDocument.offsetAt(params.position);
        const parts: string[] = [];
        const target = declarationAt(document, offset);
        if (target && ast.isState(target)) {
            const entry = this.entryOf(document, target);
            const index = entry?.machine.states.findIndex((s) => s.name === target.name) ?? -1;
            if (entry && index >= 0) {
                const outcome = this.model.synthesis(document, entry);
                parts.push(stateHoverMarkdown({
                    machine: entry.machine, stateIndex: index, synthesis: outcome.result,
                    table: this.model.table(document, entry), synthesisNote: outcome.note,
                }));
            }
        } else if (target && ast.isMachine(target)) {
            const entry = this.model.machines(document).find((m) => m.node === target);
            if (entry) {
                const outcome = this.model.synthesis(document, entry);
                parts.push(machineHoverMarkdown(entry.machine, outcome.result, outcome.note));
            }
        } else if (target && (ast.isInputSignal(target) || ast.isOutputSignal(target))) {
            const entry = this.entryOf(document, target);
            const lowered = ast.isInputSignal(target) ? entry?.machine.inputs.find((i) => i.name === target.name) : entry?.machine.outputs.find((o) => o.name === target.name);
            parts.push(signalHoverMarkdown(target, lowered?.width ?? 1));
        }
        const here = (document.diagnostics ?? []).filter((d) => contains(d.range, params.position.line, params.position.character));
        const diagnosticParts = diagnosticHover(here);
        if (diagnosticParts.length) {
            parts.push(...diagnosticParts);
            if (!parts.some((p) => p.includes(SAFETY_CAUTION))) parts.push(`_${SAFETY_CAUTION}_`);
        }
        if (parts.length === 0) return undefined;
        return { contents: { kind: 'markdown', value: parts.join('\n\n---\n\n') } };
    }

    private entryOf(document: LangiumDocument, node: AstNode): MachineEntry | undefined {
        const machineNode = AstUtils.getContainerOfType(node, ast.isMachine);
        return this.model.machines(document).find((m) => m.node === machineNode);
    }
}
