/**
 * A beam's beam data by its Treatment Machine Name, and the one rule that chooses a plan's machine
 * among several (project rules: never another machine's data; the user's alias first).
 */
import { describe, expect, it } from 'vitest';
import { chooseMachine, matchMachine } from '../../src/check/match-machine.js';
import type { MachineModel, Plan } from '../../src/model/index.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const other: MachineModel = { ...demo, name: 'OTHER', aliases: ['OTHER', 'LINAC B'] };
const planOn = (name: string | undefined) => ({ beams: [{ machineName: name }] }) as unknown as Plan;

describe('the machine of a beam and of a plan', () => {
  it('matches by name or alias, or through the user alias, and says how', () => {
    expect(matchMachine(demo.name, demo, new Map())).toEqual({ ok: true, value: 'same name' });
    expect(matchMachine('LINAC B', other, new Map())).toEqual({ ok: true, value: 'alias LINAC B in the beam data' });
    expect(matchMachine('TB1', demo, new Map([['TB1', demo.name]]))).toEqual({ ok: true, value: `--machine-alias TB1=${demo.name}` });
  });
  it('refuses a machine the beam data do not name, and a beam without a machine name', () => {
    const r = matchMachine('LINAC Z', demo, new Map());
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]).toMatchObject({ code: 'missing-table', found: 'LINAC Z' });
    expect(matchMachine(undefined, demo, new Map()).ok).toBe(false);
  });
  it("chooses among several the one the plan's machine name names, else the first (whose mismatch the check reports)", () => {
    expect(chooseMachine(planOn('LINAC B'), [demo, other], (m) => m, new Map()).name).toBe('OTHER');
    expect(chooseMachine(planOn('LINAC Z'), [demo, other], (m) => m, new Map()).name).toBe(demo.name);
  });
});
