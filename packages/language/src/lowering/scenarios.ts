/**
 * Scenario AST → core `Scenario`. A scenario with an error is left out of the model (the
 * machine stays usable for the analyses; only that scenario does not run).
 */
import type { Input, InputAssignment, Output, OutputExpectation, Scenario, ScenarioStep } from '@detent/core';
import type * as ast from '../generated/ast.js';
import { type LoweringContext, parseNumber, propertyRange, rangeOf, referenceRange } from './context.js';
import type { MachineSymbols } from './symbols.js';

/** Longest run of one `step … * n` (keeps a scenario from simulating for hours). */
export const MAX_STEP_REPEAT = 1_000_000;

export function lowerScenario(
    node: ast.Scenario, ctx: LoweringContext, symbols: MachineSymbols, inputs: readonly Input[], outputs: readonly Output[],
): Scenario | undefined {
    const before = ctx.findings.length;
    const wasBlocked = ctx.blocked;
    const steps: ScenarioStep[] = [];
    for (const step of node.steps) {
        const range = rangeOf(step);
        switch (step.$type) {
            case 'ResetStep':
                steps.push({ kind: 'reset', range });
                break;
            case 'InputStep': {
                const assignments: InputAssignment[] = [];
                for (const a of step.assignments) {
                    const name = a.signal?.$refText ?? '';
                    const index = symbols.inputs.get(name);
                    if (index === undefined) {
                        ctx.report('unknown-name', symbols.unknown(name, 'input', 'a step sets inputs'), referenceRange(a.signal, a), { signal: name });
                        continue;
                    }
                    const width = inputs[index]!.width;
                    const value = a.value === undefined ? 1 : parseNumber(a.value).value;
                    if (!(value <= 2 ** width - 1)) {
                        ctx.report('width', `${a.value} does not fit input '${name}' (${width} bit${width === 1 ? '' : 's'}, at most ${2 ** width - 1})`, rangeOf(a), { signal: name });
                        continue;
                    }
                    const twice = assignments.find((x) => x.input === index);
                    if (twice) {
                        ctx.report('duplicate-name', `'${name}' is set twice in one step`, rangeOf(a), { signal: name, related: [{ message: 'first set here', range: twice.range }] });
                        continue;
                    }
                    assignments.push({ input: index, value, range: rangeOf(a) });
                }
                let repeat = 1;
                if (step.repeat !== undefined) {
                    repeat = parseNumber(step.repeat).value;
                    if (!(repeat >= 1 && repeat <= MAX_STEP_REPEAT)) {
                        ctx.report('scenario', `a step repeats 1 to ${MAX_STEP_REPEAT} times, not ${step.repeat}`, propertyRange(step, 'repeat'));
                        repeat = 1;
                    }
                }
                steps.push({ kind: 'step', assignments, repeat, range });
                break;
            }
            case 'ExpectStep': {
                let state: number | undefined;
                if (step.state) {
                    const name = step.state.$refText;
                    state = symbols.states.get(name);
                    if (state === undefined) ctx.report('unknown-name', symbols.unknown(name, 'state', 'expect names a state'), referenceRange(step.state, step), { state: name });
                }
                const expected: OutputExpectation[] = [];
                for (const o of step.outputs) {
                    const name = o.output?.$refText ?? '';
                    const index = symbols.outputs.get(name);
                    if (index === undefined) {
                        ctx.report('unknown-name', symbols.unknown(name, 'output', '`with` lists outputs'), referenceRange(o.output, o), { signal: name });
                        continue;
                    }
                    const width = outputs[index]!.width;
                    const value = o.value === undefined ? 1 : parseNumber(o.value).value;
                    if (!(value <= 2 ** width - 1)) {
                        ctx.report('width', `${o.value} does not fit output '${name}' (${width} bit${width === 1 ? '' : 's'}, at most ${2 ** width - 1})`, rangeOf(o), { signal: name });
                        continue;
                    }
                    const twice = expected.find((x) => x.output === index);
                    if (twice) {
                        ctx.report('duplicate-name', `'${name}' is expected twice`, rangeOf(o), { signal: name, related: [{ message: 'first expected here', range: twice.range }] });
                        continue;
                    }
                    expected.push({ output: index, value, range: rangeOf(o) });
                }
                steps.push({ kind: 'expect', ...(state !== undefined ? { state } : {}), outputs: expected, range });
                break;
            }
        }
    }
    // the faulty scenario is dropped, so the rest of the model stays exact for the analyses
    ctx.blocked = wasBlocked;
    if (ctx.findings.length > before) return undefined;
    return { name: node.name ?? '', steps, range: rangeOf(node), nameRange: propertyRange(node, 'name') };
}
