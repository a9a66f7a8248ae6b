/**
 * Each lowering error of LANGUAGE.md ("Diagnostics", "Lexical", declaration table) with its exact
 * range. Expected ranges come from the source text (`at()`), expected codes from LANGUAGE.md and
 * docs/language.md (the decisions on names recorded there).
 */
import { describe, expect, test } from 'vitest';
import { parseDetent } from '@detent/language';
import { at, type Range } from './text-ranges.js';

const found = (text: string) => parseDetent(text).findings.map((f) => ({ code: f.code, range: f.range }));
const one = (code: string, range: Range) => [{ code, range }];
const usable = (text: string) => parseDetent(text).machines.map((m) => m.usable);

describe('unknown-name', () => {
    test('transition target, with a suggestion', () => {
        const t = 'machine M { input go; state Idle { when go -> Runing; otherwise stay; } state Running { otherwise stay; } }';
        expect(found(t)).toEqual(one('unknown-name', at(t, 'Runing')));
        expect(parseDetent(t).findings[0]!.message).toContain("did you mean 'Running'");
        expect(usable(t)).toEqual([false]);
    });
    test('an output or the clock read in a guard', () => {
        const t = 'machine M { clock ck; output lamp; state Idle { when lamp -> Idle; when ck -> Idle; otherwise stay; } }';
        expect(found(t)).toEqual([{ code: 'unknown-name', range: at(t, 'lamp', 2) }, { code: 'unknown-name', range: at(t, 'ck', 1, 'when ck') }]);
        expect(parseDetent(t).findings[0]!.message).toContain('is an output, not an input');
    });
    test('emit of an input, reset and recover targets, code state', () => {
        const t = 'machine M { reset rst -> Nope; recover -> Gone; input go; encoding explicit; code Ghost = 0b1; code Idle = 0b0; state Idle { emit go; otherwise stay; } }';
        expect(found(t)).toEqual([
            { code: 'unknown-name', range: at(t, 'Nope') },
            { code: 'unknown-name', range: at(t, 'Gone') },
            { code: 'unknown-name', range: at(t, 'Ghost') },
            { code: 'unknown-name', range: at(t, 'go', 2) },
        ]);
    });
    test('scenario names: step input, expect state and output (scenario dropped, machine stays usable)', () => {
        const t = 'machine M { input go; output lamp; state Idle { emit lamp; when go -> Idle; otherwise stay; } scenario s { step gone; expect Busy with lmp; } }';
        expect(found(t)).toEqual([
            { code: 'unknown-name', range: at(t, 'gone') },
            { code: 'unknown-name', range: at(t, 'Busy') },
            { code: 'unknown-name', range: at(t, 'lmp') },
        ]);
        const r = parseDetent(t);
        expect(r.machines[0]!.usable).toBe(true);
        expect(r.machines[0]!.machine.scenarios).toEqual([]);
    });
});

describe('duplicate-name (one namespace per machine for clock, reset, inputs, outputs, states; ignoring case)', () => {
    test('two states', () => {
        const t = 'machine M { state Idle { otherwise stay; } state Idle { otherwise stay; } }';
        expect(found(t)).toEqual(one('duplicate-name', at(t, 'Idle', 2)));
    });
    test('input and output, names differing only in case, state named like an input', () => {
        const t = 'machine M { input door; output door; output Lamp, lamp; state Door { otherwise stay; } }';
        expect(found(t)).toEqual([
            { code: 'duplicate-name', range: at(t, 'door', 2) },
            { code: 'duplicate-name', range: at(t, 'lamp') },
            { code: 'duplicate-name', range: at(t, 'Door') },
        ]);
    });
    test('a signal named like the clock or the reset; `clk` while the default clock is implied', () => {
        const t1 = 'machine M { clock ck; reset rst -> Idle; input ck, RST; state Idle { otherwise stay; } }';
        expect(found(t1)).toEqual([{ code: 'duplicate-name', range: at(t1, 'ck', 1, 'input ck') }, { code: 'duplicate-name', range: at(t1, 'RST') }]);
        const t2 = 'machine M { input clk; state Idle { otherwise stay; } }';
        expect(found(t2)).toEqual(one('duplicate-name', at(t2, 'clk')));
        expect(parseDetent(t2).findings[0]!.message).toContain('default clock');
    });
    test('second clock, two machines of one name, the same output twice in one emit', () => {
        const t = 'machine Gate { clock a; clock b; output y; state Idle { emit y, y; otherwise stay; } } machine gate { state Idle { otherwise stay; } }';
        expect(found(t)).toEqual([
            { code: 'duplicate-name', range: at(t, 'clock b;') },
            { code: 'duplicate-name', range: at(t, 'y', 3) },
            { code: 'duplicate-name', range: at(t, 'gate') },
        ]);
        expect(usable(t)).toEqual([false, false]);
    });
});

describe('reserved-name (Verilog-2005, SystemVerilog-2017, VHDL-2008, export names)', () => {
    test('HDL keywords, VHDL in any case, the export\'s own names, VHDL underscore rules', () => {
        // wire: IEEE 1364-2005 Annex B; logic: IEEE 1800-2017 Annex B; Signal, bus: IEEE 1076-2008 §15.10 (case-insensitive)
        const t = 'machine M { input wire, logic, Signal, bus; input next_state, detent_x, a__b, _x, x_; output ok; state Idle { emit ok; otherwise stay; } }';
        const names = ['wire', 'logic', 'Signal', 'bus', 'next_state', 'detent_x', 'a__b', '_x', 'x_'];
        expect(found(t)).toEqual(names.map((n) => ({ code: 'reserved-name', range: at(t, ` ${n}`, 1) })).map((f) => ({
            code: f.code, range: { start: { ...f.range.start, character: f.range.start.character + 1 }, end: f.range.end },
        })));
    });
    test('a reserved machine or state name; the machine stays usable', () => {
        const t = 'machine module { state begin { otherwise stay; } }';
        expect(found(t)).toEqual([{ code: 'reserved-name', range: at(t, 'module') }, { code: 'reserved-name', range: at(t, 'begin') }]);
        expect(usable(t)).toEqual([true]);
    });
    test('ordinary names pass (T, D as inputs; pump_on; Idle)', () => {
        expect(found('machine Pump { input T, D; output pump_on; state Idle { emit pump_on; when T & D -> Idle; otherwise stay; } }')).toEqual([]);
    });
});

describe('width', () => {
    test('bus width outside 1..16', () => {
        const t = 'machine M { input [0] a; output [17] y; state Idle { otherwise stay; } }';
        expect(found(t)).toEqual([{ code: 'width', range: at(t, '0') }, { code: 'width', range: at(t, '17') }]);
    });
    test('bit index, bit of a single-bit input, comparison value, bus alone, constant 2', () => {
        const t = 'machine M { input [4] lvl; input a; state Idle { when lvl[4] -> Idle; when a[0] -> Idle; when lvl > 16 -> Idle; when lvl -> Idle; when 2 -> Idle; otherwise stay; } }';
        expect(found(t)).toEqual([
            { code: 'width', range: at(t, '4', 2) },
            { code: 'width', range: at(t, 'a[0]') },
            { code: 'width', range: at(t, '16') },
            { code: 'width', range: at(t, 'lvl', 4) },
            { code: 'width', range: at(t, '2', 1, 'when 2') },
        ]);
    });
    test('largest values fit: lvl <= 15, emit speed = 3 for 2 bits', () => {
        expect(found('machine M { input [4] lvl; output [2] speed; state Idle { emit speed = 3; when lvl <= 15 -> Idle; otherwise stay; } }')).toEqual([]);
    });
    test('emit, step and expect values too wide', () => {
        const t = 'machine M { input [2] sel; output [2] speed; output y; state Idle { emit speed = 4, y = 2; otherwise stay; } scenario s { step sel = 4; expect with speed = 7; } }';
        expect(found(t)).toEqual([
            { code: 'width', range: at(t, 'speed = 4') },
            { code: 'width', range: at(t, 'y = 2') },
            { code: 'width', range: at(t, 'sel = 4') },
            { code: 'width', range: at(t, 'speed = 7') },
        ]);
    });
    test('explicit codes of unequal width', () => {
        const t = 'machine M { encoding explicit; code A1 = 0b01; code B1 = 0b100; state A1 { otherwise stay; } state B1 { otherwise stay; } }';
        expect(found(t)).toEqual(one('width', at(t, '0b100')));
    });
});

describe('encoding', () => {
    test('duplicate code line, duplicate code value, missing code', () => {
        const t = 'machine M { encoding explicit; code A1 = 0b01; code A1 = 0b10; code B1 = 0b01; state A1 { otherwise stay; } state B1 { otherwise stay; } state C1 { otherwise stay; } }';
        expect(found(t)).toEqual([
            { code: 'encoding', range: at(t, 'code A1 = 0b10;') },
            { code: 'encoding', range: at(t, '0b01', 2) },
            { code: 'encoding', range: at(t, 'C1') },
        ]);
    });
    test('code without encoding explicit; a second encoding', () => {
        const t = 'machine M { encoding gray; encoding onehot; code A1 = 0b1; state A1 { otherwise stay; } }';
        expect(found(t)).toEqual([{ code: 'encoding', range: at(t, 'encoding onehot;') }, { code: 'encoding', range: at(t, 'code A1 = 0b1;') }]);
    });
});

describe('output-conflict', () => {
    test('Moore value and a Mealy value differ; equal values are fine', () => {
        const t = 'machine M { input a; output [2] speed; state Idle { emit speed = 1; when a -> Idle emit speed = 2; otherwise -> Idle emit speed = 1; } }';
        expect(found(t)).toEqual(one('output-conflict', at(t, 'speed = 2')));
        expect(usable(t)).toEqual([true]);
    });
    test('a registered output used as a Mealy output', () => {
        const t = 'machine M { input a; output registered lamp; state Idle { when a -> Idle emit lamp; otherwise stay; } }';
        expect(found(t)).toEqual(one('output-conflict', at(t, 'lamp', 2)));
    });
    test('one emit list setting an output to two values', () => {
        const t = 'machine M { output [2] sp; state Idle { emit sp = 1, sp = 2; otherwise stay; } }';
        expect(found(t)).toEqual(one('output-conflict', at(t, 'sp = 2')));
    });
});

describe('other checks', () => {
    test('step repeat out of range is a scenario error; the machine stays usable', () => {
        const t = 'machine M { input a; state Idle { when a -> Idle; otherwise stay; } scenario s { step a * 0; } }';
        expect(found(t)).toEqual(one('scenario', at(t, '0', 1, '* 0')));
        expect(usable(t)).toEqual([true]);
    });
    test('a second otherwise', () => {
        const t = 'machine M { state Idle { otherwise stay; otherwise dontcare; } }';
        expect(found(t)).toEqual(one('duplicate-name', at(t, 'otherwise dontcare;')));
    });
    test('a machine without states', () => {
        const t = 'machine Empty { input a; }';
        expect(found(t)).toEqual(one('syntax', at(t, 'Empty')));
    });
});
