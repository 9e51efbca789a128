/**
 * A static photon beam through the patient's CT: every table lookup the dose rests on is reported,
 * including the TPR at the radiological depth that the heterogeneity correction reads.
 * Check values: the TPR-ratio correction's definition, CF = TPR(d_eff)/TPR(d) (common practice, no
 * source); the phantom's depths follow from its geometry.
 */
import { describe, expect, it } from 'vitest';
import { ctNoiseHu } from '../../helpers/noise.js';
import { coordinatesDoseReference, staticBeam } from '../../../scripts/fixtures/plan-parts.js';
import { checkPlan, DEFAULT_POLICY } from '../../../src/check/index.js';
import type { LookupLog, MachineModel } from '../../../src/model/index.js';
import { phantomCt } from '../../helpers/phantom-ct.js';
import { beams, planFromSpec } from '../../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);

/** The demo machine with its 6X TMR table reporting a clamp for any lookup shallower than `belowCm`. */
function withShallowClamp(m: MachineModel, belowCm: number): MachineModel {
  return {
    ...m,
    beams: m.beams.map((b) => {
      if (b.id !== '6X' || !b.tpr) return b;
      const t = b.tpr;
      const at = (row: number, column: number, log: LookupLog) => {
        if (row < belowCm)
          log.push({ table: 'TMR (test)', axis: 'depth', requested: row, used: belowCm, kind: 'clamped', range: [belowCm, 30], unit: 'cm' });
        return t.at(row, column, log);
      };
      const tpr = { ...t, at, atRow: (row: number, log: LookupLog) => (column: number, l: LookupLog) => at(row, column, l ?? log) };
      return { ...b, tpr };
    }),
  };
}

describe('a static photon beam through the CT', () => {
  it('reports a clamped lookup at the radiological depth, which only the heterogeneity correction reads', () => {
    const iso: [number, number, number] = [0, 0, 0];
    const { plan } = planFromSpec({
      file: 'half-density.dcm',
      patientId: 'CT-1',
      patientName: 'Static^Ct',
      label: 'HALF',
      name: 'half density',
      description: 'test',
      doseReferences: [coordinatesDoseReference(1, 'point', iso, 2)],
      fractionGroups: [{ number: 1, fractions: 1, prescriptionGy: 2, beams: [{ number: 1, mu: 200, doseGy: 2, specPoint: iso }] }],
      beams: [staticBeam(1, 'AP', 6, 0, 900, iso, { first: { jawsXMm: [-50, 50], jawsYMm: [-50, 50] } })],
    });
    // A box of density about 0.5 from 100 mm above the isocenter down: geometric depth 10 cm, radiological about 5 cm.
    const ct = phantomCt(
      {
        name: 'half',
        columns: 64,
        rows: 64,
        slices: 20,
        spacingMm: [4, 4, 4],
        originMm: [-126, -126, -38],
        frameOfReferenceUid: plan.frameOfReferenceUid!,
        hu: (_x, y) => (y >= -100 && y <= 100 ? -500 : -1000),
      },
      -600,
    );
    const b = beams(
      checkPlan(
        plan,
        { path: 'half.dcm', sha256: '' },
        { machine: withShallowClamp(demo, 8), policy: DEFAULT_POLICY, aliases: new Map(), suggestPoint: false, ct },
      ),
    )[0]!;
    if (b.status !== 'checked') throw new Error(JSON.stringify(b.reason));
    expect(b.calculation.ct!.geometricDepthMm).toBeCloseTo(100, 0);
    expect(b.calculation.ct!.radiologicalDepthMm).toBeLessThan(80);
    expect(b.calculation.clamps).toContainEqual(
      expect.objectContaining({ table: 'TMR (test)', axis: 'depth', requested: b.calculation.ct!.radiologicalDepthMm / 10 }),
    );
  });
});

describe("Batho's law on a real-looking CT", () => {
  const point: [number, number, number] = [0, 0, 0];
  const gantries = Array.from({ length: 12 }, (_, k) => k * 30);
  const { plan } = planFromSpec({
    file: 'noisy-batho.dcm',
    patientId: 'CT-2',
    patientName: 'Noisy^Water',
    label: 'NOISY',
    name: 'noisy water',
    description: 'test',
    doseReferences: [coordinatesDoseReference(1, 'point', point, 2)],
    fractionGroups: [
      { number: 1, fractions: 1, prescriptionGy: 2, beams: gantries.map((_, k) => ({ number: k + 1, mu: 20, doseGy: 0.17, specPoint: point })) },
    ],
    beams: gantries.map((g, k) => staticBeam(k + 1, `G${g}`, 6, g, 900, point, { first: { jawsXMm: [-50, 50], jawsYMm: [-50, 50] } })),
  });
  /** A water cylinder (radius 100 mm) with ±15 HU of noise, lung (−750 HU) where `lung` says. */
  const cylinder = (name: string, lung: (x: number, y: number) => boolean) =>
    phantomCt(
      {
        name,
        columns: 64,
        rows: 64,
        slices: 12,
        spacingMm: [4, 4, 4],
        originMm: [-126, -126, -22],
        frameOfReferenceUid: plan.frameOfReferenceUid!,
        hu: (x, y, z) => (x * x + y * y > 100 * 100 ? -1000 : lung(x, y) ? -750 + ctNoiseHu(x, y, z) : ctNoiseHu(x, y, z)),
      },
      -400,
    );
  const run = (ct: ReturnType<typeof phantomCt>) =>
    beams(
      checkPlan(
        plan,
        { path: 'noisy.dcm', sha256: '' },
        { machine: demo, policy: DEFAULT_POLICY, aliases: new Map(), suggestPoint: false, ct, heterogeneity: 'batho' },
      ),
    );

  it('CT noise of ±15 HU in water: the factor stays within ±0.3 % of 1 from 12 gantry angles, and no interface is said', () => {
    // Check value: Batho's law is 1 in water (its definition; common practice, no source).
    for (const b of run(cylinder('noisy', () => false))) {
      if (b.status !== 'checked') throw new Error(JSON.stringify(b.reason));
      expect(Math.abs(b.calculation.ct!.correctionFactor - 1)).toBeLessThan(0.003);
      expect(b.calculation.approximations.map((a) => a.code)).not.toContain('batho-interface-in-build-up');
    }
  });
  it('a point inside lung is calculated, and the result says the energy-absorption ratio of its medium was not applied', () => {
    const b = run(cylinder('lung-core', (x, y) => x * x + y * y < 40 * 40))[0]!;
    if (b.status !== 'checked') throw new Error(JSON.stringify(b.reason));
    expect(b.calculation.ct!.correctionFactor).toBeGreaterThan(1);
    expect(b.calculation.approximations).toContainEqual(expect.objectContaining({ code: 'batho-point-medium' }));
  });
});
