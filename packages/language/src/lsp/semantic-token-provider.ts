/**
 * Semantic tokens: what a name IS (state, input, output, machine, scenario), which the TextMate
 * grammar cannot know. Keywords, numbers and comments stay with the TextMate grammar.
 */
import type { AstNode } from 'langium';
import { AbstractSemanticTokenProvider, type SemanticTokenAcceptor } from 'langium/lsp';
import { SemanticTokenModifiers, SemanticTokenTypes } from 'vscode-languageserver-protocol';
import * as ast from '../generated/ast.js';

export class DetentSemanticTokenProvider extends AbstractSemanticTokenProvider {
    protected override highlightElement(node: AstNode, acceptor: SemanticTokenAcceptor): void {
        const declaration = [SemanticTokenModifiers.declaration];
        if (ast.isMachine(node)) acceptor({ node, property: 'name', type: SemanticTokenTypes.class, modifier: declaration });
        else if (ast.isState(node)) acceptor({ node, property: 'name', type: SemanticTokenTypes.enumMember, modifier: declaration });
        else if (ast.isInputSignal(node)) acceptor({ node, property: 'name', type: SemanticTokenTypes.parameter, modifier: declaration });
        else if (ast.isOutputSignal(node)) acceptor({ node, property: 'name', type: SemanticTokenTypes.variable, modifier: declaration });
        else if (ast.isScenario(node)) acceptor({ node, property: 'name', type: SemanticTokenTypes.function, modifier: declaration });
        else if (ast.isClockDecl(node) || ast.isResetDecl(node)) acceptor({ node, property: 'name', type: SemanticTokenTypes.parameter, modifier: declaration });
        if (ast.isTransition(node) || ast.isOtherwise(node) || ast.isRecoverDecl(node)) {
            if (node.target) acceptor({ node, property: 'target', type: SemanticTokenTypes.enumMember });
        }
        if (ast.isResetDecl(node) && node.target) acceptor({ node, property: 'target', type: SemanticTokenTypes.enumMember });
        if (ast.isCodeDecl(node) || (ast.isExpectStep(node) && node.state)) acceptor({ node, property: 'state', type: SemanticTokenTypes.enumMember });
        if (ast.isSignalGuard(node) || ast.isInputAssignment(node)) acceptor({ node, property: 'signal', type: SemanticTokenTypes.parameter });
        if (ast.isEmitItem(node) || ast.isOutputExpectation(node)) acceptor({ node, property: 'output', type: SemanticTokenTypes.variable });
    }
}
