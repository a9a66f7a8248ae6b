// Karnaugh maps and equation text, checked against brute-force truth tables written here.
// Oracles: every cube is given as a string (Espresso PLA order, variable 0 first) and evaluated
// by `pla` below, which does not use the code under test. The map shape follows the usual
// hand-drawn convention (from memory): Gray-ordered rows/columns, 4×4 for four variables,
// layers of 4×4 for five and six; the defining property checked is that neighbouring cells,
// wrap-around included, differ in exactly one variable.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { cubeFromString, cubeToString } from '../../src/boolean/cube.js';
import { synthesize } from '../../src/synthesis/run.js';
import { mulberry32, randomMachine } from '../support/random-machine.js';
import { karnaughMap, renderKarnaughMap } from '../../src/synthesis/kmap.js';
import { coverText, restrictToCode } from '../../src/synthesis/equation-text.js';

/** Brute-force evaluation of PLA cube strings on an assignment (bits[v] = variable v). */
function pla(cubes: readonly string[], bits: readonly number[]): boolean {
    return cubes.some((c) => [...c].every((ch, v) => ch === '-' || Number(ch) === bits[v]));
}

function allAssignments(n: number): number[][] {
    return Array.from({ length: 2 ** n }, (_, m) => Array.from({ length: n }, (_, v) => (m >>> v) & 1));
}

/** Independent evaluator of the HDL text form `~a & b | c` (Verilog precedence: ~ > & > |). */
function evalHdl(text: string, env: ReadonlyMap<string, number>): boolean {
    if (text === '0') return false;
    if (text === '1') return true;
    return text.split(' | ').some((p) => p.split(' & ').every((lit) => (lit.startsWith('~') ? env.get(lit.slice(1)) === 0 : env.get(lit) === 1)));
}

/** Independent evaluator of the textbook form `a'·b + c`. */
function evalTextbook(text: string, env: ReadonlyMap<string, number>): boolean {
    if (text === '0') return false;
    if (text === '1') return true;
    return text.split(' + ').some((p) => p.split('·').every((lit) => (lit.endsWith("'") ? env.get(lit.slice(0, -1)) === 0 : env.get(lit) === 1)));
}

const cubeString = (n: number) => fc.array(fc.constantFrom('0', '1', '-'), { minLength: n, maxLength: n }).map((a) => a.join(''));

describe('equation text', () => {
    it('prints the examples of the brief', () => {
        // variables: inputs ready, abort; state bits q0, q1 → print order q1 q0 ready abort
        const vars = { variables: ['ready', 'abort', 'q0', 'q1'], inputCount: 2 };
        const cover = [cubeFromString('1--0'), cubeFromString('-11-')];
        expect(coverText(cover, vars, 'textbook')).toBe("q1'·ready + q0·abort");
        expect(coverText(cover, vars, 'hdl')).toBe('~q1 & ready | q0 & abort');
        expect(coverText([], vars, 'hdl')).toBe('0');
        expect(coverText([cubeFromString('----')], vars, 'textbook')).toBe('1');
    });

    it('both notations denote the cover (brute force, 5 variables)', () => {
        const names = ['a', 'b', 'c', 'q0', 'q1'];
        const vars = { variables: names, inputCount: 3 };
        fc.assert(fc.property(fc.array(cubeString(5), { maxLength: 6 }), (cubes) => {
            const cover = cubes.map(cubeFromString);
            const hdl = coverText(cover, vars, 'hdl');
            const book = coverText(cover, vars, 'textbook');
            for (const bits of allAssignments(5)) {
                const env = new Map(names.map((n, i) => [n, bits[i]!]));
                expect(evalHdl(hdl, env)).toBe(pla(cubes, bits));
                expect(evalTextbook(book, env)).toBe(pla(cubes, bits));
            }
        }), { seed: 4711, numRuns: 200 });
    });

    it('restriction to a state code is the cofactor (brute force)', () => {
        const names = ['a', 'b', 'q0', 'q1'];
        const vars = { variables: names, inputCount: 2 };
        fc.assert(fc.property(fc.array(cubeString(4), { maxLength: 5 }), fc.constantFrom('00', '01', '10', '11'), (cubes, code) => {
            const text = coverText(restrictToCode(cubes.map(cubeFromString), code, vars), vars, 'hdl');
            // code is MSB first: code[0] is q1, code[1] is q0
            const q1 = Number(code[0]);
            const q0 = Number(code[1]);
            expect(text.includes('q')).toBe(false);
            for (const [a, b] of allAssignments(2)) {
                const env = new Map([['a', a!], ['b', b!]]);
                expect(evalHdl(text, env)).toBe(pla(cubes, [a!, b!, q0, q1]));
            }
        }), { seed: 99, numRuns: 200 });
    });
});

describe('Karnaugh map', () => {
    for (const n of [1, 2, 3, 4, 5, 6]) {
        it(`matches the truth table and is Gray-adjacent (${n} variables)`, () => {
            const names = Array.from({ length: n }, (_, i) => `x${i}`);
            const vars = { variables: names, inputCount: n };
            // force full support with one cube that has a literal on every variable
            const fullSupport = fc.array(fc.constantFrom('0', '1'), { minLength: n, maxLength: n }).map((a) => a.join(''));
            fc.assert(fc.property(fullSupport, fc.array(cubeString(n), { maxLength: 4 }), fc.array(cubeString(n), { maxLength: 2 }), (first, rest, dcCubes) => {
                const onCubes = [first, ...rest];
                const map = karnaughMap(onCubes.map(cubeFromString), vars, { dc: dcCubes.map(cubeFromString) })!;
                expect(map).toBeDefined();
                const layers = map.layers.length;
                const rows = map.layers[0]!.cells.length;
                const cols = map.layers[0]!.cells[0]!.length;
                // shape: 2^n cells; 4×4 per layer from four variables on
                expect(layers * rows * cols).toBe(2 ** n);
                if (n >= 4) { expect(rows).toBe(4); expect(cols).toBe(4); expect(layers).toBe(2 ** (n - 4)); }
                const seen = new Set<string>();
                const cellAt = (l: number, r: number, c: number) => map.layers[l]!.cells[r]![c]!;
                for (let l = 0; l < layers; l++) for (let r = 0; r < rows; r++) for (let c = 0; c < cols; c++) {
                    const cell = cellAt(l, r, c);
                    const bits: number[] = new Array(n);
                    map.mapVariables.forEach((v, k) => { bits[v] = cell.bits[k]!; });
                    seen.add(bits.join(''));
                    const isOn = pla(onCubes, bits);
                    const isDc = pla(dcCubes, bits);
                    expect(cell.value).toBe(isOn ? 1 : isDc ? '-' : 0);
                    // groups default to the ON cubes: marked exactly where each cube is true
                    const expectedGroups = onCubes.map((cube, i) => (pla([cube], bits) ? i : -1)).filter((i) => i >= 0);
                    expect([...cell.groups]).toEqual(expectedGroups);
                    // Gray adjacency: right and down neighbours (wrapping) differ in exactly one variable
                    const differ = (a: readonly number[], b: readonly number[]) => a.filter((x, i) => x !== b[i]).length;
                    if (cols > 1) expect(differ(cell.bits, cellAt(l, r, (c + 1) % cols).bits)).toBe(1);
                    if (rows > 1) expect(differ(cell.bits, cellAt(l, (r + 1) % rows, c).bits)).toBe(1);
                    if (layers > 1) expect(differ(cell.bits, cellAt((l + 1) % layers, r, c).bits)).toBe(1);
                }
                expect(seen.size).toBe(2 ** n);
            }), { seed: 20261202 + n, numRuns: 60 });
        });
    }

    it('renders a 4-variable map with groups and a legend', () => {
        const vars = { variables: ['ready', 'abort', 'q0', 'q1'], inputCount: 2 };
        const cover = [cubeFromString('1--0'), cubeFromString('-11-')];
        const text = renderKarnaughMap(karnaughMap(cover, vars)!, vars);
        const lines = text.split('\n');
        // header row holds the Gray column labels in order
        expect(lines.some((l) => /00\s+01\s+11\s+10/.test(l))).toBe(true);
        expect(text).toContain("A = q1'·ready");
        expect(text).toContain('B = q0·abort');
        // the cell q1=0,q0=1, ready=1, abort=1 is covered by both products
        expect(text).toContain('1 AB');
    });

    it('has no map for constants or more than six variables', () => {
        expect(karnaughMap([], { variables: ['a'], inputCount: 1 })).toBeUndefined();
        const vars = { variables: ['a', 'b', 'c', 'd', 'e', 'f', 'g'], inputCount: 7 };
        expect(karnaughMap([cubeFromString('0101010')], vars)).toBeUndefined();
    });
});

describe('Karnaugh maps of synthesized equations (ON-set and don\'t-cares over the cover\'s variables)', () => {
    it('every cell agrees with brute force over the variables not drawn; groups cover every 1 and no 0 (80 random machines)', () => {
        const rng = mulberry32(8_2026);
        let maps = 0;
        let dashes = 0;
        for (let m = 0; m < 80; m++) {
            const machine = randomMachine(rng, { minStates: 3, maxStates: 6, maxBitInputs: 2, maxBuses: 0 }, `M${m}`);
            const encoding = (['binary', 'gray', 'johnson'] as const)[m % 3];
            const r = synthesize(machine, { encoding, flipflop: (['D', 'T', 'JK', 'SR'] as const)[m % 4] });
            const n = r.variables.length;
            if (n > 10) continue;
            const vars = { variables: r.variables, inputCount: r.inputCount };
            for (const e of r.equations) {
                if (!e.onSet || e.cover.length === 0) continue;
                const map = karnaughMap(e.onSet, vars, { dc: e.dontCare ?? [], groups: e.cover, drawn: [e.cover] });
                if (!map) continue;
                maps++;
                const on = e.onSet.map((c) => cubeToString(c, n));
                const dc = (e.dontCare ?? []).map((c) => cubeToString(c, n));
                const cover = e.cover.map((c) => cubeToString(c, n));
                const all = allAssignments(n);
                for (const layer of map.layers) for (const row of layer.cells) for (const cell of row) {
                    const inCell = all.filter((bits) => map.mapVariables.every((v, k) => bits[v] === cell.bits[k]));
                    const anyOn = inCell.some((bits) => pla(on, bits));
                    const allDc = inCell.every((bits) => pla(dc, bits) && !pla(on, bits));
                    const expected = anyOn ? 1 : allDc ? '-' : 0;
                    expect(cell.value, `${machine.name} ${e.name} cell ${cell.bits.join('')}`).toBe(expected);
                    if (expected === '-') dashes++;
                    // The cover does not depend on the hidden variables, so its value is the cell's.
                    const covered = pla(cover, inCell[0]!);
                    expect(cell.groups.length > 0).toBe(covered);
                    if (cell.value === 1) expect(covered).toBe(true);
                    if (cell.value === 0) expect(covered).toBe(false);
                }
            }
        }
        expect(maps).toBeGreaterThan(100);
        expect(dashes).toBeGreaterThan(0);
    });
});
