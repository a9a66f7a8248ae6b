/**
 * Langium services for Detent. Kept small on purpose:
 * - `DetentModule` holds the language services (scoping, validation) shared by CLI and editor;
 * - `src/lsp/feature-module.ts` is where editor features are added;
 * - `createDetentServices(context, ...extra)` builds the LSP services (extra modules override);
 * - `createDetentCoreServices()` builds parser-only services for the CLI and tests.
 */
import './compat/object-group-by.js';
import {
    type Module, type LangiumCoreServices, type LangiumSharedCoreServices, type PartialLangiumCoreServices,
    EmptyFileSystem, createDefaultCoreModule, createDefaultSharedCoreModule, inject,
} from 'langium';
import {
    type DefaultSharedModuleContext, type LangiumServices, type LangiumSharedServices, type PartialLangiumServices,
    createDefaultModule, createDefaultSharedModule,
} from 'langium/lsp';
import type { CheckOptions } from '@detent/core';
import { DetentGeneratedModule, DetentGeneratedSharedModule } from './generated/module.js';
import { DetentScopeComputation } from './services/scope-computation.js';
import { createDetentParser } from './services/parser.js';
import { DetentDocumentValidator } from './validation/document-validator.js';
import { DetentLspFeatureModule, DetentLspSharedModule, type DetentLspAddedServices } from './lsp/feature-module.js';

/** Services Detent adds to Langium's. */
export interface DetentAddedServices {
    readonly detent: {
        /** Options for the core checks run on every validation (e.g. skip as-built analyses while typing). */
        readonly CheckOptions: CheckOptions;
    };
}

export type DetentServices = LangiumServices & DetentAddedServices & DetentLspAddedServices;
export type DetentCoreServices = LangiumCoreServices & DetentAddedServices;

/** Language services used by both the CLI (core) and the editor (LSP) setups. */
export const DetentModule: Module<DetentCoreServices, PartialLangiumCoreServices & DetentAddedServices> = {
    detent: {
        CheckOptions: () => ({}),
    },
    parser: {
        LangiumParser: (services) => createDetentParser(services),
    },
    references: {
        ScopeComputation: (services) => new DetentScopeComputation(services),
    },
    validation: {
        DocumentValidator: (services) => new DetentDocumentValidator(services),
    },
};

/** LSP services for the language server. Extra modules are merged last and override. */
export function createDetentServices(
    context: DefaultSharedModuleContext,
    ...extra: Module<DetentServices, PartialLangiumServices>[]
): { shared: LangiumSharedServices; Detent: DetentServices } {
    const shared = inject(createDefaultSharedModule(context), DetentGeneratedSharedModule, DetentLspSharedModule);
    const Detent = inject(
        createDefaultModule({ shared }),
        DetentGeneratedModule,
        DetentModule as Module<DetentServices, PartialLangiumServices & DetentAddedServices>,
        DetentLspFeatureModule,
        ...extra,
    );
    shared.ServiceRegistry.register(Detent);
    return { shared, Detent };
}

/** Parser-level services without LSP (CLI, tests). */
export function createDetentCoreServices(): { shared: LangiumSharedCoreServices; Detent: DetentCoreServices } {
    const shared = inject(createDefaultSharedCoreModule(EmptyFileSystem), DetentGeneratedSharedModule);
    const Detent = inject(createDefaultCoreModule({ shared }), DetentGeneratedModule, DetentModule);
    shared.ServiceRegistry.register(Detent);
    return { shared, Detent };
}
