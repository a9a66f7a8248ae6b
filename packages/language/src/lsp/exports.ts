/**
 * The editor's bridge to core's exporters: the DOT of the diagram request and the generated files
 * of the export request. No generation happens here — only the options core needs are gathered.
 */
import { type Machine, type SynthesisResult, exportMachine } from '@detent/core';
import type { ExportParams } from './protocol.js';

export interface ExportContext {
    /** File name of the source (no directories), for the generated header. */
    readonly sourceName: string;
    readonly sourceText: string;
}

/** The last path segment of a document URI: `file:///a/b/pump.detent` → `pump.detent`. */
export function sourceNameOf(uri: string): string {
    const path = decodeURIComponent(uri.replace(/[?#].*$/, ''));
    return path.slice(path.lastIndexOf('/') + 1) || 'untitled.detent';
}

/** DOT of one machine from core's DOT exporter; '' when core cannot draw it (the client shows why). */
export function diagramOf(machine: Machine, context: ExportContext, synthesis?: SynthesisResult): string {
    try {
        const files = exportMachine(machine, 'dot', { ...context, assignment: synthesis?.assignment, synthesis });
        return files[0]?.text ?? '';
    } catch {
        return '';
    }
}

/** Generated files; the synthesis (under the machine's own encoding and flip-flop type) supplies codes for `auto` and the structural style. */
export function exportFiles(machine: Machine, params: ExportParams, context: ExportContext, synthesis?: SynthesisResult): { name: string; content: string }[] {
    const files = exportMachine(machine, params.to, {
        ...context,
        style: params.style,
        testbench: params.testbench,
        statePort: params.statePort,
        assignment: synthesis?.assignment,
        synthesis,
    });
    return files.map((f) => ({ name: f.name, content: f.text }));
}
