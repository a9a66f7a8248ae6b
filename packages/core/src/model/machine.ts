/**
 * The machine model: what a `.detent` file means, free of any parser or editor type.
 *
 * Elements refer to each other by index (state index = declaration order, input index,
 * output index) so that analyses can use dense arrays. Every element carries a
 * `SourceRange` handle so findings can be mapped back to the text by the language package.
 */

/** A zero-based line/character position (the shape LSP uses, but owned by core). */
export interface SourcePosition {
    readonly line: number;
    readonly character: number;
}

export interface SourceRange {
    readonly start: SourcePosition;
    readonly end: SourcePosition;
}

export const NO_RANGE: SourceRange = { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } };

export type EncodingKind = 'binary' | 'gray' | 'onehot' | 'onecold' | 'johnson' | 'explicit' | 'auto';
export const ENCODING_KINDS: readonly EncodingKind[] = ['binary', 'gray', 'onehot', 'onecold', 'johnson', 'explicit', 'auto'];

export type FlipFlopKind = 'D' | 'T' | 'JK' | 'SR';
export const FLIPFLOP_KINDS: readonly FlipFlopKind[] = ['D', 'T', 'JK', 'SR'];

export interface Clock {
    readonly name: string;
    readonly edge: 'rising' | 'falling';
    /** Range of the `clock` declaration; NO_RANGE when the default clock is implied. */
    readonly range: SourceRange;
}

export interface Reset {
    readonly name: string;
    readonly activeHigh: boolean;
    readonly async: boolean;
    /** State index the reset loads, or 'clear' for a reset that only clears every flip-flop. */
    readonly target: number | 'clear';
    readonly range: SourceRange;
    readonly nameRange: SourceRange;
}

export interface Input {
    readonly name: string;
    /** 1 for a single-bit input; the bus width otherwise. */
    readonly width: number;
    /** True when declared with `[w]` (even `[1]`): a bus is read by bit select or comparison. */
    readonly isBus: boolean;
    /** Declared `async`: not synchronous to the clock. */
    readonly async: boolean;
    readonly range: SourceRange;
    readonly nameRange: SourceRange;
}

export interface Output {
    readonly name: string;
    readonly width: number;
    readonly isBus: boolean;
    /** Taken from a flip-flop: D input = Moore value of the next state. Moore only. */
    readonly registered: boolean;
    readonly range: SourceRange;
    readonly nameRange: SourceRange;
}

export type CompareOp = '==' | '!=' | '<' | '<=' | '>' | '>=';

/** A guard expression over inputs. `input` indices refer to `Machine.inputs`. */
export type Guard =
    | { readonly kind: 'const'; readonly value: boolean; readonly range: SourceRange }
    /** A single-bit input read as a whole. */
    | { readonly kind: 'input'; readonly input: number; readonly range: SourceRange }
    /** `bus[i]`: one bit of a bus (bit 0 is the least significant). */
    | { readonly kind: 'bit'; readonly input: number; readonly bit: number; readonly range: SourceRange }
    /** Unsigned comparison of a bus with a constant. */
    | { readonly kind: 'compare'; readonly input: number; readonly op: CompareOp; readonly value: number; readonly range: SourceRange }
    | { readonly kind: 'not'; readonly operand: Guard; readonly range: SourceRange }
    | { readonly kind: 'and' | 'or' | 'xor'; readonly operands: readonly Guard[]; readonly range: SourceRange };

/** `emit y` (value 1) or `emit y = v`. */
export interface Emit {
    readonly output: number;
    readonly value: number;
    readonly range: SourceRange;
}

export interface Transition {
    readonly guard: Guard;
    readonly target: number;
    /** Mealy outputs: true while in the source state with the guard true. */
    readonly emits: readonly Emit[];
    readonly range: SourceRange;
    /** Range of the target name, for rename and go-to-definition. */
    readonly targetRange: SourceRange;
}

export type Otherwise =
    | { readonly kind: 'goto'; readonly target: number; readonly emits: readonly Emit[]; readonly range: SourceRange; readonly targetRange: SourceRange }
    | { readonly kind: 'stay'; readonly range: SourceRange }
    | { readonly kind: 'dontcare'; readonly range: SourceRange };

export interface StateCode {
    /** MSB first, as written (`0b0010` → "0010"). */
    readonly bits: string;
    readonly range: SourceRange;
}

export interface State {
    readonly name: string;
    readonly index: number;
    readonly doc?: string;
    readonly priority: boolean;
    /** Moore outputs. */
    readonly emits: readonly Emit[];
    readonly transitions: readonly Transition[];
    readonly otherwise?: Otherwise;
    /** From a `code S = …;` line (only meaningful with `encoding explicit`). */
    readonly code?: StateCode;
    readonly range: SourceRange;
    readonly nameRange: SourceRange;
}

export interface InputAssignment {
    readonly input: number;
    readonly value: number;
    readonly range: SourceRange;
}

export interface OutputExpectation {
    readonly output: number;
    readonly value: number;
    readonly range: SourceRange;
}

export type ScenarioStep =
    | { readonly kind: 'reset'; readonly range: SourceRange }
    /** Apply `assignments` (other inputs 0) for `repeat` clocks. */
    | { readonly kind: 'step'; readonly assignments: readonly InputAssignment[]; readonly repeat: number; readonly range: SourceRange }
    /** Check, after the last edge and with the last step's inputs still applied. */
    | { readonly kind: 'expect'; readonly state?: number; readonly outputs: readonly OutputExpectation[]; readonly range: SourceRange };

export interface Scenario {
    readonly name: string;
    readonly steps: readonly ScenarioStep[];
    readonly range: SourceRange;
    readonly nameRange: SourceRange;
}

export interface Machine {
    readonly name: string;
    readonly doc?: string;
    readonly clock: Clock;
    readonly reset?: Reset;
    readonly inputs: readonly Input[];
    readonly outputs: readonly Output[];
    /** In declaration order; `states[i].index === i`. */
    readonly states: readonly State[];
    readonly encoding: EncodingKind;
    readonly encodingRange: SourceRange;
    readonly flipflop: FlipFlopKind;
    readonly flipflopRange: SourceRange;
    readonly recover?: { readonly target: number; readonly range: SourceRange };
    readonly scenarios: readonly Scenario[];
    readonly range: SourceRange;
    readonly nameRange: SourceRange;
}

/** The state the machine starts in: the reset target, or the first state without a reset target. */
export function initialState(machine: Machine): number {
    const target = machine.reset?.target;
    return typeof target === 'number' ? target : 0;
}
