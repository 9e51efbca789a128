/**
 * Electron MU against a published worked problem set (inputs and answers in
 * tests/reference/electron-course-examples/README.md: "SSD Electron Examples", DOS523, read as a
 * public copy; MU rounded to whole MU there). The formalism is AAPM TG-71's (from memory):
 * MU = D / (D'0 · Se · PDD · ((SSDeff + d0)/(SSDeff + d0 + g))²).
 */
import { describe, expect, it } from 'vitest';
import { coordinatesDoseReference, staticBeam } from '../../scripts/fixtures/plan-parts.js';
import type { ElectronPointInput } from '../../src/model/index.js';
import { electronDosePerMu, electronIsodoseDepthCm } from '../../src/physics/index.js';
import { beams, check, planFromSpec } from '../helpers/check-run.js';
import { machine, manifestPath } from '../helpers/machines.js';

const m = machine(manifestPath('tests/reference/electron-course-examples/manifest.json'));
const e = (id: string) => m.electronBeams.find((b) => b.id === id)!;
const mu = (id: string, input: ElectronPointInput, doseCGy = 200) => {
  const r = electronDosePerMu(e(id), input);
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return doseCGy / r.value.dosePerMuCGy;
};

describe('electron MU: the published worked examples', () => {
  it('2.1: 6 MeV, 10x10 cone, 8x10 cutout, 200 cGy at dmax, SSD 100 → 198 MU', () => {
    expect(mu('6E', { applicatorId: 'A10', field: { kind: 'rectangle', xCm: 8, yCm: 10 }, depthCm: 1.3, ssdCm: 100 })).toBeCloseTo(197.8, 1);
  });
  it('2.2: 9 MeV, 10x10 cone, 8x10 cutout, 200 cGy to the 90 % isodose → 220 MU', () => {
    const field = { kind: 'rectangle', xCm: 8, yCm: 10 } as const;
    const depth = electronIsodoseDepthCm(e('9E'), field, 90)!;
    expect(depth).toBeCloseTo(2.9, 6);
    const r = mu('9E', { applicatorId: 'A10', field, depthCm: depth, ssdCm: 100 });
    expect(Math.round(r)).toBe(220);
    expect(r).toBeCloseTo(200 / (1.001 * 1.011 * 0.9), 2);
  });
  it('2.3: 6 MeV, 6x6 cone, 5 cm circle, 200 cGy at 1.88 cm (PDD 90 %) → 233 MU', () => {
    // The circle by its equal-area square, 5·√π/2 = 4.43 cm.
    const r = mu('6E', {
      applicatorId: 'A06',
      field: { kind: 'equivalent-square', sideCm: (5 * Math.sqrt(Math.PI)) / 2, method: 'equal area' },
      depthCm: 1.88,
      ssdCm: 100,
    });
    expect(Math.round(r)).toBe(233);
  });
  it('2.4: 9 MeV, 15x15 cone, 9x15 cutout, SSD 105 (VSD 91.1 cm, dmax 2.2 cm) → 221 MU', () => {
    const r = mu('9E', { applicatorId: 'A15', field: { kind: 'rectangle', xCm: 9, yCm: 15 }, depthCm: 2.2, ssdCm: 105 });
    expect(Math.round(r)).toBe(221);
    expect(r).toBeCloseTo(200 / (1.006 * ((91.1 + 2.2) / (91.1 + 2.2 + 5)) ** 2), 6);
  });

  it('2.4 end to end: a DICOM plan with the applicator, the cutout as its aperture block and SSD 105 cm', () => {
    // An AP field on a head-first supine patient (gantry 0 enters anteriorly, from −y): the point at dmax on the central axis.
    const iso: [number, number, number] = [0, 0, 0];
    const point: [number, number, number] = [0, 50 + 22, 0]; // the source at y = −1000 mm, so the surface (SSD 1050) at y = +50 mm; dmax 22 mm below it
    const cutout = [
      [-45, -75],
      [45, -75],
      [45, 75],
      [-45, 75],
    ] as const; // 9 × 15 cm at the isocenter plane (= the nominal SSD)
    const plan = planFromSpec({
      file: 'e-example-2-4.dcm',
      patientId: 'E-2.4',
      patientName: 'Electron^Example',
      label: 'E 2.4',
      name: 'E 2.4',
      description: 'worked example 2.4',
      doseReferences: [coordinatesDoseReference(1, 'dmax', point, 2)],
      fractionGroups: [{ number: 1, fractions: 1, prescriptionGy: 2, beams: [{ number: 1, mu: 221, doseGy: 2, specPoint: point }] }],
      beams: [
        staticBeam(1, 'E9', 9, 0, 1050, iso, {
          radiation: 'ELECTRON',
          applicator: { id: 'A15', type: 'ELECTRON_SQUARE', description: '15 x 15 cone' },
          cutout,
          first: { jawsXMm: [-100, 100], jawsYMm: [-100, 100] },
        }),
      ],
    }).plan;
    const b = beams(check(plan, m, { aliases: { NG_LINAC1: m.name } }))[0]!;
    expect(b.reason).toBeUndefined();
    expect(b.status).toBe('checked');
    expect(b.calculation!.depthCm).toBeCloseTo(2.2, 9);
    expect(b.calculation!.electron!.airGapCm).toBeCloseTo(5, 9);
    expect(Math.round(b.calculation!.independentMu!)).toBe(221);
    expect(b.category).toBe('on-axis-open');
  });
});
