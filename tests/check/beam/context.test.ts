/** What a beam's check says before any calculation, and the two ways a step ends it (not checked; refused). */
import { describe, expect, it } from 'vitest';
import { beamIdentity, type BeamCheckContext, isStopped, notCheckedBeam, stopNotChecked, stopRefused } from '../../../src/check/beam/context.js';
import type { CalculationPoint, ReferencedBeam } from '../../../src/model/index.js';
import { modelBeam, modelControlPoint } from '../../helpers/model-beam.js';

const beam = { ...modelBeam(), name: 'AP', controlPoints: [{ ...modelControlPoint([-50, 50], [-50, 50]), nominalEnergyMeV: 6 }] };
const entry: ReferencedBeam = { beamNumber: 1, beamMeterset: 123.4, beamDoseGy: 1.5 };
const point: CalculationPoint = { source: 'isocenter', patientMm: [0, 0, 0], planningSystemDoseHere: true };
const ctx = { beam, entry, point } as unknown as BeamCheckContext;

describe('the beam context', () => {
  it("a beam's identity: number, name, energy, planned MU and the planning system's dose in cGy (Gy × 100)", () => {
    expect(beamIdentity(beam, entry)).toEqual({
      beamNumber: 1,
      beamName: 'AP',
      radiationType: 'PHOTON',
      nominalEnergy: 6,
      plannedMu: 123.4,
      planningSystemDoseCGy: 150,
    });
  });
  it('not checked: the reason as a coded note, with its point', () => {
    const b = notCheckedBeam(beam, entry, 'no-open-aperture', {}, point);
    expect(b).toMatchObject({ status: 'not checked', reason: { code: 'no-open-aperture', values: {} }, point });
  });
  it('a step stopping the check: not checked, or refused with the beam named in every issue', () => {
    const s = stopNotChecked(ctx, 'sad-differs', { sadMm: 800 });
    expect(isStopped(s)).toBe(true);
    expect(s.stopped.ok && s.stopped.value).toMatchObject({ status: 'not checked', reason: { code: 'sad-differs', values: { sadMm: 800 } } });
    const r = stopRefused(ctx, [{ severity: 'error', code: 'missing-table', message: 'no tray "T1"' }]);
    expect(!r.stopped.ok && r.stopped.issues[0]).toMatchObject({ beamNumber: 1, beamName: 'AP', code: 'missing-table' });
    expect(isStopped({ value: 1 })).toBe(false);
  });
});
