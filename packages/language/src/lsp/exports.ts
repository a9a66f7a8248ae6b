/**
 * The editor's bridge to core's exporters: the DOT of the diagram request and the generated files
 * of the export request. No generation happens here.
 */
import type { Machine } from '@detent/core';
import type { ExportParams } from './protocol.js';

export interface ExportContext {
    readonly sourceName: string;
    readonly sourceText: string;
}

/** DOT of one machine from core's DOT exporter; '' while core has none. */
export function diagramOf(machine: Machine, context?: ExportContext): string {
    void machine; void context;
    return '';
}

export function exportFiles(machine: Machine, params: ExportParams, context?: ExportContext): { name: string; content: string }[] {
    void machine; void params; void context;
    throw new Error('the exporters are not available in this build');
}
