/**
 * The one place a beam modifier missing from the beam data is decided (project rules): a wedge, a
 * swept-wedge table or a tray the beam data lack refuses the plan as an input error naming what the
 * data have; a swept wedge whose orientation is along no jaw is not checked, with the reason.
 */
import { describe, expect, it } from 'vitest';
import { type BeamSpec, coordinatesDoseReference, staticBeam } from '../../../scripts/fixtures/plan-parts.js';
import type { MachineModel } from '../../../src/model/index.js';
import { beams, check, planFromSpec } from '../../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const iso: [number, number, number] = [0, 0, 0];
const run = (name: string, b: BeamSpec, m: MachineModel = demo) =>
  check(
    planFromSpec({
      file: `${name}.dcm`,
      patientId: 'MOD-1',
      patientName: 'Modifier^Test',
      label: name,
      name,
      description: 'test',
      doseReferences: [coordinatesDoseReference(1, 'point', iso, 2)],
      fractionGroups: [{ number: 1, fractions: 1, prescriptionGy: 2, beams: [{ number: 1, mu: 200, doseGy: 2, specPoint: iso }] }],
      beams: [b],
    }).plan,
    m,
  );
const wedged = (id: string, orientation: number, type?: 'DYNAMIC') =>
  staticBeam(1, 'AP', 6, 0, 900, iso, {
    wedge: { id, angle: 30, factor: 0.7, orientation, ...(type ? { type } : {}) },
    first: { wedgeIn: true, jawsXMm: [-60, 60], jawsYMm: [-60, 60] },
  });

describe('beam modifiers and the beam data', () => {
  it('a physical wedge the beam data lack refuses the plan, naming the wedges they have', () => {
    const r = run('no-wedge', wedged('W99', 0));
    expect(r.issues).toHaveLength(1);
    expect(r.issues[0]).toMatchObject({ code: 'missing-table', beamNumber: 1, found: 'W99' });
    expect(r.issues[0]!.expected).toMatch(/W30/);
    expect(beams(r)[0]!.status).toBe('not checked');
  });
  it('a swept wedge without the swept-wedge table refuses the plan', () => {
    const noSwept: MachineModel = { ...demo, beams: demo.beams.map((b) => ({ ...b, sweptWedge: undefined })) };
    const r = run('no-swept-table', wedged('SW30', 0, 'DYNAMIC'), noSwept);
    expect(r.issues[0]).toMatchObject({ code: 'missing-table', expected: 'a sweptWedge table', found: 'none' });
  });
  it('a swept wedge oriented along no jaw axis is not checked, with its orientation', () => {
    const r = run('swept-45', wedged('SW30', 45, 'DYNAMIC'));
    expect(r.issues).toEqual([]);
    expect(beams(r)[0]).toMatchObject({ status: 'not checked', reason: { code: 'swept-wedge-orientation', values: { orientationDeg: 45 } } });
  });
});
