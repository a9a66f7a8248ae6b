/**
 * The result of synthesis: the shape the exporters, the CLI and the editor consume.
 * OWNED BY the synthesis work (issue 3); fields may be added, none removed or renamed.
 */
import type { Cube } from '../boolean/cube.js';
import type { FlipFlopKind, Machine } from '../model/machine.js';
import type { StateAssignment } from './encoding.js';

export type EquationRole = 'excitation' | 'output' | 'registered-output';

export interface Equation {
    /** LANGUAGE.md names: d0 / t0 / j0,k0 / s0,r0; outputs by name, bus bits `y[i]`. Registered outputs: the D input, named `y` (or `y[i]`). */
    readonly name: string;
    readonly role: EquationRole;
    /** For excitation equations: the state bit (q{i}). */
    readonly stateBit?: number;
    /** For output equations: the output index and bit. */
    readonly output?: number;
    readonly outputBit?: number;
    /** Sum of products over `SynthesisResult.variables`. Empty = constant 0; `[universe]` = constant 1. */
    readonly cover: readonly Cube[];
    /** True when the minimizer proved this cover minimal. */
    readonly exact: boolean;
    /**
     * The ON-set and don't-care set the minimizer was given (over the same variables), for
     * Karnaugh maps; absent for one-hot equations built from their hot-bit structure.
     */
    readonly onSet?: readonly Cube[];
    readonly dontCare?: readonly Cube[];
}

export interface Cost {
    readonly flipflops: number;
    /** Σ over equations of the literals of each product. */
    readonly literals: number;
    /** Σ over equations of (literals of products with ≥ 2 literals) + (number of products, when ≥ 2). */
    readonly gateInputs: number;
    readonly products: number;
    /** Largest gate fan-in (AND or OR) in the two-level network. */
    readonly maxFanIn: number;
}

export interface SynthesisResult {
    readonly machine: Machine;
    readonly assignment: StateAssignment;
    readonly flipflop: FlipFlopKind;
    /**
     * Names of the cube variables of every equation: the input variables (model/variables.ts order)
     * first, then the state bits q0 … q{width-1}.
     */
    readonly variables: readonly string[];
    /** How many of `variables` are inputs (state bit i is variable `inputCount + i`). */
    readonly inputCount: number;
    readonly equations: readonly Equation[];
    readonly cost: Cost;
    /** Flip-flops of registered output bits (included in `cost.flipflops`, see docs/decisions.md). */
    readonly outputFlipflops?: number;
    /** Whether unused codes are don't-cares ('dontcare'), go to the `recover` state ('recover'), or — one-hot/one-cold structured logic — are left to the hot-bit terms ('structural'). */
    readonly unusedCodes?: 'dontcare' | 'recover' | 'structural';
    /** Things the user should know about this result (minimizer fallbacks, S·R repairs, search limits). */
    readonly notes?: readonly string[];
}
