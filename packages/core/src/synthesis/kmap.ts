/**
 * Karnaugh maps of small functions (1–6 variables), as a structure and as text.
 *
 * Rows and columns run in reflected Gray order (00 01 11 10), so neighbouring cells differ in one
 * variable and every product term is a rectangle (wrapping at the edges). Up to four variables
 * fit one map; 5 and 6 variables are drawn as 2 or 4 layers of 4×4, the layers themselves in
 * Gray order of the leading variables.
 */
import { type Cube, FREE, ONE, ZERO, getVar, setVarInPlace, universe } from '../boolean/cube.js';
import { coverHasCube } from '../boolean/espresso/unate.js';
import type { Cover } from '../boolean/cover.js';
import { type EquationVariables, printOrder, productText } from './equation-text.js';

export const KMAP_MAX_VARIABLES = 6;

export type KarnaughValue = 0 | 1 | '-';

export interface KarnaughCell {
    /** Value of each map variable in this cell, aligned with `KarnaughMap.mapVariables`. */
    readonly bits: readonly (0 | 1)[];
    readonly value: KarnaughValue;
    /** Indices into `KarnaughMap.groups` of the products covering this cell. */
    readonly groups: readonly number[];
}

export interface KarnaughLayer {
    /** Values of the layer variables (aligned with `layerVariables`). */
    readonly bits: readonly (0 | 1)[];
    /** `cells[row][column]`. */
    readonly cells: readonly (readonly KarnaughCell[])[];
}

export interface KarnaughMap {
    /** Cube variable indices drawn, in order: layer variables, row variables, column variables. */
    readonly mapVariables: readonly number[];
    readonly layerVariables: readonly number[];
    readonly rowVariables: readonly number[];
    readonly columnVariables: readonly number[];
    readonly layers: readonly KarnaughLayer[];
    /** The chosen products (the minimized cover), each marked in the cells it covers. */
    readonly groups: readonly Cube[];
}

/** The reflected Gray sequence of `bits` bits: i XOR (i >> 1). */
export function graySequence(bits: number): number[] {
    return Array.from({ length: 2 ** bits }, (_, i) => i ^ (i >>> 1));
}

/** Variables some cube of the covers has a literal on. */
export function supportOf(covers: readonly Cover[], nvars: number): Set<number> {
    const support = new Set<number>();
    for (const cover of covers) for (const cube of cover) {
        for (let v = 0; v < nvars; v++) if (getVar(cube, v) !== FREE) support.add(v);
    }
    return support;
}

/** Value of bit `k` (0 = most significant of `width`) of a number. */
function bitOf(value: number, k: number, width: number): 0 | 1 {
    return ((value >>> (width - 1 - k)) & 1) === 1 ? 1 : 0;
}

/** The cube of a cell: the drawn variables fixed, the others free. */
function cellCube(assignment: ReadonlyMap<number, 0 | 1>, nvars: number): Cube {
    const c = universe(nvars);
    for (const [v, bit] of assignment) setVarInPlace(c, v, bit === 1 ? ONE : ZERO);
    return c;
}

function cubeHoldsPartial(cube: Cube, assignment: ReadonlyMap<number, 0 | 1>): boolean {
    for (const [v, bit] of assignment) {
        const field = getVar(cube, v);
        if (field === FREE) continue;
        if ((field === ONE) !== (bit === 1)) return false;
    }
    return true;
}

export interface KarnaughOptions {
    /** Don't-care set (shown as `-` where not in the ON-set). */
    readonly dc?: Cover;
    /** The products to mark; defaults to the ON cover itself. */
    readonly groups?: Cover;
    /**
     * The covers whose variables the map draws (default: ON, DC and the groups). With the
     * minimized cover alone the map stays small; a cell then stands for every completion of
     * the variables not drawn: 1 when it holds an ON minterm, `-` when all of it is don't-care,
     * else 0 (a correct cover, independent of those variables, is 0 on such a cell).
     */
    readonly drawn?: readonly Cover[];
}

/**
 * The map of a function with ON-set `on` over `vars`. The map draws the support of ON, DC and
 * the groups, in print order (state bits MSB first, then inputs). Returns undefined for a
 * constant (no variable) or when more than six variables are involved.
 */
export function karnaughMap(on: Cover, vars: EquationVariables, options: KarnaughOptions = {}): KarnaughMap | undefined {
    const nvars = vars.variables.length;
    const dc = options.dc ?? [];
    const groups = [...(options.groups ?? on)];
    const support = supportOf(options.drawn ?? [on, dc, groups], nvars);
    if (support.size === 0 || support.size > KMAP_MAX_VARIABLES) return undefined;
    const mapVariables = printOrder(vars).filter((v) => support.has(v));
    const n = mapVariables.length;
    const layerCount = Math.max(0, n - 4);
    const columnCount = n === 1 ? 1 : Math.min(2, Math.ceil((n - layerCount) / 2));
    const rowCount = n - layerCount - columnCount;
    const layerVariables = mapVariables.slice(0, layerCount);
    const rowVariables = mapVariables.slice(layerCount, layerCount + rowCount);
    const columnVariables = mapVariables.slice(layerCount + rowCount);

    const layers: KarnaughLayer[] = [];
    for (const layerValue of graySequence(layerCount)) {
        const rows: KarnaughCell[][] = [];
        for (const rowValue of graySequence(rowCount)) {
            const row: KarnaughCell[] = [];
            for (const columnValue of graySequence(columnVariables.length)) {
                const assignment = new Map<number, 0 | 1>();
                layerVariables.forEach((v, k) => assignment.set(v, bitOf(layerValue, k, layerCount)));
                rowVariables.forEach((v, k) => assignment.set(v, bitOf(rowValue, k, rowCount)));
                columnVariables.forEach((v, k) => assignment.set(v, bitOf(columnValue, k, columnVariables.length)));
                const isOn = on.some((c) => cubeHoldsPartial(c, assignment));
                const isDc = !isOn && coverHasCube(dc, cellCube(assignment, nvars), nvars);
                const covering: number[] = [];
                groups.forEach((g, i) => { if (cubeHoldsPartial(g, assignment)) covering.push(i); });
                row.push({ bits: mapVariables.map((v) => assignment.get(v)!), value: isOn ? 1 : isDc ? '-' : 0, groups: covering });
            }
            rows.push(row);
        }
        layers.push({ bits: layerVariables.map((_, k) => bitOf(layerValue, k, layerCount)), cells: rows });
    }
    return { mapVariables, layerVariables, rowVariables, columnVariables, layers, groups };
}

/** A, B, … Z, AA, AB, … */
export function groupLabel(i: number): string {
    let s = '';
    let k = i;
    do {
        s = String.fromCharCode(65 + (k % 26)) + s;
        k = Math.floor(k / 26) - 1;
    } while (k >= 0);
    return s;
}

function bitsText(value: number, width: number): string {
    let s = '';
    for (let k = 0; k < width; k++) s += bitOf(value, k, width);
    return s;
}

/**
 * The map as monospaced text: one block per layer, columns headed by the column variables' Gray
 * values, rows by the row variables'. A cell shows its value and the letters of the groups
 * covering it; the legend below gives each group's product in textbook notation.
 */
export function renderKarnaughMap(map: KarnaughMap, vars: EquationVariables): string {
    const name = (v: number) => vars.variables[v]!;
    const rowHead = map.rowVariables.map(name).join(' ') || ' ';
    const columnHead = map.columnVariables.map(name).join(' ');
    const cellText = (cell: KarnaughCell) => `${cell.value}${cell.groups.length ? ' ' + cell.groups.map(groupLabel).join('') : ''}`;
    let cellWidth = Math.max(map.columnVariables.length, 1);
    for (const layer of map.layers) for (const row of layer.cells) for (const cell of row) cellWidth = Math.max(cellWidth, cellText(cell).length);
    cellWidth += 2;
    const rowLabelWidth = Math.max(rowHead.length, map.rowVariables.length) + 1;
    const lines: string[] = [];
    const columnValues = graySequence(map.columnVariables.length);
    const rowValues = graySequence(map.rowVariables.length);
    const layerValues = graySequence(map.layerVariables.length);
    map.layers.forEach((layer, li) => {
        if (map.layerVariables.length > 0) {
            lines.push(`${map.layerVariables.map(name).join(' ')} = ${bitsText(layerValues[li]!, map.layerVariables.length)}:`);
        }
        lines.push(`${' '.repeat(rowLabelWidth)}  ${columnHead}`);
        lines.push(`${rowHead.padEnd(rowLabelWidth)}│ ${columnValues.map((c) => bitsText(c, map.columnVariables.length).padEnd(cellWidth)).join('').trimEnd()}`);
        lines.push(`${'─'.repeat(rowLabelWidth)}┼${'─'.repeat(columnValues.length * cellWidth + 1)}`);
        layer.cells.forEach((row, ri) => {
            const label = map.rowVariables.length ? bitsText(rowValues[ri]!, map.rowVariables.length) : '';
            lines.push(`${label.padStart(rowLabelWidth - 1).padEnd(rowLabelWidth)}│ ${row.map((cell) => cellText(cell).padEnd(cellWidth)).join('').trimEnd()}`);
        });
        lines.push('');
    });
    if (map.groups.length > 0) {
        lines.push(map.groups.map((g, i) => `${groupLabel(i)} = ${productText(g, vars, 'textbook')}`).join('   '));
    }
    return lines.join('\n').trimEnd() + '\n';
}
