/**
 * Rename of states and signals across the file (Langium's reference-based rename), refusing names
 * that would not be a valid Detent identifier, a Detent keyword, a name reserved by an export
 * language, or a name already declared in the same machine.
 */
import { AstUtils, CstUtils, type AstNode, type CstNode, type LangiumDocument } from 'langium';
import { DefaultRenameProvider, type LangiumServices } from 'langium/lsp';
import { ResponseError, ErrorCodes, type RenameParams, type WorkspaceEdit } from 'vscode-languageserver-protocol';
import { reservedBy } from '@detent/core';
import { isMachine, type Machine } from '../generated/ast.js';

/** Keywords of LANGUAGE.md that cannot be names (`D T JK SR` can: they are keywords only after `flipflop`). */
export const DETENT_KEYWORDS: ReadonlySet<string> = new Set(
    'machine clock rising falling reset high low sync async clear input output registered encoding binary gray onehot onecold johnson explicit auto flipflop code recover state priority emit when otherwise stay dontcare scenario step expect with'.split(' '),
);

/** Every name declared in a machine: states, inputs, outputs, scenarios, the clock and the reset (every node with a `name`). */
export function declaredNames(machine: Machine): Set<string> {
    const names = new Set<string>();
    for (const node of AstUtils.streamAllContents(machine)) {
        const name = (node as { name?: unknown }).name;
        if (typeof name === 'string') names.add(name.toLowerCase());
    }
    return names;
}

/** Why `name` cannot be used, or undefined when it can. */
export function renameProblem(name: string, taken: ReadonlySet<string>): string | undefined {
    if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(name)) return `'${name}' is not a Detent identifier ([A-Za-z_][A-Za-z0-9_]*)`;
    if (DETENT_KEYWORDS.has(name)) return `'${name}' is a Detent keyword`;
    const reserved = reservedBy(name);
    if (reserved.length > 0) return `'${name}' is reserved by ${reserved.join(', ')}: every export must compile`;
    // one namespace per machine, compared ignoring case (VHDL; docs/decisions.md, Language)
    if (taken.has(name.toLowerCase())) return `'${name}' is already declared in this machine (names are compared ignoring case)`;
    return undefined;
}

export class DetentRenameProvider extends DefaultRenameProvider {
    constructor(services: LangiumServices) {
        super(services);
    }

    override async rename(document: LangiumDocument, params: RenameParams): Promise<WorkspaceEdit | undefined> {
        const offset = document.textDocument.offsetAt(params.position);
        const root = document.parseResult.value;
        const leaf = root.$cstNode ? findLeaf(root.$cstNode, offset) : undefined;
        const machine = leaf ? AstUtils.getContainerOfType(leaf, isMachine) : undefined;
        if (machine) {
            const taken = declaredNames(machine);
            // renaming to the current name (or a case change of it) is not a clash with itself
            const current = findDeclaredName(document, offset);
            if (current !== undefined) taken.delete(current.toLowerCase());
            const problem = renameProblem(params.newName, taken);
            if (problem) throw new ResponseError(ErrorCodes.InvalidParams, `Cannot rename: ${problem}.`);
        }
        return super.rename(document, params);
    }
}

/** The text of the name token at the offset (for a reference, the referenced name). */
function findDeclaredName(document: LangiumDocument, offset: number): string | undefined {
    const root = document.parseResult.value.$cstNode;
    const token = root ? CstUtils.findLeafNodeAtOffset(root, offset) : undefined;
    return token?.text;
}

function findLeaf(cst: CstNode, offset: number): AstNode | undefined {
    return CstUtils.findLeafNodeAtOffset(cst, offset)?.astNode;
}
