/**
 * Symbol and completion kinds, so the outline and completion lists show what a name is:
 * machines as classes, states as enum members, inputs as fields read by guards, outputs as
 * properties, scenarios as methods (they are run), the clock and reset as events.
 */
import type { AstNode, AstNodeDescription } from 'langium';
import { DefaultNodeKindProvider } from 'langium/lsp';
import { CompletionItemKind, SymbolKind } from 'vscode-languageserver';

type Kinds = readonly [SymbolKind, CompletionItemKind];

const KINDS: Readonly<Record<string, Kinds>> = {
    Machine: [SymbolKind.Class, CompletionItemKind.Class],
    State: [SymbolKind.EnumMember, CompletionItemKind.EnumMember],
    InputSignal: [SymbolKind.Field, CompletionItemKind.Field],
    OutputSignal: [SymbolKind.Property, CompletionItemKind.Property],
    Scenario: [SymbolKind.Method, CompletionItemKind.Method],
    ClockDecl: [SymbolKind.Event, CompletionItemKind.Event],
    ResetDecl: [SymbolKind.Event, CompletionItemKind.Event],
};

function typeOf(node: AstNode | AstNodeDescription): string {
    return '$type' in node ? node.$type : node.type;
}

export class DetentNodeKindProvider extends DefaultNodeKindProvider {
    override getSymbolKind(node: AstNode | AstNodeDescription): SymbolKind {
        return KINDS[typeOf(node)]?.[0] ?? super.getSymbolKind(node);
    }

    override getCompletionItemKind(node: AstNode | AstNodeDescription): CompletionItemKind {
        return KINDS[typeOf(node)]?.[1] ?? super.getCompletionItemKind(node);
    }
}
