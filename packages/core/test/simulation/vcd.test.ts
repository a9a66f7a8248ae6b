/**
 * Stimulus files and VCD output. The VCD is read back with a small reader written here from the
 * grammar of IEEE 1364-2005 §18.2 (declaration commands $timescale/$scope/$var/$upscope/
 * $enddefinitions, then simulation time `#n`, $dumpvars, scalar `0!` and vector `b1010 !` value
 * changes); expected values are worked out by hand for the Panel fixture.
 */
import { describe, expect, it } from 'vitest';
import { parseStimulus, simulate, StimulusError, traceTable } from '../../src/simulation/stimulus.js';
import { traceToVcd } from '../../src/simulation/vcd.js';
import { panel } from './fixtures.js';

interface VcdVar { type: string; size: number; id: string; ref: string }
interface Vcd { timescale: string; scope: string[]; vars: VcdVar[]; changes: Map<string, [number, string][]> }

function readVcd(text: string): Vcd {
    const tokens = text.split(/\s+/).filter((t) => t !== '');
    let i = 0;
    const vcd: Vcd = { timescale: '', scope: [], vars: [], changes: new Map() };
    const until = () => { const body: string[] = []; while (tokens[i] !== '$end') { if (i >= tokens.length) throw new Error('missing $end'); body.push(tokens[i++]!); } i++; return body; };
    const VAR_TYPES = new Set(['event', 'integer', 'parameter', 'real', 'realtime', 'reg', 'supply0', 'supply1', 'time', 'tri', 'triand', 'trior', 'trireg', 'tri0', 'tri1', 'wand', 'wire', 'wor']);
    // Declarations.
    for (;;) {
        const kw = tokens[i++];
        if (kw === undefined) throw new Error('no $enddefinitions');
        if (kw === '$enddefinitions') { until(); break; }
        const body = until();
        if (kw === '$timescale') vcd.timescale = body.join(' ');
        else if (kw === '$scope') { expect(body[0]).toBe('module'); vcd.scope.push(body[1]!); }
        else if (kw === '$var') {
            const [type, size, id, ref] = body;
            if (!VAR_TYPES.has(type!)) throw new Error(`bad var type ${type}`);
            if (!/^[\x21-\x7e]+$/.test(id!)) throw new Error(`bad identifier code ${id}`);
            vcd.vars.push({ type: type!, size: Number(size), id: id!, ref: ref! });
            vcd.changes.set(id!, []);
        } else if (!['$upscope', '$date', '$version', '$comment'].includes(kw)) throw new Error(`unknown declaration ${kw}`);
    }
    // Simulation commands.
    let time = -1;
    while (i < tokens.length) {
        const t = tokens[i++]!;
        if (t.startsWith('#')) { const n = Number(t.slice(1)); if (!(n > time)) throw new Error('time must increase'); time = n; continue; }
        if (t === '$dumpvars' || t === '$end') continue;
        if (/^[01xzXZ]/.test(t)) { const id = t.slice(1); vcd.changes.get(id)!.push([time, t[0]!]); continue; }
        if (/^[bB][01xzXZ]+$/.test(t)) { const id = tokens[i++]!; const v = vcd.vars.find((x) => x.id === id)!; if (t.length - 1 > v.size) throw new Error('vector too wide'); vcd.changes.get(id)!.push([time, t.slice(1)]); continue; }
        throw new Error(`cannot read '${t}'`);
    }
    return vcd;
}

function valueAt(vcd: Vcd, ref: string, time: number): string {
    const v = vcd.vars.find((x) => x.ref === ref)!;
    let value = 'x';
    for (const [t, val] of vcd.changes.get(v.id)!) if (t <= time) value = val;
    return value;
}

const STIMULUS = `# arm the panel
reset=1
arm            # Idle -> Armed
arm code=0b10  # -> Open
- * 2          # !arm -> Idle, stays
`;

describe('stimulus files', () => {
    it('reads names, numbers, repeats and comments', () => {
        const m = panel();
        const cycles = parseStimulus(m, STIMULUS);
        expect(cycles.map((c) => [c.reset, ...c.inputs])).toEqual([[true, 0, 0], [false, 1, 0], [false, 1, 2], [false, 0, 0], [false, 0, 0]]);
        expect(parseStimulus(m, 'rst=1\ncode=0x3 arm=1 * 2').map((c) => [c.reset, ...c.inputs])).toEqual([[true, 0, 0], [false, 1, 3], [false, 1, 3]]);
    });
    it('rejects unknown names, values that do not fit and bad repeats, with the line', () => {
        const m = panel();
        expect(() => parseStimulus(m, '\n\nlevel=3')).toThrowError(/line 3: unknown name 'level'/);
        expect(() => parseStimulus(m, 'code=4')).toThrowError(StimulusError);
        expect(() => parseStimulus(m, 'arm * 0')).toThrowError(/positive count/);
        expect(() => parseStimulus(m, 'arm=2')).toThrowError(/does not fit/);
    });
});

describe('VCD (IEEE 1364-2005 §18)', () => {
    it('parses and shows clock, reset, inputs, outputs, state code and state name', () => {
        const m = panel();
        const trace = simulate(m, parseStimulus(m, STIMULUS));
        const vcd = readVcd(traceToVcd(m, trace));
        expect(vcd.timescale).toBe('1 ns');
        expect(vcd.scope).toEqual(['Panel']);
        expect(vcd.vars.map((v) => v.ref)).toEqual(['clk', 'rst', 'arm', 'code', 'beep', 'unlocked', 'lamp', 'state', 'state_name']);
        // Hand-computed (binary codes Idle=00 Armed=01 Open=10): states after each edge.
        const states = ['00', '01', '10', '00', '00'];
        const names = ['Idle', 'Armed', 'Open', 'Idle', 'Idle'];
        const lamp = ['01', '00', '10', '01', '01'];
        states.forEach((code, k) => {
            const t = 10 * k + 7; // after the edge at 10k + 5
            expect(valueAt(vcd, 'clk', t)).toBe('1');
            expect(valueAt(vcd, 'clk', 10 * k + 1)).toBe('0');
            expect(valueAt(vcd, 'state', t)).toBe(code);
            const bits = valueAt(vcd, 'state_name', t).padStart(8 * 5, '0');
            const text = bits.match(/.{8}/g)!.map((b) => String.fromCharCode(parseInt(b, 2))).join('').trim();
            expect(text).toBe(names[k]);
            expect(valueAt(vcd, 'lamp', t).padStart(2, '0')).toBe(lamp[k]);
        });
        // reset asserted (active high) in the first cycle only; arm = 1 in cycles 2 and 3.
        expect([1, 11, 21, 31].map((t) => valueAt(vcd, 'rst', t))).toEqual(['1', '0', '0', '0']);
        expect([1, 11, 21, 31].map((t) => valueAt(vcd, 'arm', t))).toEqual(['0', '1', '1', '0']);
        // Mealy beep: in Armed with arm = 1 after the second edge.
        expect(valueAt(vcd, 'beep', 17)).toBe('1');
        expect(valueAt(vcd, 'unlocked', 27)).toBe('1');
        expect(traceTable(m, trace).split('\n')[0]).toMatch(/^cycle\s+reset\s+arm\s+code\s+state\s+beep\s+unlocked\s+lamp$/);
    });
});
