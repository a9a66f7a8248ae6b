/**
 * C99 model of a machine: `<m>.h` + `<m>.c`. No heap, no globals, pure functions:
 *   <m>_state <m>_reset(void);                                   // the state after a reset (or power-up)
 *   <m>_state <m>_step(<m>_state s, const <m>_inputs *in, <m>_outputs *out);
 *       fills `out` with the outputs during this cycle (state s, inputs in) and returns the next state;
 *   void <m>_outputs_of(<m>_state s, const <m>_inputs *in, <m>_outputs *out);
 * `<m>_state` holds the state code (an enum whose values are the codes) and the registered
 * outputs' flip-flops, so a registered output behaves exactly as in the HDL exports.
 */
import type { Machine } from '../model/machine.js';
import type { StateAssignment } from '../synthesis/encoding.js';
import { defaultAssignment } from '../simulation/simulator.js';
import { type ExportFile, type ExportOptions, NameAllocator, commentBlock, defaultTarget, docLines, guardText, headerLines, mooreValue, zeroCode } from './common.js';

/** C99 keywords (ISO/IEC 9899:1999 §6.4.1) plus names the headers we include define. */
const C_RESERVED = new Set([
    'auto', 'break', 'case', 'char', 'const', 'continue', 'default', 'do', 'double', 'else', 'enum', 'extern', 'float', 'for', 'goto',
    'if', 'inline', 'int', 'long', 'register', 'restrict', 'return', 'short', 'signed', 'sizeof', 'static', 'struct', 'switch',
    'typedef', 'union', 'unsigned', 'void', 'volatile', 'while', '_Bool', '_Complex', '_Imaginary', 'bool', 'true', 'false',
]);

/** A struct member name for a signal: the signal's name unless it is a C keyword. */
export function cField(name: string): string {
    return C_RESERVED.has(name) ? `${name}_` : name;
}

const ctype = (width: number, bus: boolean) => (!bus ? 'bool' : width <= 8 ? 'uint8_t' : 'uint16_t');

export interface CNames {
    readonly prefix: string;
    readonly stateType: string;
    readonly codeType: string;
    readonly inputsType: string;
    readonly outputsType: string;
    readonly codes: readonly string[];
    readonly cleared: string;
}

export function cNames(machine: Machine): CNames {
    const p = machine.name;
    const alloc = new NameAllocator([]);
    const codes = machine.states.map((s) => alloc.take(`${p}_${s.name}`));
    return {
        prefix: p,
        stateType: `${p}_state`,
        codeType: `${p}_code`,
        inputsType: `${p}_inputs`,
        outputsType: `${p}_outputs`,
        codes,
        cleared: alloc.take(`${p}_CLEARED`),
    };
}

export function exportC(machine: Machine, options: ExportOptions): ExportFile[] {
    const assignment = options.assignment ?? options.synthesis?.assignment ?? defaultAssignment(machine);
    const n = cNames(machine);
    const head = commentBlock('//', headerLines({ machine, what: 'C99 model', options, assignment }));
    const doc = machine.doc ? ['//', ...commentBlock('//', docLines(machine.doc))] : [];
    const guard = `DETENT_${machine.name.toUpperCase()}_H`;
    const zero = zeroCode(assignment);
    const needCleared = machine.reset?.target === 'clear' && !assignment.codes.includes(zero);
    const codeValue = (code: string) => `0x${parseInt(code, 2).toString(16)}u`;

    const h: string[] = [...head, ...doc, `#ifndef ${guard}`, `#define ${guard}`, '', '#include <stdbool.h>', '#include <stdint.h>', ''];
    h.push(`/* State codes (${assignment.encoding}); the value is the code, bit q0 least significant. */`);
    const members = machine.states.map((s, i) => `${n.codes[i]} = ${codeValue(assignment.codes[i]!)}`);
    if (needCleared) members.push(`${n.cleared} = 0x0u /* the code a clear reset loads; no state has it */`);
    h.push('typedef enum {', ...members.map((m, k) => `    ${m}${k < members.length - 1 ? ',' : ''}`), `} ${n.codeType};`, '');
    const struct = (fields: string[], name: string, placeholder: string) => {
        // C99 forbids an empty struct: a machine without inputs/outputs gets one unused member.
        if (fields.length === 0) fields.push(`    uint8_t ${placeholder};`);
        return ['typedef struct {', ...fields, `} ${name};`, ''];
    };
    h.push(...struct(machine.inputs.map((i) => `    ${ctype(i.width, i.isBus)} ${cField(i.name)};${i.isBus ? ` /* ${i.width} bits */` : ''}`), n.inputsType, 'no_inputs'));
    h.push(...struct(machine.outputs.map((o) => `    ${ctype(o.width, o.isBus)} ${cField(o.name)};${o.isBus ? ` /* ${o.width} bits */` : ''}${o.registered ? ' /* registered */' : ''}`), n.outputsType, 'no_outputs'));
    const regFields = machine.outputs.filter((o) => o.registered).map((o) => `    ${ctype(o.width, o.isBus)} ${cField(o.name)}; /* registered output flip-flop */`);
    h.push(...struct([`    ${n.codeType} code;`, ...regFields], n.stateType, 'unused'));
    h.push(`/* The state after a reset${machine.reset ? '' : ' (no reset declared: the power-up state, the first state)'}. */`);
    h.push(`${n.stateType} ${n.prefix}_reset(void);`);
    h.push('/* Outputs in state s with inputs in (Moore from s, Mealy from s and in). */');
    h.push(`void ${n.prefix}_outputs_of(${n.stateType} s, const ${n.inputsType} *in, ${n.outputsType} *out);`);
    h.push('/* One clock: fills out with the outputs during the cycle and returns the state after the edge. */');
    h.push(`${n.stateType} ${n.prefix}_step(${n.stateType} s, const ${n.inputsType} *in, ${n.outputsType} *out);`, '', `#endif /* ${guard} */`, '');

    const c: string[] = [...head, `#include "${machine.name}.h"`, ''];
    const syn: Parameters<typeof guardText>[2] = {
        constant: (v) => (v ? 'true' : 'false'),
        input: (i) => `in->${cField(machine.inputs[i]!.name)}`,
        bit: (i, b) => `((in->${cField(machine.inputs[i]!.name)} >> ${b}) & 1u)`,
        compare: (i, op, v) => `(in->${cField(machine.inputs[i]!.name)} ${op} ${v}u)`,
        not: (x) => `!(${x})`,
        and: (xs) => `(${xs.join(' && ')})`,
        or: (xs) => `(${xs.join(' || ')})`,
        xor: (xs) => `(${xs.map((x) => `!!(${x})`).join(' ^ ')})`,
    };
    const resetTarget = typeof machine.reset?.target === 'number' ? machine.reset.target : undefined;
    const regInit = (state: number | undefined) => machine.outputs.map((o, k) => (o.registered ? `    s.${cField(o.name)} = ${state === undefined ? 0 : mooreValue(machine, state, k) ?? 0};` : '')).filter(Boolean);

    // The code each state moves to, as a helper so _step and the registered outputs share it.
    c.push(`static ${n.codeType} ${n.prefix}_next_code(${n.codeType} code, const ${n.inputsType} *in)`, '{');
    c.push('    (void)in; /* some machines read no input */', '    switch (code) {');
    machine.states.forEach((s, i) => {
        c.push(...commentBlock('//', docLines(s.doc), '    '));
        c.push(`    case ${n.codes[i]}:`);
        for (const t of s.transitions) c.push(`        if (${guardText(t.guard, machine, syn)}) return ${n.codes[t.target]};`);
        if (s.otherwise?.kind === 'goto') c.push(`        return ${n.codes[s.otherwise.target]};`);
        else c.push(`        return code;${s.otherwise?.kind === 'dontcare' ? ' /* otherwise dontcare: holds */' : ''}`);
    });
    c.push(`    default: /* ${machine.recover ? 'unused code: recover' : 'unused code: a safe state (no recover declared)'} */`);
    c.push(`        return ${n.codes[defaultTarget(machine, assignment)]};`, '    }', '}', '');

    c.push(`${n.stateType} ${n.prefix}_reset(void)`, '{', `    ${n.stateType} s;`);
    if (machine.reset?.target === 'clear') {
        const i = assignment.codes.indexOf(zero);
        c.push(`    s.code = ${i >= 0 ? n.codes[i] : n.cleared}; /* clear: every flip-flop 0 */`, ...regInit(undefined));
    } else {
        const t = resetTarget ?? 0;
        c.push(`    s.code = ${n.codes[t]};`, ...regInit(t));
    }
    c.push('    return s;', '}', '');

    c.push(`void ${n.prefix}_outputs_of(${n.stateType} s, const ${n.inputsType} *in, ${n.outputsType} *out)`, '{');
    const comb = machine.outputs.map((o, k) => ({ o, k })).filter(({ o }) => !o.registered);
    c.push('    (void)in; /* read only by Mealy outputs */', '    (void)s;');
    if (machine.outputs.length === 0) c.push('    out->no_outputs = 0u;');
    for (const { o } of comb) c.push(`    out->${cField(o.name)} = ${o.isBus ? '0u' : 'false'};`);
    machine.outputs.forEach((o) => { if (o.registered) c.push(`    out->${cField(o.name)} = s.${cField(o.name)};`); });
    if (comb.length > 0) {
        c.push('    switch (s.code) {');
        machine.states.forEach((s, i) => {
            c.push(`    case ${n.codes[i]}:`);
            for (const e of s.emits) {
                const o = machine.outputs[e.output]!;
                if (!o.registered) c.push(`        out->${cField(o.name)} = ${o.isBus ? `${e.value}u` : e.value ? 'true' : 'false'};`);
            }
            const mealy = (emits: readonly { output: number; value: number }[]) => emits
                .filter((e) => mooreValue(machine, i, e.output) === undefined)
                .map((e) => { const o = machine.outputs[e.output]!; return `out->${cField(o.name)} = ${o.isBus ? `${e.value}u` : e.value ? 'true' : 'false'};`; });
            let first = true;
            for (const t of s.transitions) {
                c.push(`        ${first ? 'if' : 'else if'} (${guardText(t.guard, machine, syn)}) {`, ...mealy(t.emits).map((l) => `            ${l}`), '        }');
                first = false;
            }
            if (s.otherwise?.kind === 'goto') {
                const lines = mealy(s.otherwise.emits);
                if (first) c.push(...lines.map((l) => `        ${l}`));
                else c.push('        else {', ...lines.map((l) => `            ${l}`), '        }');
            }
            c.push('        break;');
        });
        c.push('    default:', '        break;', '    }');
    }
    c.push('}', '');

    c.push(`${n.stateType} ${n.prefix}_step(${n.stateType} s, const ${n.inputsType} *in, ${n.outputsType} *out)`, '{');
    c.push(`    ${n.stateType} next;`, `    ${n.prefix}_outputs_of(s, in, out);`, `    next.code = ${n.prefix}_next_code(s.code, in);`);
    const regs = machine.outputs.map((o, k) => ({ o, k })).filter(({ o }) => o.registered);
    if (regs.length > 0) {
        // Registered outputs load the Moore value of the next state.
        for (const { o } of regs) c.push(`    next.${cField(o.name)} = 0;`);
        c.push('    switch (next.code) {');
        machine.states.forEach((s, i) => {
            const emits = s.emits.filter((e) => machine.outputs[e.output]!.registered);
            if (emits.length === 0) return;
            c.push(`    case ${n.codes[i]}:`, ...emits.map((e) => `        next.${cField(machine.outputs[e.output]!.name)} = ${e.value};`), '        break;');
        });
        c.push('    default:', '        break;', '    }');
    }
    c.push('    return next;', '}', '');
    return [{ name: `${machine.name}.h`, text: h.join('\n') }, { name: `${machine.name}.c`, text: c.join('\n') }];
}

export type { StateAssignment };
