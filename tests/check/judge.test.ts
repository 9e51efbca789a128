/**
 * The verdict of each beam. Check values follow the policy's definition of the levels (a deviation
 * within the tolerance, beyond the action level, or between) and the project's rules: a beam giving
 * less than the policy's share of its point's dose is judged on its share of that dose; a verdict is
 * never made better, only worse, by what the check could not confirm (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_POLICY } from '../../src/check/index.js';
import { judge } from '../../src/check/judge.js';
import { type CalculatedBeam, type CheckedBeam, note } from '../../src/model/index.js';

/** A checked beam at the isocenter with the doses given (cGy) and the on-axis-open levels (2 % / 3 %). */
function beam(
  number: number,
  independentDoseCGy: number,
  planningSystemDoseCGy: number | undefined,
  extra: Partial<CalculatedBeam> = {},
): CalculatedBeam {
  const deviation = planningSystemDoseCGy ? (100 * (independentDoseCGy - planningSystemDoseCGy)) / planningSystemDoseCGy : undefined;
  return {
    beamNumber: number,
    radiationType: 'PHOTON',
    status: 'checked',
    plannedMu: 100,
    ...(planningSystemDoseCGy !== undefined ? { planningSystemDoseCGy } : {}),
    point: { source: 'beam-dose-specification-point', patientMm: [0, 0, 0], planningSystemDoseHere: true },
    calculation: {
      machineBeam: 'M 6X',
      setup: 'SAD',
      setupBasis: note('isocenter-deep', { depthCm: 10 }),
      ssdCm: 90,
      depthCm: 10,
      offAxisCm: 0,
      collimatorFieldCm: { x: 10, y: 10 },
      collimatorSquareCm: 10,
      irradiatedSquareCm: 10,
      approximations: [],
      factors: [],
      dosePerMuCGy: independentDoseCGy / 100,
      independentDoseCGy,
      ...(deviation !== undefined ? { doseDeviationPercent: deviation } : {}),
      clamps: [],
    },
    category: 'on-axis-open',
    tolerancePercent: 2,
    actionPercent: 3,
    fitness: { edgeDistanceCm: 5, flags: [] },
    ...extra,
  };
}
const judged = (...beams: CalculatedBeam[]) => judge(beams, DEFAULT_POLICY) as CheckedBeam[];

describe('judging a beam', () => {
  it('is within tolerance up to the tolerance, beyond the action level past it, needs review between', () => {
    const [a, b, c] = judged(beam(1, 101.9, 100), beam(2, 102.5, 100), beam(3, 96.9, 100));
    expect([a!.verdict, b!.verdict, c!.verdict]).toEqual(['within tolerance', 'needs review', 'beyond action level']);
    expect(a!.judgedOn).toBe('beam dose');
  });
  it('judges a beam giving less than the share of the point dose on its share of it', () => {
    // 5 cGy of 100 cGy at the point, 10 % high on its own: 0.5 % of the point's dose.
    const [small] = judged(beam(1, 5.5, 5), beam(2, 95, 95));
    expect(small!.judgedOn).toBe('share of the point dose');
    expect(small!.judgedDeviationPercent).toBeCloseTo(0.5, 12);
    expect(small!.verdict).toBe('within tolerance');
    expect(small!.verdictReasons).toContainEqual(note('judged-on-share', { sharePercent: 5 }));
  });
  it('needs review without a Beam Dose, with nothing to compare', () => {
    const [b] = judged(beam(1, 100, undefined));
    expect(b!.verdict).toBe('needs review');
    expect(b!.verdictReasons.map((r) => r.code)).toEqual(['no-beam-dose']);
  });
  it('is made worse, never better, by a point the Beam Dose may not refer to, an unfit point, an SSD the CT does not confirm', () => {
    const elsewhere = { source: 'isocenter' as const, patientMm: [0, 0, 0] as [number, number, number], planningSystemDoseHere: false };
    expect(judged(beam(1, 100, 100, { point: elsewhere }))[0]!.verdict).toBe('needs review');
    expect(judged(beam(1, 110, 100, { point: elsewhere }))[0]!.verdict).toBe('beyond action level');
    const unfit = judged(
      beam(1, 100, 100, { fitness: { edgeDistanceCm: 0.5, flags: [note('near-field-edge', { edgeDistanceCm: 0.5, marginCm: 1.5 })] } }),
    )[0]!;
    expect(unfit.verdict).toBe('needs review');
    expect(unfit.verdictReasons.map((r) => r.code)).toContain('point-unfit');
    const b = beam(1, 100, 100);
    const ct = {
      ssdAlongAxisMm: 900,
      planSsdMm: 910,
      ssdDifferenceMm: -10,
      ssdAlongRayMm: 900,
      geometricDepthMm: 100,
      radiologicalDepthMm: 100,
      entryPatientMm: [0, 0, 0] as [number, number, number],
      densityRange: [1, 1] as [number, number],
      correctionFactor: 1,
      homogeneousDoseCGy: 100,
      bodyThresholdHu: -400,
      body: 'HU >= -400',
      method: 'tpr-ratio' as const,
    };
    const off = judged({ ...b, calculation: { ...b.calculation, ct } })[0]!;
    expect(off.verdict).toBe('needs review');
    expect(off.verdictReasons.map((r) => r.code)).toEqual(['ct-correction', 'ct-ssd-differs']);
  });
});

describe('judging modulated beams', () => {
  const modulated = { category: 'modulated' as const, tolerancePercent: 4, actionPercent: 5 };
  it('judges them on their composite at the point: +6 % and −6 % on their own, 0 % together, within tolerance', () => {
    const [a, b] = judged(beam(1, 159, 150, modulated), beam(2, 141, 150, modulated));
    expect([a!.verdict, b!.verdict]).toEqual(['within tolerance', 'within tolerance']);
    expect(a!.judgedOn).toBe('composite of the modulated beams');
    expect(a!.judgedDeviationPercent).toBeCloseTo(0, 12);
    // Each beam's own deviation stays, for information.
    expect(a!.calculation.doseDeviationPercent).toBeCloseTo(6, 12);
    expect(a!.verdictReasons).toContainEqual({ code: 'judged-on-composite', values: { beams: 2, deviationPercent: 0 } });
  });
  it('a composite beyond the action level makes every modulated beam at the point beyond it; a static beam there is judged alone', () => {
    const [a, b, c] = judged(beam(1, 159, 150, modulated), beam(2, 156, 150, modulated), beam(3, 50, 50));
    expect(a!.judgedDeviationPercent).toBeCloseTo(5, 12);
    expect([a!.verdict, b!.verdict]).toEqual(['needs review', 'needs review']);
    expect(c!.judgedOn).toBe('beam dose');
    const [d] = judged(beam(1, 160, 150, modulated), beam(2, 160, 150, modulated));
    expect(d!.verdict).toBe('beyond action level');
  });
});
