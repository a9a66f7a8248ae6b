/**
 * Makes inputs and outputs visible in their whole machine (Langium's default would keep a
 * name visible only inside its own `input …;` declaration) and exports nothing across files:
 * machines in different files never refer to each other.
 */
import { type AstNode, type AstNodeDescription, DefaultScopeComputation, type LangiumDocument, type MultiMap } from 'langium';
import { isInputSignal, isOutputSignal } from '../generated/ast.js';

export class DetentScopeComputation extends DefaultScopeComputation {
    override async collectExportedSymbols(): Promise<AstNodeDescription[]> {
        return [];
    }

    protected override addLocalSymbol(node: AstNode, document: LangiumDocument, symbols: MultiMap<AstNode, AstNodeDescription>): void {
        if ((isInputSignal(node) || isOutputSignal(node)) && node.$container.$container) {
            const name = this.nameProvider.getName(node);
            if (name) symbols.add(node.$container.$container, this.descriptions.createDescription(node, name, document));
            return;
        }
        super.addLocalSymbol(node, document, symbols);
    }
}
