/**
 * Code lenses: above each machine its cost under the active encoding and flip-flop type, and the
 * Equations, Compare encodings and Export… commands; above each scenario its pass/fail state and
 * Run. Commands are client-side (protocol.ts); the lens only carries {uri, machine[, scenario]}.
 */
import type { LangiumDocument } from 'langium';
import type { CodeLensProvider, LangiumServices } from 'langium/lsp';
import type { CodeLens, CodeLensParams, Range } from 'vscode-languageserver-protocol';
import { describeFailure, runScenario } from '@detent/core';
import type { DetentDocumentModel } from './document-model.js';
import { costTitle } from './machine-text.js';
import { failSoft } from './fail-soft.js';
import {
    COMPARE_ENCODINGS_COMMAND, EXPORT_COMMAND, type LensCommandArgs, RUN_SCENARIO_COMMAND, SHOW_EQUATIONS_COMMAND,
} from './protocol.js';

/** A zero-width range at the start of the line of `range`: lenses sit above that line. */
function lineStart(range: Range): Range {
    return { start: { line: range.start.line, character: 0 }, end: { line: range.start.line, character: 0 } };
}

/** Scenarios longer than this many clock cycles are not run for the lens (the Run command still runs them). */
export const LENS_SCENARIO_CYCLE_LIMIT = 100_000;

export class DetentCodeLensProvider implements CodeLensProvider {
    constructor(private readonly services: LangiumServices, private readonly model: DetentDocumentModel) {}

    provideCodeLens(document: LangiumDocument, params: CodeLensParams): Promise<CodeLens[]> {
        void params;
        return failSoft(this.services, 'code lens', [], () => this.lenses(document));
    }

    private lenses(document: LangiumDocument): CodeLens[] {
        const uri = document.uri.toString();
        const lenses: CodeLens[] = [];
        for (const entry of this.model.machines(document)) {
            const machine = entry.machine;
            if (!machine.name) continue;
            const at = lineStart(machine.range);
            const args: LensCommandArgs = { uri, machine: machine.name };
            const outcome = this.model.synthesis(document, entry);
            const title = outcome.result
                ? costTitle(outcome.result.cost, outcome.encoding, outcome.flipflop)
                : (outcome.note ?? 'no synthesis');
            lenses.push({ range: at, command: { title, command: SHOW_EQUATIONS_COMMAND, arguments: [args] } });
            lenses.push({ range: at, command: { title: 'Equations', command: SHOW_EQUATIONS_COMMAND, arguments: [args] } });
            lenses.push({ range: at, command: { title: 'Compare encodings', command: COMPARE_ENCODINGS_COMMAND, arguments: [args] } });
            lenses.push({ range: at, command: { title: 'Export…', command: EXPORT_COMMAND, arguments: [args] } });
            for (const scenario of machine.scenarios) {
                const sargs: LensCommandArgs = { uri, machine: machine.name, scenario: scenario.name };
                const sat = lineStart(scenario.range);
                let status: string;
                const cycles = scenario.steps.reduce((n, s) => n + (s.kind === 'step' ? s.repeat : s.kind === 'reset' ? 1 : 0), 0);
                if (entry.blocked) status = '○ not run (errors)';
                else if (cycles > LENS_SCENARIO_CYCLE_LIMIT) status = `○ not run (${cycles} cycles): use Run`;
                else {
                    const r = runScenario(machine, scenario);
                    status = r.passed ? `✓ passes (${r.expects} expect${r.expects === 1 ? '' : 's'}, ${r.cycles} cycles)` : `✗ fails: ${r.failure ? describeFailure(r.failure) : 'failed'}`;
                }
                lenses.push({ range: sat, command: { title: status, command: RUN_SCENARIO_COMMAND, arguments: [sargs] } });
                lenses.push({ range: sat, command: { title: 'Run', command: RUN_SCENARIO_COMMAND, arguments: [sargs] } });
            }
        }
        return lenses;
    }
}
