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
        if (typeof name === 'string') names.add(name);
    }
    return names;
}

/** Why `name` cannot be used, or undefined when it can. */
export function renameProblem(name: string, taken: ReadonlySet<string>): string | undefined {
    if (!/^[A-Za-z_][A-Za-z0-9_]*$/.test(name)) return `'${name}' is not a Detent identifier ([A-Za-z_][A-Za-z0-9_]*)`;
    if (DETENT_KEYWORDS.has(name)) return `'${name}' is a Detent keyword`;
    const reserved = reservedBy(name);
    if (reserved.length > 0) return `'${name}' is reserved by ${reserved.join(', ')}: every export must compile`;
    if (taken.has(name)) return `'${name}' is already declared in this machine`;
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
            const problem = renameProblem(params.newName, declaredNames(machine));
            if (problem) throw new ResponseError(ErrorCodes.InvalidParams, `Cannot rename: ${problem}.`);
        }
        return super.rename(document, params);
    }
}

function findLeaf(cst: CstNode, offset: number): AstNode | undefined {
    return CstUtils.findLeafNodeAtOffset(cst, offset)?.astNode;
}
