/**
 * `/** … *\/` documentation: the block comment directly before a machine or state (only
 * whitespace between), with the comment markers and leading `*` of each line removed.
 */
export function docBefore(text: string, offset: number): string | undefined {
    let i = offset - 1;
    while (i >= 0 && /\s/.test(text[i]!)) i--;
    if (i < 1 || text[i] !== '/' || text[i - 1] !== '*') return undefined;
    const start = text.lastIndexOf('/*', i - 2);
    if (start < 0 || text[start + 2] !== '*' || start + 3 > i - 1) return undefined;
    // a `/**/` is empty, and `/*` inside a line comment is no doc comment
    const lineStart = text.lastIndexOf('\n', start) + 1;
    if (text.slice(lineStart, start).includes('//')) return undefined;
    const body = text.slice(start + 3, i - 1);
    const lines = body.split(/\r?\n/).map((l) => l.replace(/^\s*\*? ?/, '').trimEnd());
    while (lines.length > 0 && lines[0] === '') lines.shift();
    while (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
    const doc = lines.join('\n').trim();
    return doc.length > 0 ? doc : undefined;
}
