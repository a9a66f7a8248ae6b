/**
 * Sums of products as text, in two notations:
 * - textbook: `q1'·ready + q0·abort` (prime for complement, middle dot for AND, + for OR);
 * - HDL:      `~q1 & ready | q0 & abort` (Verilog operators; & binds tighter than |, so no parentheses).
 *
 * Literal order inside a product: state bits from the most significant down, then the inputs in
 * variable order — the order a designer reads a row of the next-state table in.
 */
import { type Cube, FREE, ONE, getVar, isUniverse, universe, setVarInPlace, ZERO } from '../boolean/cube.js';
import { type Cover, coverCofactor, removeContained, tautology } from '../boolean/cover.js';

export type EquationNotation = 'textbook' | 'hdl';

/** Names of the cube variables and how many of them are inputs (the rest are state bits q0…). */
export interface EquationVariables {
    readonly variables: readonly string[];
    readonly inputCount: number;
}

/** The variable order used for printing: state bits MSB first, then inputs. */
export function printOrder(vars: EquationVariables): number[] {
    const order: number[] = [];
    for (let v = vars.variables.length - 1; v >= vars.inputCount; v--) order.push(v);
    for (let v = 0; v < vars.inputCount; v++) order.push(v);
    return order;
}

function literalText(name: string, positive: boolean, notation: EquationNotation): string {
    if (positive) return name;
    return notation === 'textbook' ? `${name}'` : `~${name}`;
}

/** One product as text; the universal cube is the constant `1`. */
export function productText(cube: Cube, vars: EquationVariables, notation: EquationNotation): string {
    const nvars = vars.variables.length;
    const literals: string[] = [];
    for (const v of printOrder(vars)) {
        const field = getVar(cube, v);
        if (field === FREE) continue;
        literals.push(literalText(vars.variables[v]!, field === ONE, notation));
    }
    if (literals.length === 0 || isUniverse(cube, nvars)) return '1';
    return literals.join(notation === 'textbook' ? '·' : ' & ');
}

/** A cover as text: empty cover `0`, a cover holding the universal cube `1`. */
export function coverText(cover: Cover, vars: EquationVariables, notation: EquationNotation): string {
    if (cover.length === 0) return '0';
    const nvars = vars.variables.length;
    if (cover.some((c) => isUniverse(c, nvars))) return '1';
    return cover.map((c) => productText(c, vars, notation)).join(notation === 'textbook' ? ' + ' : ' | ');
}

/** `name = sum-of-products`. */
export function equationText(name: string, cover: Cover, vars: EquationVariables, notation: EquationNotation): string {
    return `${name} = ${coverText(cover, vars, notation)}`;
}

/** The cube fixing the state bits to `code` (MSB first, as StateAssignment writes it). */
export function stateCodeCube(code: string, vars: EquationVariables): Cube {
    const nvars = vars.variables.length;
    const cube = universe(nvars);
    const width = nvars - vars.inputCount;
    for (let bit = 0; bit < width; bit++) {
        const ch = code[code.length - 1 - bit];
        setVarInPlace(cube, vars.inputCount + bit, ch === '1' ? ONE : ZERO);
    }
    return cube;
}

/**
 * The cover restricted to one state code: the cofactor with respect to the code's cube, so only
 * input literals remain (`t1 = overload + low_float'` in state Pumping). Contained cubes are
 * dropped and a tautology collapses to the constant 1.
 */
export function restrictToCode(cover: Cover, code: string, vars: EquationVariables): Cube[] {
    const nvars = vars.variables.length;
    const restricted = removeContained(coverCofactor(cover, stateCodeCube(code, vars), nvars));
    if (restricted.length > 0 && tautology(restricted, nvars)) return [universe(nvars)];
    return restricted;
}
