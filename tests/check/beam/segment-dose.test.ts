/**
 * One segment's dose per MU at the point from its own aperture, gantry angle and depth, in the TPR
 * form: an open square segment gives the static isocentric check's dose per MU (the same formalism);
 * a covered point takes the leaf transmission; the opening's width through the point is measured
 * along the leaves; a segment without an SSD or a CT, or with the point above the surface, stops.
 */
import { describe, expect, it } from 'vitest';
import type { BeamCheckContext } from '../../../src/check/beam/context.js';
import { isStopped } from '../../../src/check/beam/context.js';
import { segmentDose } from '../../../src/check/beam/segment-dose.js';
import { DEFAULT_POLICY } from '../../../src/check/policy.js';
import type { ControlPoint } from '../../../src/model/index.js';
import { photonDosePerMu } from '../../../src/physics/index.js';
import { beam as dataBeam, DEMO_MANIFEST, machine } from '../../helpers/machines.js';
import { boxCt } from '../../helpers/model-ct.js';
import { modelBeam, modelControlPoint } from '../../helpers/model-beam.js';

const demo = machine(DEMO_MANIFEST);
const data = dataBeam(demo, '6X');
/** 20 leaf pairs 5 mm wide over y −50…50. */
const beam = modelBeam({ pairs: 20, widthMm: 5 });
const leaves = (a: number, b: number) => [...Array(20).fill(a), ...Array(20).fill(b)];
const cp = (l: number[], gantry = 0): ControlPoint => ({
  ...modelControlPoint([-50, 50], [-50, 50], l),
  gantryAngleDeg: gantry,
  isocenterPatientMm: [0, 0, 0],
});
const ctx = (pointMm: [number, number, number] = [0, 0, 0], ct?: ReturnType<typeof boxCt>) =>
  ({
    beam,
    entry: { beamNumber: 1, beamMeterset: 100 },
    point: { source: 'isocenter', patientMm: pointMm },
    patientPosition: 'HFS',
    machine: demo,
    policy: DEFAULT_POLICY,
    suggestPoint: false,
    ...(ct ? { ct } : {}),
  }) as unknown as BeamCheckContext;
const dose = (c: BeamCheckContext, mid: ControlPoint, ssdMm?: number) => {
  const r = segmentDose(c, data, { from: 0, share: 0.5, mid, ...(ssdMm !== undefined ? { ssdMm } : {}) }, 1000);
  if (isStopped(r)) throw new Error(JSON.stringify(r.stopped));
  return r;
};

describe('segmentDose', () => {
  it('an open 10 × 10 segment, the point 10 cm deep at the isocenter: the isocentric dose per MU of a 10 × 10 field', () => {
    const s = dose(ctx(), cp(leaves(-60, 60)), 900);
    const direct = photonDosePerMu(data, demo.sadCm, { setup: 'SAD', collimatorFieldCm: { x: 10, y: 10 }, depthCm: 10, ssdCm: 90 });
    if (!direct.ok) throw new Error('refused');
    expect(s.dosePerMuCGy).toBeCloseTo(direct.value.dosePerMuCGy, 10);
    expect(s).toMatchObject({ share: 0.5, correction: 1, covered: false, clarkson: false, primaryFluence: 1 });
    expect(s.depthCm).toBeCloseTo(10, 12);
    expect(s.openWidthCm).toBeCloseTo(10, 12);
  });
  it('leaves open ±30 mm: Clarkson, the opening 6 cm wide through the point (plus the leaf gap), 3 cm from its edge (plus half)', () => {
    const gapMm = data.dosimetricLeafGapMm ?? 0;
    const s = dose(ctx(), cp(leaves(-30, 30)), 900);
    expect(s.clarkson).toBe(true);
    expect(s.openWidthCm).toBeCloseTo((60 + gapMm) / 10, 12);
    expect(s.edgeDistanceMm).toBeCloseTo(30 + gapMm / 2, 9);
    expect(s.dosePerMuCGy).toBeLessThan(dose(ctx(), cp(leaves(-60, 60)), 900).dosePerMuCGy);
  });
  it('the point under closed leaves: covered, the fluence there the leaf transmission', () => {
    const s = dose(ctx(), cp(leaves(20, 40)), 900);
    expect(s.covered).toBe(true);
    expect(s.openWidthCm).toBe(0);
    expect(s.primaryFluence).toBe(data.mlcTransmission ?? 0);
  });
  it('through a water box, the CT gives the depth (its face at 102.5 mm) and no correction', () => {
    const s = dose(ctx([0, 0, 0], boxCt({ halfMm: 100 })), cp(leaves(-60, 60)), 900);
    expect(s.depthCm).toBeCloseTo(10.25, 9);
    expect(s.correction).toBeCloseTo(1, 9);
    expect(s.ssdDifferenceMm).toBeCloseTo(-2.5, 9);
  });
  it('no SSD and no CT, or the point above the surface: the check stops naming the control point', () => {
    const none = segmentDose(ctx(), data, { from: 3, share: 0.5, mid: cp(leaves(-60, 60)) }, 1000);
    expect(isStopped(none) && none.stopped.ok && none.stopped.value).toMatchObject({
      reason: { code: 'segment-no-ssd', values: { controlPoint: 3 } },
    });
    const above = segmentDose(ctx([0, -150, 0]), data, { from: 2, share: 0.5, mid: cp(leaves(-60, 60)), ssdMm: 900 }, 1000);
    expect(isStopped(above) && above.stopped.ok && above.stopped.value).toMatchObject({
      reason: { code: 'point-above-surface', values: { controlPoint: 2 } },
    });
  });
});
