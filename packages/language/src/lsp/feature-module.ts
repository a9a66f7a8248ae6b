/**
 * Extension point for editor features (hover, code lens, code actions, semantic tokens, …).
 * Add providers here; `createDetentServices` merges this module after the language module, so an
 * entry here overrides Langium's default for the same service.
 */
import type { Module } from 'langium';
import type { PartialLangiumServices } from 'langium/lsp';
import type { DetentServices } from '../detent-module.js';

export const DetentLspFeatureModule: Module<DetentServices, PartialLangiumServices> = {};
