import type { SourcePosition, SourceRange } from '@detent/core';

/** Offset ↔ 0-based line/character (UTF-16 code units, like LSP) for one text. */
export class LineIndex {
    private readonly starts: number[] = [0];

    constructor(private readonly text: string) {
        for (let i = 0; i < text.length; i++) {
            const c = text.charCodeAt(i);
            if (c === 10) this.starts.push(i + 1);
            else if (c === 13 && text.charCodeAt(i + 1) !== 10) this.starts.push(i + 1);
        }
    }

    position(offset: number): SourcePosition {
        const o = Math.max(0, Math.min(offset, this.text.length));
        let lo = 0;
        let hi = this.starts.length - 1;
        while (lo < hi) {
            const mid = (lo + hi + 1) >> 1;
            if (this.starts[mid]! <= o) lo = mid;
            else hi = mid - 1;
        }
        return { line: lo, character: o - this.starts[lo]! };
    }

    range(offset: number, length: number): SourceRange {
        return { start: this.position(offset), end: this.position(offset + Math.max(0, length)) };
    }

    /** The whole text's end position. */
    end(): SourcePosition {
        return this.position(this.text.length);
    }
}
