/**
 * @detent/language: the Detent grammar, lowering to the core model, and Langium services.
 */
export { parseDetent, checkText, checkParsed, analyzeParse, parseText, sortFindings } from './analyze.js';
export type { LoweredMachine, ParsedDetent } from './analyze.js';
export { createDetentServices, createDetentCoreServices, DetentModule } from './detent-module.js';
export type { DetentServices, DetentCoreServices, DetentAddedServices } from './detent-module.js';
export { findingToDiagnostic } from './validation/diagnostics.js';
export type { DetentDiagnosticData } from './validation/diagnostics.js';
export { MAX_GUARD_DEPTH, MAX_NAME_LENGTH, MAX_SOURCE_LENGTH } from './syntax/limits.js';
export { MAX_STATES, MAX_INPUT_BITS, MAX_OUTPUT_BITS, MAX_TRANSITIONS_PER_STATE } from './syntax/model-limits.js';
export { MAX_BUS_WIDTH, MIN_BUS_WIDTH } from './lowering/lower-machine.js';
export { MAX_STEP_REPEAT } from './lowering/scenarios.js';
export * as DetentAst from './generated/ast.js';
