/**
 * Editor features (hover, code lens, code actions, semantic tokens, …). `createDetentServices`
 * merges this module after the language module, so an entry here overrides Langium's default.
 */
import type { Module } from 'langium';
import type { LangiumSharedServices, PartialLangiumServices, PartialLangiumSharedServices } from 'langium/lsp';
import type { DetentAddedServices, DetentServices } from '../detent-module.js';
import { DetentDocumentModel } from './document-model.js';
import { DetentSettingsStore } from './settings.js';
import { DetentHoverProvider } from './hover-provider.js';
import { DetentCodeLensProvider } from './code-lens-provider.js';
import { DetentInlayHintProvider } from './inlay-hint-provider.js';
import { DetentCodeActionProvider } from './code-action-provider.js';
import { DetentRenameProvider } from './rename-provider.js';
import { DetentSemanticTokenProvider } from './semantic-token-provider.js';
import { DetentFormatter } from './formatter.js';
import { DetentCompletionProvider } from './completion-provider.js';
import { DetentNodeKindProvider } from './node-kind-provider.js';
import { DetentEditorValidator } from './editor-validator.js';
import { DetentDocumentUpdateHandler } from './document-update-handler.js';

/** Services the editor features add (reachable as `services.lsp.DetentDocumentModel` etc.). */
export interface DetentLspAddedServices {
    readonly lsp: {
        readonly DetentSettings: DetentSettingsStore;
        readonly DetentDocumentModel: DetentDocumentModel;
    };
}

export const DetentLspFeatureModule: Module<DetentServices, PartialLangiumServices & { lsp: Partial<DetentLspAddedServices['lsp']> } & Partial<DetentAddedServices>> = {
    // While typing, the synthesis-based as-built checks run later, at idle time (asbuilt-diagnostics.ts).
    detent: {
        CheckOptions: () => ({ skipAsBuilt: true }),
    },
    lsp: {
        DetentSettings: (services) => {
            const store = new DetentSettingsStore();
            store.attach(services.shared);
            return store;
        },
        DetentDocumentModel: (services) => new DetentDocumentModel(services, services.lsp.DetentSettings),
        HoverProvider: (services) => new DetentHoverProvider(services, services.lsp.DetentDocumentModel),
        CodeLensProvider: (services) => new DetentCodeLensProvider(services, services.lsp.DetentDocumentModel),
        InlayHintProvider: (services) => new DetentInlayHintProvider(services, services.lsp.DetentDocumentModel),
        CodeActionProvider: (services) => new DetentCodeActionProvider(services, services.lsp.DetentDocumentModel),
        RenameProvider: (services) => new DetentRenameProvider(services),
        SemanticTokenProvider: (services) => new DetentSemanticTokenProvider(services),
        Formatter: () => new DetentFormatter(),
        CompletionProvider: (services) => new DetentCompletionProvider(services),
    },
    validation: {
        DocumentValidator: (services) => new DetentEditorValidator(services),
    },
};

/** Shared (workspace-wide) editor services: debounced, cancelling rebuilds. */
export const DetentLspSharedModule: Module<LangiumSharedServices, PartialLangiumSharedServices> = {
    lsp: {
        DocumentUpdateHandler: (shared) => new DetentDocumentUpdateHandler(shared),
        NodeKindProvider: () => new DetentNodeKindProvider(),
    },
};
