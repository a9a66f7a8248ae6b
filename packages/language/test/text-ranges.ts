/**
 * Test oracle for ranges: finds the n-th occurrence of a snippet in the source text and returns
 * its 0-based LSP range, computed from the text alone (independent of the parser).
 */
export interface Range { start: { line: number; character: number }; end: { line: number; character: number } }

export function at(text: string, snippet: string, occurrence = 1, within?: string): Range {
    let base = 0;
    if (within !== undefined) {
        base = text.indexOf(within);
        if (base < 0) throw new Error(`anchor not found: ${within}`);
    }
    let offset = base - 1;
    for (let i = 0; i < occurrence; i++) {
        offset = text.indexOf(snippet, offset + 1);
        if (offset < 0) throw new Error(`snippet not found: ${snippet} (#${occurrence})`);
    }
    return { start: pos(text, offset), end: pos(text, offset + snippet.length) };
}

function pos(text: string, offset: number): { line: number; character: number } {
    const before = text.slice(0, offset);
    const line = before.split('\n').length - 1;
    return { line, character: offset - (before.lastIndexOf('\n') + 1) };
}
