/**
 * `detent synth` end to end (lives with the synthesis tests because the command is synthesis's
 * front end): the JSON it prints is used, on its own, to rebuild the machine, and that rebuilt
 * machine is simulated against the model semantics (oracle.ts) for every state and input.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { parseDetent } from '@detent/language';
import { synthCommand } from '../../../cli/src/commands/synth.js';
import { allInputValuations } from '../support/random-machine.js';
import { characteristicOracle, modelStep } from './oracle.js';

const GATE = `
/** Car-park exit barrier: opens on a paid ticket, closes once the loop clears. */
machine BarrierGate {
    clock clk;
    reset rst sync -> Down;
    input ticket_ok, loop_occupied, arm_up, arm_down;
    input async obstruction;
    output motor_up, motor_down, lamp;
    encoding auto;
    flipflop JK;

    state Down {
        when ticket_ok -> Raising;
        otherwise stay;
    }
    state Raising {
        emit motor_up;
        when arm_up -> Up;
        otherwise stay;
    }
    state Up priority {
        emit lamp;
        when loop_occupied -> Up;
        when !loop_occupied -> Lowering;
    }
    state Lowering priority {
        emit motor_down;
        when obstruction -> Raising emit lamp;
        when arm_down -> Down;
        otherwise stay;
    }
}

machine Second { state A { otherwise stay; } }
`;

interface SynthJson {
    machine: string; encoding: string; flipflop: string; width: number;
    codes: Record<string, string>;
    equations: { name: string; products: Record<string, 0 | 1>[] }[];
    cost: { flipflops: number; literals: number; gateInputs: number };
    recovery: { lockup: boolean; method: string; unusedCodes: number };
}

async function run(args: string[]): Promise<{ code: number; out: string; err: string }> {
    let out = '', err = '';
    let code: number;
    try {
        code = await synthCommand(args, { stdout: (t) => { out += t; }, stderr: (t) => { err += t; } });
    } catch (e) {
        // UsageError: main.ts maps it to exit 2.
        return { code: 2, out, err: String(e) };
    }
    return { code, out, err };
}

describe('detent synth', () => {
    const dir = mkdtempSync(join(tmpdir(), 'detent-synth-'));
    const file = join(dir, 'gate.detent');
    writeFileSync(file, GATE);

    for (const flipflop of ['D', 'T', 'JK', 'SR']) {
        for (const encoding of ['auto', 'binary', 'onehot', 'johnson']) {
            it(`JSON reproduces the model (${encoding}, ${flipflop})`, async () => {
                const { code, out } = await run([file, '--format', 'json', '--encoding', encoding, '--flipflop', flipflop]);
                expect(code).toBe(0);
                const j = JSON.parse(out) as SynthJson;
                for (const key of ['machine', 'encoding', 'flipflop', 'width', 'codes', 'equations', 'cost', 'recovery']) expect(j).toHaveProperty(key);
                for (const key of ['flipflops', 'literals', 'gateInputs']) expect(j.cost).toHaveProperty(key);
                expect(j.machine).toBe('BarrierGate');
                expect(j.flipflop).toBe(flipflop);
                const machine = parseDetent(GATE).machines[0]!.machine;
                const eqs = new Map(j.equations.map((e) => [e.name, e.products]));
                const value = (name: string, env: Record<string, number>) =>
                    eqs.get(name)!.some((p) => Object.entries(p).every(([v, b]) => env[v] === b)) ? 1 : 0;
                const ports = { D: ['d'], T: ['t'], JK: ['j', 'k'], SR: ['s', 'r'] }[flipflop]!;
                const byCode = new Map(Object.entries(j.codes).map(([s, c]) => [c, s]));
                for (const [s, st] of machine.states.entries()) {
                    const code = j.codes[st.name]!;
                    expect(code).toHaveLength(j.width);
                    for (const values of allInputValuations(machine)) {
                        const env: Record<string, number> = {};
                        machine.inputs.forEach((inp, k) => { env[inp.name] = values[k]!; });
                        for (let i = 0; i < j.width; i++) env[`q${i}`] = code[j.width - 1 - i] === '1' ? 1 : 0;
                        let next = '';
                        for (let i = j.width - 1; i >= 0; i--) {
                            const [a, b] = ports.map((p) => value(`${p}${i}`, env));
                            next += characteristicOracle(flipflop as 'D', env[`q${i}`]!, a!, b ?? 0);
                        }
                        const step = modelStep(machine, s, values);
                        expect(byCode.get(next), `${st.name} ${values}`).toBe(machine.states[step.next!]!.name);
                        machine.outputs.forEach((o, k) => expect(value(o.name, env), `${o.name} in ${st.name}`).toBe(step.outputs[k]));
                    }
                }
                expect(typeof j.recovery.lockup).toBe('boolean');
            });
        }
    }

    it('text shows codes, both notations, cost and recovery', async () => {
        const { code, out, err } = await run([file, '--encoding', 'binary', '--flipflop', 'T']);
        expect(code).toBe(0);
        expect(err).toMatch(/2 machines; synthesizing 'BarrierGate'/);
        expect(out).toMatch(/^ {2}Down +00$/m);
        expect(out).toMatch(/^ {2}t0 = .*·/m);
        expect(out).toMatch(/^ {2}t0 = .*&/m);
        expect(out).toMatch(/^cost: 2 flip-flops/m);
        expect(out).toMatch(/^recovery: no unused codes/m);
        expect(out).toMatch(/not safety certification/);
    });

    it('exit codes: --help 0, unknown machine / missing file / bad flag 2, machine with errors 1', async () => {
        expect((await run(['--help'])).code).toBe(0);
        expect((await run([file, '--machine', 'Nope'])).code).toBe(2);
        expect((await run([join(dir, 'missing.detent')])).code).toBe(2);
        expect((await run([file, '--colour'])).code).toBe(2);
        const bad = join(dir, 'bad.detent');
        writeFileSync(bad, 'machine Bad { input a; state A { when a -> Nowhere; } }');
        const r = await run([bad]);
        expect(r.code).toBe(1);
        expect(r.err).toMatch(/unknown-name/);
        const second = await run([file, '--machine', 'Second', '--format', 'json']);
        expect(second.code).toBe(0);
        expect(JSON.parse(second.out).codes).toEqual({ A: '0' });
    });
});
