/**
 * Quick fixes for Detent diagnostics. Each fix is a plain text edit computed from the AST and the
 * diagnostic's data (state, signal, witness); none re-runs an analysis. Offered:
 * - `incomplete`: add `otherwise stay;`, `otherwise -> S;`, or a `when <witness> -> S;` row;
 * - `overlap`: make the state `priority` (first true guard wins, as the simulator already does);
 * - `equivalent`: merge the state into its partner (delete it, rewrite every reference);
 * - `lockup`: add `recover -> S;` (S = the reset state);
 * - `unused-input`: remove the input (and the scenario assignments to it).
 */
import { AstUtils, CstUtils, GrammarUtils, type AstNode, type CstNode, type LangiumDocument, type Reference } from 'langium';
import type { CodeActionProvider, LangiumServices } from 'langium/lsp';
import { type CodeAction, type CodeActionParams, CodeActionKind, type Command, type Diagnostic, type TextEdit, type Range } from 'vscode-languageserver-protocol';
import {
    type Cube, type Machine as ModelMachine, type Witness, FREE, ONE, complement, coverContainsCube, coverUnion, getVar,
    guardContext, guardCover, inputVariables, mintermCube, withVar,
} from '@detent/core';
import * as ast from '../generated/ast.js';
import type { DetentDocumentModel } from './document-model.js';
import { failSoft } from './fail-soft.js';

interface DiagnosticInfo { readonly code?: string; readonly state?: string; readonly signal?: string; readonly witness?: Witness }

function infoOf(d: Diagnostic): DiagnosticInfo {
    const data = (typeof d.data === 'object' && d.data !== null ? d.data : {}) as DiagnosticInfo;
    return { ...data, code: typeof d.code === 'string' ? d.code : data.code };
}

/**
 * A guard for the uncovered inputs around a witness: the witness minterm, widened one literal at a
 * time while it stays inside the part of the input space no guard of the state takes (so the new
 * row can never overlap an existing one). Bus bits print as `level[2]` / `!level[2]`.
 */
export function witnessCubeGuard(machine: ModelMachine, stateIndex: number, inputs: Readonly<Record<string, number>>): string | undefined {
    const state = machine.states[stateIndex];
    if (!state) return undefined;
    const ctx = guardContext(machine);
    const vars = inputVariables(machine);
    const taken = state.transitions.reduce<Cube[]>((acc, t) => coverUnion(acc, guardCover(t.guard, ctx)), []);
    const free = complement(taken, ctx.nvars);
    const bits = vars.map((v) => {
        const value = inputs[machine.inputs[v.input]!.name] ?? 0;
        return ((value >>> v.bit) & 1) as 0 | 1;
    });
    let cube = mintermCube(ctx.nvars, (v) => bits[v]!);
    if (!coverContainsCube(free, cube, ctx.nvars)) return undefined;
    for (let v = 0; v < ctx.nvars; v++) {
        const wider = withVar(cube, v, FREE);
        if (coverContainsCube(free, wider, ctx.nvars)) cube = wider;
    }
    const literals: string[] = [];
    for (let v = 0; v < ctx.nvars; v++) {
        const field = getVar(cube, v);
        if (field === FREE) continue;
        literals.push(field === ONE ? vars[v]!.name : `!${vars[v]!.name}`);
    }
    return literals.length ? literals.join(' & ') : '1';
}

/** A guard true exactly on the witness assignment of the listed inputs: `a & !b & level == 3`. */
export function witnessGuard(machine: ModelMachine, inputs: Readonly<Record<string, number>>): string {
    const parts: string[] = [];
    for (const input of machine.inputs) {
        const value = inputs[input.name];
        if (value === undefined) continue;
        parts.push(input.isBus ? `${input.name} == ${value}` : value ? input.name : `!${input.name}`);
    }
    return parts.length ? parts.join(' & ') : '1';
}

class EditContext {
    readonly text: string;
    constructor(readonly document: LangiumDocument) {
        this.text = document.textDocument.getText();
    }
    pos(offset: number) { return this.document.textDocument.positionAt(offset); }
    range(start: number, end: number): Range { return { start: this.pos(start), end: this.pos(end) }; }
    lineStart(offset: number): number { return this.text.lastIndexOf('\n', offset - 1) + 1; }
    lineEnd(offset: number): number {
        const i = this.text.indexOf('\n', offset);
        return i < 0 ? this.text.length : i + 1;
    }
    indentAt(offset: number): string {
        const start = this.lineStart(offset);
        return /^[ \t]*/.exec(this.text.slice(start))![0];
    }
    /** True when only whitespace precedes the offset on its line. */
    startsLine(offset: number): boolean {
        return /^[ \t]*$/.test(this.text.slice(this.lineStart(offset), offset));
    }
    /** Insert a statement as the last item of a `{ … }` block. */
    insertBeforeClose(block: CstNode, statement: string): TextEdit {
        const close = block.offset + block.text.lastIndexOf('}');
        if (this.startsLine(close)) {
            const items = this.itemIndent(block) ?? this.indentAt(close) + '    ';
            return { range: this.range(this.lineStart(close), this.lineStart(close)), newText: `${items}${statement}\n` };
        }
        return { range: this.range(close, close), newText: `${/\s$/.test(this.text[close - 1] ?? '') ? '' : ' '}${statement} ` };
    }
    /** The indentation of the block's first item that starts a line. */
    itemIndent(block: CstNode): string | undefined {
        const open = block.offset + block.text.indexOf('{');
        const next = this.lineEnd(open);
        const close = block.offset + block.text.lastIndexOf('}');
        for (let at = next; at < close; at = this.lineEnd(at)) {
            const line = this.text.slice(at, this.lineEnd(at));
            if (line.trim() && !line.trim().startsWith('}')) return /^[ \t]*/.exec(line)![0];
            if (this.lineEnd(at) === at) break;
        }
        return undefined;
    }
    /** Deletes a node's whole lines when it is alone on them, else just the node. */
    deleteNode(node: CstNode, includeDoc = false): TextEdit {
        let start = node.offset;
        if (includeDoc) {
            const before = this.text.slice(0, start).replace(/\s+$/, '');
            if (before.endsWith('*/')) {
                const open = before.lastIndexOf('/**');
                if (open >= 0 && !before.slice(open, before.length - 2).includes('*/')) start = open;
            }
        }
        const end = node.end;
        const alone = this.startsLine(start) && /^[ \t]*(\r?\n|$)/.test(this.text.slice(end));
        if (alone) return { range: this.range(this.lineStart(start), this.lineEnd(end)), newText: '' };
        return { range: this.range(start, end), newText: '' };
    }
    /** Removes one element of a comma-separated list (and its comma). */
    deleteListElement(elements: readonly AstNode[], element: AstNode): TextEdit | undefined {
        const k = elements.indexOf(element);
        const cst = element.$cstNode;
        if (k < 0 || !cst) return undefined;
        if (k > 0) return { range: this.range(elements[k - 1]!.$cstNode!.end, cst.end), newText: '' };
        if (elements.length > 1) return { range: this.range(cst.offset, elements[1]!.$cstNode!.offset), newText: '' };
        // the only element: also drop the space before it (`step a * 2;` → `step * 2;`)
        let start = cst.offset;
        while (start > 0 && (this.text[start - 1] === ' ' || this.text[start - 1] === '\t')) start--;
        return { range: this.range(start, cst.end), newText: '' };
    }
}

function refsTo(machine: ast.Machine, target: AstNode): { owner: AstNode; ref: Reference }[] {
    const out: { owner: AstNode; ref: Reference }[] = [];
    for (const node of AstUtils.streamAllContents(machine)) {
        for (const value of Object.values(node)) {
            if (typeof value === 'object' && value !== null && '$refText' in value) {
                const ref = value as Reference;
                if (ref.ref === target) out.push({ owner: node, ref });
            }
        }
    }
    return out;
}

export class DetentCodeActionProvider implements CodeActionProvider {
    constructor(private readonly services: LangiumServices, private readonly model: DetentDocumentModel) {}

    getCodeActions(document: LangiumDocument, params: CodeActionParams): Promise<Array<Command | CodeAction>> {
        return failSoft(this.services, 'code actions', [], () => {
            const actions: CodeAction[] = [];
            for (const d of params.context.diagnostics) {
                if (d.source !== undefined && d.source !== 'detent') continue;
                try {
                    actions.push(...this.fixes(document, d));
                } catch (err) {
                    // one broken fix must not hide the others
                    void err;
                }
            }
            return actions;
        });
    }

    private machineAt(document: LangiumDocument, range: Range): ast.Machine | undefined {
        const root = document.parseResult.value.$cstNode;
        if (!root) return undefined;
        const leaf = CstUtils.findLeafNodeAtOffset(root, document.textDocument.offsetAt(range.start));
        return leaf ? AstUtils.getContainerOfType(leaf.astNode, ast.isMachine) : undefined;
    }

    private fixes(document: LangiumDocument, d: Diagnostic): CodeAction[] {
        const info = infoOf(d);
        const machine = this.machineAt(document, d.range);
        if (!machine) return [];
        const ctx = new EditContext(document);
        const uri = document.uri.toString();
        const action = (title: string, edits: TextEdit[], preferred = false): CodeAction => ({
            title, kind: CodeActionKind.QuickFix, diagnostics: [d], isPreferred: preferred, edit: { changes: { [uri]: edits } },
        });
        const states = machine.members.filter(ast.isState);
        const state = info.state !== undefined ? states.find((s) => s.name === info.state) : undefined;
        const entry = this.model.machines(document).find((m) => m.node === machine);
        switch (info.code) {
            case 'incomplete': {
                if (!state?.$cstNode) return [];
                const out = [action('Add `otherwise stay;` (hold the state)', [ctx.insertBeforeClose(state.$cstNode, 'otherwise stay;')], true)];
                for (const other of states.filter((s) => s !== state).slice(0, 6)) {
                    out.push(action(`Add \`otherwise -> ${other.name};\``, [ctx.insertBeforeClose(state.$cstNode, `otherwise -> ${other.name};`)]));
                }
                if (info.witness?.inputs && entry) {
                    const index = entry.machine.states.findIndex((st) => st.name === state.name);
                    const guard = witnessCubeGuard(entry.machine, index, info.witness.inputs) ?? witnessGuard(entry.machine, info.witness.inputs);
                    const row = `when ${guard} -> ${state.name};`;
                    out.push(action(`Add \`${row}\` for the uncovered inputs`, [ctx.insertBeforeClose(state.$cstNode, row)]));
                }
                return out;
            }
            case 'overlap': {
                if (!state?.$cstNode || state.priority) return [];
                const nameNode = stateNameNode(state);
                if (!nameNode) return [];
                return [action(`Make state ${state.name} \`priority\` (first true guard wins)`, [{ range: ctx.range(nameNode.end, nameNode.end), newText: ' priority' }], true)];
            }
            case 'equivalent': {
                if (!state?.$cstNode) return [];
                const partnerName = this.partnerOf(d, entry?.machine);
                const partner = states.find((s) => s.name === partnerName);
                if (!partner || partner === state) return [];
                const edits: TextEdit[] = [ctx.deleteNode(state.$cstNode, true)];
                const inside = (n: AstNode) => AstUtils.getContainerOfType(n, ast.isState) === state;
                for (const { owner, ref } of refsTo(machine, state)) {
                    if (inside(owner)) continue;
                    if (ast.isCodeDecl(owner) && owner.$cstNode) { edits.push(ctx.deleteNode(owner.$cstNode)); continue; }
                    if (ref.$refNode) edits.push({ range: ctx.range(ref.$refNode.offset, ref.$refNode.end), newText: partner.name });
                }
                return [action(`Merge state ${state.name} into ${partner.name} (delete it, retarget every reference)`, edits, true)];
            }
            case 'lockup': {
                const target = machine.members.find(ast.isResetDecl)?.target?.ref ?? states[0];
                const anchor = machine.members.find((m) => ast.isState(m) || ast.isScenario(m))?.$cstNode;
                if (!target || !anchor) return [];
                const at = ctx.lineStart(anchor.offset);
                return [action(`Add \`recover -> ${target.name};\` (unused codes go to ${target.name})`, [{ range: ctx.range(at, at), newText: `${ctx.indentAt(anchor.offset)}recover -> ${target.name};\n` }], true)];
            }
            case 'unused-input': {
                const signal = machine.members.filter(ast.isInputDecl).flatMap((decl) => decl.signals).find((s) => s.name === info.signal);
                if (!signal) return [];
                const decl = signal.$container;
                const edits: TextEdit[] = [];
                const removal = decl.signals.length === 1 && decl.$cstNode ? ctx.deleteNode(decl.$cstNode) : ctx.deleteListElement(decl.signals, signal);
                if (removal) edits.push(removal);
                for (const { owner } of refsTo(machine, signal)) {
                    if (ast.isInputAssignment(owner)) {
                        const e = ctx.deleteListElement(owner.$container.assignments, owner);
                        if (e) edits.push(e);
                    }
                }
                return [action(`Remove unused input ${signal.name}`, edits, true)];
            }
            default:
                return [];
        }
    }

    private partnerOf(d: Diagnostic, machine: ModelMachine | undefined): string | undefined {
        for (const r of d.relatedInformation ?? []) {
            const byRange = machine?.states.find((s) => s.nameRange.start.line === r.location.range.start.line && s.nameRange.start.character === r.location.range.start.character);
            if (byRange) return byRange.name;
            const quoted = /'([^']+)'/.exec(r.message);
            if (quoted) return quoted[1];
        }
        const inMessage = /from state '([^']+)'/.exec((typeof d.message === 'string' ? d.message : d.message.value));
        return inMessage?.[1];
    }
}

/** The CST node of a state's name. */
function stateNameNode(state: ast.State): CstNode | undefined {
    return GrammarUtils.findNodeForProperty(state.$cstNode, 'name');
}
