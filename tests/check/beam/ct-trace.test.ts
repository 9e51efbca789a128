/**
 * Off-axis points traced through a water-box CT must get the dose of the same points in flat water
 * without the CT: the off-axis ratio is measured in a plane at depth and already holds the beam's
 * divergence, so the depth, the SSD and the inverse square are taken along the central axis direction.
 * Check value: a homogeneous water box (HU 0 = density 1) below a flat surface normal to the beam is
 * the flat-water geometry of the no-CT calculation, so the two doses agree (common practice, no
 * source); ±0.2 % leaves room for the voxel grid (4 mm) at the surface.
 */
import { describe, expect, it } from 'vitest';
import { type BeamSpec, staticBeam } from '../../../scripts/fixtures/plan-parts.js';
import { checkPlan, DEFAULT_POLICY, type PatientCt } from '../../../src/check/index.js';
import type { Plan } from '../../../src/model/index.js';
import { beams, oneBeamPlan, type TestBeam } from '../../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../../helpers/machines.js';
import { phantomCt } from '../../helpers/phantom-ct.js';

const demo = machine(DEMO_MANIFEST);
const SURFACE_Y_MM = -100; // gantry 0, head-first supine: the beam enters from −y

const planWith = (name: string, beam: BeamSpec, point: [number, number, number]): Plan => oneBeamPlan(name, beam, point, { patientId: 'BOX-1' });

let box: PatientCt | undefined;
function waterBox(plan: Plan): PatientCt {
  box ??= phantomCt(
    {
      name: 'water-box',
      columns: 90,
      rows: 64,
      slices: 6,
      spacingMm: [4, 4, 4],
      originMm: [-178, -126, -10],
      frameOfReferenceUid: plan.frameOfReferenceUid!,
      hu: (_x, y) => (y >= SURFACE_Y_MM ? 0 : -1000),
    },
    -400,
  );
  // Every plan of this file shares one frame of reference UID (the fixture writer derives it from the patient).
  return { ...box, volume: { ...box.volume, frameOfReferenceUid: plan.frameOfReferenceUid! } };
}

function dosePerMu(plan: Plan, ct?: PatientCt): number {
  const b: TestBeam = beams(
    checkPlan(
      plan,
      { path: 'box.dcm', sha256: '' },
      { machine: demo, policy: DEFAULT_POLICY, aliases: new Map(), suggestPoint: false, ...(ct ? { ct } : {}) },
    ),
  )[0]!;
  if (b.status !== 'checked') throw new Error(JSON.stringify(b.reason));
  return b.calculation.dosePerMuCGy;
}

function asArc(b: BeamSpec, n: number): BeamSpec {
  const first = b.controlPoints[0]!;
  const cps = Array.from({ length: n }, (_, j) => ({
    ...(j === 0 ? first : { gantryDeg: first.gantryDeg, jawsXMm: first.jawsXMm, jawsYMm: first.jawsYMm }),
    weight: j / (n - 1),
    doseCoefficient: j / (n - 1),
  }));
  return { ...b, dynamic: true, controlPoints: cps };
}

const iso: [number, number, number] = [0, 0, 0];
const open30 = (): BeamSpec => staticBeam(1, 'AP', 6, 0, 900, iso, { first: { jawsXMm: [-150, 150], jawsYMm: [-150, 150] } });

describe('an off-axis point traced through a water box gets the flat-water dose', () => {
  for (const offAxisMm of [0, 50, 80, 100, 120]) {
    it(`static 30 × 30, SAD 100, 10 cm deep, ${offAxisMm / 10} cm off axis`, () => {
      const plan = planWith(`box-static-${offAxisMm}`, open30(), [offAxisMm, 0, 0]);
      expect(Math.abs(dosePerMu(plan, waterBox(plan)) / dosePerMu(plan) - 1)).toBeLessThan(0.002);
    });
    it(`modulated (an arc of identical 30 × 30 control points), ${offAxisMm / 10} cm off axis`, () => {
      const plan = planWith(`box-arc-${offAxisMm}`, asArc(open30(), 6), [offAxisMm, 0, 0]);
      expect(Math.abs(dosePerMu(plan, waterBox(plan)) / dosePerMu(plan) - 1)).toBeLessThan(0.002);
    });
  }
  for (const offAxisMm of [0, 40, 80]) {
    it(`electron 9 MeV, applicator A20 at SSD 100, 2 cm deep, ${offAxisMm / 10} cm off axis`, () => {
      const e = staticBeam(1, 'E9', 9, 0, 1000, [0, SURFACE_Y_MM, 0], {
        radiation: 'ELECTRON',
        applicator: { id: 'A20', type: 'ELECTRON_SQUARE', description: 'cone' },
        first: { jawsXMm: [-150, 150], jawsYMm: [-150, 150] },
      });
      const plan = planWith(`box-e-${offAxisMm}`, e, [offAxisMm, SURFACE_Y_MM + 20, 0]);
      expect(Math.abs(dosePerMu(plan, waterBox(plan)) / dosePerMu(plan) - 1)).toBeLessThan(0.002);
    });
  }
});
