/**
 * Every construct of LANGUAGE.md parses and lowers to the model it describes. Expected models are
 * written by hand from LANGUAGE.md's text (the contract), and ranges are computed from the source
 * text by `at()` (substring positions), never from the parser's output.
 */
import { describe, expect, test } from 'vitest';
import { parseDetent } from '@detent/language';
import type { Guard, Machine } from '@detent/core';
import { at } from './text-ranges.js';

function only(text: string): Machine {
    const r = parseDetent(text);
    expect(r.findings).toEqual([]);
    expect(r.machines).toHaveLength(1);
    expect(r.machines[0]!.usable).toBe(true);
    return r.machines[0]!.machine;
}

/** Strips ranges so guard trees compare by structure. */
function shape(g: Guard): unknown {
    switch (g.kind) {
        case 'const': return g.value ? 1 : 0;
        case 'input': return `i${g.input}`;
        case 'bit': return `i${g.input}[${g.bit}]`;
        case 'compare': return `i${g.input}${g.op}${g.value}`;
        case 'not': return ['!', shape(g.operand)];
        default: return [g.kind, ...g.operands.map(shape)];
    }
}

const guardOf = (guard: string, decls = 'input a, b, c, d; input [4] level;') => {
    const m = only(`machine M { ${decls} state S { when ${guard} -> S; otherwise stay; } }`);
    return shape(m.states[0]!.transitions[0]!.guard);
};

describe('declarations', () => {
    test('defaults: clock clk rising, no reset, binary, D (LANGUAGE.md declaration table)', () => {
        const m = only('machine M { state A { otherwise stay; } }');
        expect(m.clock).toMatchObject({ name: 'clk', edge: 'rising' });
        expect(m.reset).toBeUndefined();
        expect(m.encoding).toBe('binary');
        expect(m.flipflop).toBe('D');
        expect(m.recover).toBeUndefined();
    });

    test('clock rising/falling', () => {
        expect(only('machine M { clock ck falling; state A {} }').clock).toMatchObject({ name: 'ck', edge: 'falling' });
        expect(only('machine M { clock ck rising; state A {} }').clock).toMatchObject({ name: 'ck', edge: 'rising' });
    });

    test('reset: high/low, sync/async, -> S or clear; default high sync', () => {
        const r = (decl: string) => only(`machine M { ${decl} state A {} state B {} }`).reset;
        expect(r('reset rst -> B;')).toMatchObject({ name: 'rst', activeHigh: true, async: false, target: 1 });
        expect(r('reset rst_n low async -> A;')).toMatchObject({ activeHigh: false, async: true, target: 0 });
        expect(r('reset rst high sync clear;')).toMatchObject({ activeHigh: true, async: false, target: 'clear' });
        expect(r('reset rst async clear;')).toMatchObject({ activeHigh: true, async: true, target: 'clear' });
        expect(r('reset rst low clear;')).toMatchObject({ activeHigh: false, async: false, target: 'clear' });
    });

    test('inputs: lists, buses, async (also with buses); outputs: registered, buses', () => {
        const m = only(`machine M {
            input a, b;
            input [4] level;
            input async door;
            input async [3] code_in;
            output y;
            output [2] speed;
            output registered lamp;
            output registered [3] count;
            state Only {}
        }`);
        expect(m.inputs.map((i) => [i.name, i.width, i.isBus, i.async])).toEqual([
            ['a', 1, false, false], ['b', 1, false, false], ['level', 4, true, false], ['door', 1, false, true], ['code_in', 3, true, true],
        ]);
        expect(m.outputs.map((o) => [o.name, o.width, o.isBus, o.registered])).toEqual([
            ['y', 1, false, false], ['speed', 2, true, false], ['lamp', 1, false, true], ['count', 3, true, true],
        ]);
    });

    test('modifier and width in either order', () => {
        const m = only('machine M { input [3] async code_in; output [2] registered count; state Only {} }');
        expect(m.inputs[0]).toMatchObject({ width: 3, isBus: true, async: true });
        expect(m.outputs[0]).toMatchObject({ width: 2, isBus: true, registered: true });
    });

    test('a one-bit bus `[1]` is still a bus', () => {
        const m = only('machine M { input [1] x; state A { when x[0] -> A; otherwise stay; } }');
        expect(m.inputs[0]).toMatchObject({ width: 1, isBus: true });
    });

    test('every encoding and flip-flop kind', () => {
        for (const e of ['binary', 'gray', 'onehot', 'onecold', 'johnson', 'auto'] as const) {
            expect(only(`machine M { encoding ${e}; state A {} }`).encoding).toBe(e);
        }
        for (const f of ['D', 'T', 'JK', 'SR'] as const) {
            expect(only(`machine M { flipflop ${f}; state A {} }`).flipflop).toBe(f);
        }
    });

    test('D T JK SR are ordinary names outside `flipflop` (an input called T)', () => {
        const m = only('machine M { input T, D; output JK; flipflop T; state SR { emit JK; when T & !D -> SR; otherwise stay; } }');
        expect(m.inputs.map((i) => i.name)).toEqual(['T', 'D']);
        expect(m.states[0]!.name).toBe('SR');
        expect(m.flipflop).toBe('T');
    });

    test('explicit codes keep the digits of 0b literals (0b0010 is 4 bits)', () => {
        const m = only('machine M { encoding explicit; code A = 0b0010; code B = 0b1000; code C = 5; state A {} state B {} state C {} }');
        expect(m.states.map((s) => s.code?.bits)).toEqual(['0010', '1000', '0101']);
    });

    test('hex codes are 4 bits per digit; decimal-only codes take the narrowest common width', () => {
        expect(only('machine M { encoding explicit; code A = 0x3; code B = 0xA; state A {} state B {} }').states.map((s) => s.code?.bits)).toEqual(['0011', '1010']);
        expect(only('machine M { encoding explicit; code A = 0; code B = 5; state A {} state B {} }').states.map((s) => s.code?.bits)).toEqual(['000', '101']);
    });

    test('recover -> S', () => {
        expect(only('machine M { recover -> B; state A {} state B {} }').recover?.target).toBe(1);
    });

    test('several machines per file, declarations in any order', () => {
        const r = parseDetent('machine P { state X {} input q; } machine Q { state Y {} clock c; }');
        expect(r.findings).toEqual([]);
        expect(r.machines.map((m) => m.machine.name)).toEqual(['P', 'Q']);
        expect(r.machines[0]!.machine.inputs[0]!.name).toBe('q');
        expect(r.machines[1]!.machine.clock.name).toBe('c');
    });
});

describe('states and transitions', () => {
    test('priority, Moore emits, Mealy emits, otherwise variants', () => {
        const m = only(`machine M {
            input a; input [4] level; output y, z; output [2] speed;
            state P priority { emit y, speed = 3; when a -> Q emit z; otherwise -> R emit z; }
            state Q { when a -> P; otherwise stay; }
            state R { otherwise dontcare; }
        }`);
        const [a, b, c] = m.states;
        expect(a!.priority).toBe(true);
        expect(b!.priority).toBe(false);
        expect(a!.emits.map((e) => [e.output, e.value])).toEqual([[0, 1], [2, 3]]);
        expect(a!.transitions[0]).toMatchObject({ target: 1, emits: [{ output: 1, value: 1 }] });
        expect(a!.otherwise).toMatchObject({ kind: 'goto', target: 2, emits: [{ output: 1, value: 1 }] });
        expect(b!.otherwise).toMatchObject({ kind: 'stay' });
        expect(c!.otherwise).toMatchObject({ kind: 'dontcare' });
        expect(c!.transitions).toEqual([]);
    });

    test('without otherwise the state has none', () => {
        expect(only('machine M { input a; state S { when a -> S; } }').states[0]!.otherwise).toBeUndefined();
    });
});

describe('guards (precedence ! > & > ^ > |, LANGUAGE.md "States and transitions")', () => {
    test('| is loosest, then ^, then &', () => {
        expect(guardOf('a | b & c')).toEqual(['or', 'i0', ['and', 'i1', 'i2']]);
        expect(guardOf('a & b | c')).toEqual(['or', ['and', 'i0', 'i1'], 'i2']);
        expect(guardOf('a ^ b & c')).toEqual(['xor', 'i0', ['and', 'i1', 'i2']]);
        expect(guardOf('a | b ^ c')).toEqual(['or', 'i0', ['xor', 'i1', 'i2']]);
        expect(guardOf('a ^ b | c ^ d')).toEqual(['or', ['xor', 'i0', 'i1'], ['xor', 'i2', 'i3']]);
    });

    test('! binds tighter than &; parentheses override', () => {
        expect(guardOf('!a & b')).toEqual(['and', ['!', 'i0'], 'i1']);
        expect(guardOf('!(a & b)')).toEqual(['!', ['and', 'i0', 'i1']]);
        expect(guardOf('(a | b) & c')).toEqual(['and', ['or', 'i0', 'i1'], 'i2']);
        expect(guardOf('!!a')).toEqual(['!', ['!', 'i0']]);
    });

    test('chains are flat operand lists', () => {
        expect(guardOf('a & b & c & d')).toEqual(['and', 'i0', 'i1', 'i2', 'i3']);
    });

    test('constants, bus bits and comparisons; a comparison binds tightest (!level < 4 = !(level < 4))', () => {
        expect(guardOf('1')).toEqual(1);
        expect(guardOf('0 | a')).toEqual(['or', 0, 'i0']);
        expect(guardOf('level[3]')).toEqual('i4[3]');
        expect(guardOf('!level < 4')).toEqual(['!', 'i4<4']);
        expect(guardOf('level == 0x5 & level != 0b0110')).toEqual(['and', 'i4==5', 'i4!=6']);
        for (const op of ['==', '!=', '<', '<=', '>', '>=']) expect(guardOf(`level ${op} 15`)).toEqual(`i4${op}15`);
    });
});

describe('scenarios', () => {
    test('reset; step with values and repeat; step; step * 3; expect with state and outputs', () => {
        const m = only(`machine M {
            reset rst -> Idle; input a; input [4] lvl; output y, y2; output [2] sp;
            state Idle { emit y; otherwise stay; }
            scenario s {
                reset;
                step a, lvl = 5 * 2;
                step;
                step * 3;
                expect Idle with y, y2 = 0, sp = 3;
                expect Idle;
                expect with y;
            }
        }`);
        expect(m.scenarios[0]!.steps.map((s) => {
            if (s.kind === 'reset') return 'reset';
            if (s.kind === 'step') return ['step', s.assignments.map((x) => [x.input, x.value]), s.repeat];
            return ['expect', s.state, s.outputs.map((o) => [o.output, o.value])];
        })).toEqual([
            'reset',
            ['step', [[0, 1], [1, 5]], 2],
            ['step', [], 1],
            ['step', [], 3],
            ['expect', 0, [[0, 1], [1, 0], [2, 3]]],
            ['expect', 0, []],
            ['expect', undefined, [[0, 1]]],
        ]);
    });
});

describe('comments and documentation', () => {
    test('/** */ before a machine or a state is its doc; // and /* */ are ignored', () => {
        const m = only(`// a line comment
/**
 * Sump controller.
 * Two pumps.
 */
machine M {
    /* not documentation */ state A { otherwise stay; }
    /** Running. */
    state B { otherwise stay; }
    state C { otherwise stay; } // trailing
}`);
        expect(m.doc).toBe('Sump controller.\nTwo pumps.');
        expect(m.states.map((s) => s.doc)).toEqual([undefined, 'Running.', undefined]);
    });
});

describe('exact ranges (computed from the text)', () => {
    const text = `machine Gate {
    clock clk;
    reset rst -> Closed;
    input open_cmd, obstacle;
    input [3] level;
    output motor;
    state Closed {
        when open_cmd & !obstacle -> Opening emit motor;
        otherwise stay;
    }
    state Opening {
        emit motor;
        when level >= 5 -> Closed;
        otherwise stay;
    }
    scenario opens { reset; step open_cmd; expect Opening with motor; }
}`;
    const m = only(text);

    test('machine, declarations and names', () => {
        expect(m.nameRange).toEqual(at(text, 'Gate'));
        expect(m.range.start).toEqual({ line: 0, character: 0 });
        const lines = text.split('\n');
        expect(m.range.end).toEqual({ line: lines.length - 1, character: lines.at(-1)!.length });
        expect(m.clock.range).toEqual(at(text, 'clock clk;'));
        expect(m.reset!.range).toEqual(at(text, 'reset rst -> Closed;'));
        expect(m.reset!.nameRange).toEqual(at(text, 'rst'));
        expect(m.inputs[1]!.nameRange).toEqual(at(text, 'obstacle'));
        expect(m.inputs[1]!.range).toEqual(at(text, 'input open_cmd, obstacle;'));
        expect(m.inputs[2]!.nameRange).toEqual(at(text, 'level'));
        expect(m.outputs[0]!.nameRange).toEqual(at(text, 'motor'));
    });

    test('states, transitions, guards, emits', () => {
        const [closed, opening] = m.states;
        expect(closed!.nameRange).toEqual(at(text, 'Closed', 1, 'state Closed'));
        const t = closed!.transitions[0]!;
        expect(t.range).toEqual(at(text, 'when open_cmd & !obstacle -> Opening emit motor;'));
        expect(t.targetRange).toEqual(at(text, 'Opening', 1, 'when open_cmd'));
        expect(t.guard.range).toEqual(at(text, 'open_cmd & !obstacle'));
        expect(t.guard.kind === 'and' && t.guard.operands[1]!.range).toEqual(at(text, '!obstacle'));
        expect(t.emits[0]!.range).toEqual(at(text, 'motor', 1, 'emit motor;'));
        expect(closed!.otherwise!.range).toEqual(at(text, 'otherwise stay;'));
        expect(opening!.emits[0]!.range).toEqual(at(text, 'motor', 1, '        emit motor;\n'));
        expect(opening!.transitions[0]!.guard.range).toEqual(at(text, 'level >= 5'));
        expect(opening!.range.start).toEqual(at(text, 'state Opening').start);
    });

    test('scenario steps', () => {
        const s = m.scenarios[0]!;
        expect(s.nameRange).toEqual(at(text, 'opens'));
        expect(s.steps[0]!.range).toEqual(at(text, 'reset;', 1, 'scenario'));
        expect(s.steps[1]!.range).toEqual(at(text, 'step open_cmd;'));
        expect(s.steps[2]!.range).toEqual(at(text, 'expect Opening with motor;'));
    });
});
