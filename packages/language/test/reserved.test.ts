/**
 * The keyword lists in core/model/reserved.ts against counts and words of the standards
 * (from memory of the annexes: IEEE 1364-1995 had 102 keywords, 1364-2001 added 21 and
 * 1364-2005 added `uwire` → 124; IEEE 1800-2017 Annex B lists 248 including Verilog's; IEEE
 * 1076-2008 §15.10 lists 115 reserved words, 1076-2002's 98 plus context, default, force,
 * parameter, release and 12 PSL words), and the language's use of them.
 */
import { describe, expect, test } from 'vitest';
import { C11_KEYWORDS, SYSTEMVERILOG_2017_KEYWORDS, VERILOG_2005_KEYWORDS, VHDL_2008_KEYWORDS, reservedBy, vhdlIdentifierProblem } from '@detent/core';
import { parseDetent } from '@detent/language';

describe('keyword lists', () => {
    test('sizes match the standards, no duplicates', () => {
        expect(new Set(VERILOG_2005_KEYWORDS).size).toBe(124);
        expect(new Set(SYSTEMVERILOG_2017_KEYWORDS).size).toBe(248);
        expect(new Set(VHDL_2008_KEYWORDS).size).toBe(115);
        expect(new Set(C11_KEYWORDS).size).toBe(C11_KEYWORDS.length);
    });
    test('SystemVerilog includes every Verilog keyword', () => {
        for (const k of VERILOG_2005_KEYWORDS) expect(SYSTEMVERILOG_2017_KEYWORDS).toContain(k);
    });
    test('known words land in the right lists', () => {
        expect(reservedBy('uwire')).toEqual(['Verilog-2005', 'SystemVerilog-2017']);
        expect(reservedBy('logic')).toEqual(['SystemVerilog-2017']);
        expect(reservedBy('Entity')).toEqual(['VHDL-2008']);               // VHDL ignores case
        expect(reservedBy('vunit')).toEqual(['VHDL-2008']);                // PSL word, new in 2008
        expect(reservedBy('Logic')).toEqual([]);                            // SystemVerilog is case-sensitive
        expect(reservedBy('std_logic')).toEqual(['VHDL context']);
        expect(reservedBy('switch')).toEqual(['C11']);
        expect(reservedBy('Next_State')).toEqual(['Detent exports']);
        expect(reservedBy('pump_on')).toEqual([]);
        expect(vhdlIdentifierProblem('a__b')).toBeDefined();
        expect(vhdlIdentifierProblem('a_b')).toBeUndefined();
    });
});

describe('ranges with CRLF line ends and non-ASCII comments', () => {
    test('lowering and syntax ranges count UTF-16 code units per line, like LSP', () => {
        const text = 'machine M {\r\n    // Füllstand — niveau ✓\r\n    input go;\r\n    state Idle { when go -> Nope; otherwise stay; }\r\n    state Two { when go -> Idle; otherwise stay }\r\n}\r\n';
        const f = parseDetent(text).findings;
        const lines = text.split('\r\n');
        expect(f.map((x) => [x.code, x.range.start])).toEqual([
            ['unknown-name', { line: 3, character: lines[3]!.indexOf('Nope') }],
            ['syntax', { line: 4, character: lines[4]!.lastIndexOf('}') }],
        ]);
    });
});
