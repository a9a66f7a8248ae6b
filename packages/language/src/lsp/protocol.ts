/**
 * Detent's custom LSP requests between the VS Code client and the language server.
 * Types only (the client imports this file without pulling in Langium). Method names are ours.
 */

export interface Range0 {
    start: { line: number; character: number };
    end: { line: number; character: number };
}

/** `detent/diagram`: the state diagram of every machine of a document, as DOT plus state locations. */
export const DIAGRAM_REQUEST = 'detent/diagram';
export interface DiagramParams { uri: string }
export interface DiagramResult {
    machines: {
        name: string;
        /** Graphviz DOT text; node ids are the state names. */
        dot: string;
        states: { name: string; range: Range0; code: string }[];
        range: Range0;
    }[];
}

/** `detent/equations`: the read-only Equations document (codes, equations, cost, Karnaugh maps) of one machine. */
export const EQUATIONS_REQUEST = 'detent/equations';
export interface EquationsParams { uri: string; machine: string; encoding?: string; flipflop?: string }
export interface EquationsResult { text: string }

/** `detent/compare`: the encoding × flip-flop cost table of one machine, as Markdown. */
export const COMPARE_REQUEST = 'detent/compare';
export interface CompareParams { uri: string; machine: string }
export interface CompareResult { markdown: string }

/** `detent/export`: generated files for one machine; the client writes them (it owns the file system and trust). */
export const EXPORT_REQUEST = 'detent/export';
export interface ExportParams {
    uri: string;
    machine: string;
    to: 'verilog' | 'systemverilog' | 'vhdl' | 'c' | 'dot';
    style?: 'behavioral' | 'structural';
    testbench?: boolean;
    statePort?: boolean;
}
export interface ExportResult { files: { name: string; content: string }[] }

/** `detent/scenarios`: scenarios of a document, for the Test Explorer. */
export const SCENARIOS_REQUEST = 'detent/scenarios';
export interface ScenariosParams { uri: string }
export interface ScenariosResult { machines: { name: string; range: Range0; scenarios: { name: string; range: Range0 }[] }[] }

/** `detent/runScenarios`: runs scenarios (all of a machine, or the named ones) in the core simulator. */
export const RUN_SCENARIOS_REQUEST = 'detent/runScenarios';
export interface RunScenariosParams { uri: string; machine: string; scenarios?: string[] }
export interface RunScenariosResult {
    results: { scenario: string; passed: boolean; message: string; range: Range0; durationMs: number }[];
}

/** `detent/status`: the active machine's cost for the status bar (machine at the position). */
export const STATUS_REQUEST = 'detent/status';
export interface StatusParams { uri: string; position: { line: number; character: number } }
export interface StatusResult { machine?: string; text?: string; tooltip?: string }

/** Settings the client passes with `workspace/didChangeConfiguration` and initializationOptions, section `detent`. */
export interface DetentSettings {
    /** Encoding used for lenses and hover ('machine' = as declared in the file). */
    encoding: string;
    /** Flip-flop type used for lenses and hover ('machine' = as declared). */
    flipflop: string;
    /** Per-code severity overrides: code → 'error' | 'warning' | 'info' | 'hint' | 'off'. */
    severity: Record<string, string>;
}

/**
 * Client-side commands the server's code lenses invoke (the extension registers them). Every
 * command takes one argument object: `LensCommandArgs`.
 */
export const SHOW_EQUATIONS_COMMAND = 'detent.showEquations';
export const COMPARE_ENCODINGS_COMMAND = 'detent.compareEncodings';
export const EXPORT_COMMAND = 'detent.export';
export const RUN_SCENARIO_COMMAND = 'detent.runScenario';
export interface LensCommandArgs { uri: string; machine: string; scenario?: string }

/**
 * `Diagnostic.data` of Detent diagnostics: the finding's code, subject and witness (for hovers and
 * quick fixes); `asBuilt` marks the lockup / reset-code / async-input findings of the idle-time phase.
 */
export interface DiagnosticData { code?: string; state?: string; signal?: string; witness?: unknown; asBuilt?: boolean }
