/**
 * Completion: Langium's grammar-driven completion (keywords in context, state names after `->`,
 * signals in guards and emits through the scope), plus the flip-flop types and encodings after
 * their keywords with a one-line explanation each. `D T JK SR` are also valid names, which keeps
 * Langium's follow-set computation from offering them after `flipflop`, so they are added here.
 */
import type { LangiumDocument } from 'langium';
import { DefaultCompletionProvider, type LangiumServices } from 'langium/lsp';
import { failSoft } from './fail-soft.js';
import { type CompletionItem, CompletionItemKind, type CompletionList, type CompletionParams } from 'vscode-languageserver-protocol';

export const FLIPFLOP_DETAILS: Readonly<Record<string, string>> = {
    D: 'D flip-flop: next state = D',
    T: 'T flip-flop: toggles when T = 1',
    JK: 'JK flip-flop: J sets, K clears, both toggle',
    SR: 'SR flip-flop: S sets, R clears (never both)',
};

export const ENCODING_DETAILS: Readonly<Record<string, string>> = {
    binary: 'state i gets code i (⌈log2 n⌉ bits)',
    gray: 'i XOR (i >> 1): neighbours differ in one bit',
    onehot: 'one flip-flop per state, exactly one set',
    onecold: 'one flip-flop per state, exactly one clear',
    johnson: 'twisted ring, ⌈n/2⌉ bits',
    explicit: 'codes from `code S = 0b…;` lines',
    auto: 'search for a cheap assignment',
};

export class DetentCompletionProvider extends DefaultCompletionProvider {
    constructor(private readonly services: LangiumServices) {
        super(services);
    }

    override async getCompletion(document: LangiumDocument, params: CompletionParams): Promise<CompletionList | undefined> {
        return failSoft(this.services, 'completion', undefined, () => this.complete(document, params));
    }

    private async complete(document: LangiumDocument, params: CompletionParams): Promise<CompletionList | undefined> {
        const list = await super.getCompletion(document, params);
        const text = document.textDocument.getText({ start: { line: params.position.line, character: 0 }, end: params.position });
        const extra = (details: Readonly<Record<string, string>>, kind: CompletionItemKind): CompletionItem[] =>
            Object.entries(details).map(([label, detail], i) => ({ label, detail, kind, sortText: String(i).padStart(2, '0') }));
        let added: CompletionItem[] = [];
        if (/\bflipflop\s+\w*$/.test(text)) added = extra(FLIPFLOP_DETAILS, CompletionItemKind.EnumMember);
        else if (/\bencoding\s+\w*$/.test(text)) added = extra(ENCODING_DETAILS, CompletionItemKind.EnumMember);
        if (added.length === 0) return list;
        const items = (list?.items ?? []).filter((i) => !added.some((a) => a.label === i.label));
        return { isIncomplete: list?.isIncomplete ?? false, items: [...added, ...items] };
    }
}
