/**
 * Graphviz DOT of the state diagram: one node per state (node id = the state name), Moore
 * outputs in the node label, one edge per transition labelled `guard / Mealy outputs`, a reset
 * arrow from a point node, and a dashed `recover` edge from the unused codes.
 * Pseudo nodes have ids with parentheses, which no state name can have.
 */
import type { Emit, Guard, Machine } from '../model/machine.js';
import type { StateAssignment } from '../synthesis/encoding.js';
import { clearResetState } from '../synthesis/encoding.js';
import { defaultAssignment } from '../simulation/simulator.js';
import { type ExportFile, type ExportOptions, commentBlock, headerLines } from './common.js';

const PREC = { or: 1, xor: 2, and: 3, not: 4, atom: 5 } as const;

/** A guard in Detent's own syntax with the fewest parentheses (`!` > `&` > `^` > `|`). */
export function guardSource(guard: Guard, machine: Machine): string {
    const rec = (g: Guard): { text: string; prec: number } => {
        switch (g.kind) {
            case 'const': return { text: g.value ? '1' : '0', prec: PREC.atom };
            case 'input': return { text: machine.inputs[g.input]!.name, prec: PREC.atom };
            case 'bit': return { text: `${machine.inputs[g.input]!.name}[${g.bit}]`, prec: PREC.atom };
            case 'compare': return { text: `${machine.inputs[g.input]!.name} ${g.op} ${g.value}`, prec: PREC.atom };
            case 'not': {
                const inner = rec(g.operand);
                // A comparison is a primary, but `!` before it reads better with parentheses.
                const wrap = inner.prec < PREC.not || g.operand.kind === 'compare';
                return { text: `!${wrap ? `(${inner.text})` : inner.text}`, prec: PREC.not };
            }
            default: {
                const prec = PREC[g.kind];
                const op = g.kind === 'and' ? ' & ' : g.kind === 'or' ? ' | ' : ' ^ ';
                const parts = g.operands.map((o) => { const r = rec(o); return r.prec < prec ? `(${r.text})` : r.text; });
                return { text: parts.join(op), prec };
            }
        }
    };
    return rec(guard).text;
}

const quote = (s: string) => `"${s.replace(/\\/g, '\\\\').replace(/"/g, '\\"').replace(/[\r\n]+/g, ' ')}"`;

function emitsText(machine: Machine, emits: readonly Emit[]): string {
    return emits.map((e) => {
        const o = machine.outputs[e.output]!;
        return o.isBus ? `${o.name} = ${e.value}` : e.value ? o.name : `${o.name} = 0`;
    }).join(', ');
}

export function exportDot(machine: Machine, options: ExportOptions): ExportFile {
    const assignment: StateAssignment = options.assignment ?? options.synthesis?.assignment ?? defaultAssignment(machine);
    const L: string[] = [...commentBlock('//', headerLines({ machine, what: 'state diagram (Graphviz DOT)', options, assignment }))];
    L.push(`digraph ${quote(machine.name)} {`, '    rankdir=LR;', '    node [shape=ellipse];');
    machine.states.forEach((s, i) => {
        const moore = emitsText(machine, s.emits);
        const label = `${s.name}\\n${assignment.codes[i]}${moore ? `\\n${moore.replace(/\\/g, '')}` : ''}`;
        L.push(`    ${quote(s.name)} [label="${label.replace(/"/g, '\\"')}"${s.priority ? ', peripheries=2' : ''}];`);
    });
    const r = machine.reset;
    const resetTarget = r ? (r.target === 'clear' ? clearResetState(assignment) : r.target) : 0;
    L.push('    "(reset)" [shape=point];');
    if (resetTarget !== undefined) L.push(`    "(reset)" -> ${quote(machine.states[resetTarget]!.name)} [label=${quote(r ? `${r.name}${r.target === 'clear' ? ' (clear)' : ''}` : 'power-up')}];`);
    machine.states.forEach((s) => {
        s.transitions.forEach((t, k) => {
            const mealy = emitsText(machine, t.emits);
            const guard = guardSource(t.guard, machine);
            const label = `${s.priority ? `${k + 1}: ` : ''}${guard}${mealy ? ` / ${mealy}` : ''}`;
            L.push(`    ${quote(s.name)} -> ${quote(machine.states[t.target]!.name)} [label=${quote(label)}];`);
        });
        const ow = s.otherwise;
        if (ow?.kind === 'goto') {
            const mealy = emitsText(machine, ow.emits);
            L.push(`    ${quote(s.name)} -> ${quote(machine.states[ow.target]!.name)} [label=${quote(`otherwise${mealy ? ` / ${mealy}` : ''}`)}, style=dashed];`);
        }
    });
    if (machine.recover) {
        L.push('    "(unused codes)" [shape=box, style=dashed];');
        L.push(`    "(unused codes)" -> ${quote(machine.states[machine.recover.target]!.name)} [label="recover", style=dashed];`);
    }
    L.push('}', '');
    return { name: `${machine.name}.dot`, text: L.join('\n') };
}
