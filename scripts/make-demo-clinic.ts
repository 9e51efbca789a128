/**
 * Writes the demo clinic's plans (fixtures/demo/clinic/), the ones `npm run demo` checks. INVENTED:
 * a fictional clinic (Nowhere General), fictional patients, and "planning system" MU made up
 * so each beam's planned MU give the stated Beam Dose within a small invented difference from the
 * demo machine's own dose per MU, as a planning system with another algorithm would. One plan has
 * an MU mis-typed by 10 % so the check flags it; one is an electron field with a cutout, one a two-arc VMAT plan.
 * The pelvis plan's "planning system" corrected for heterogeneity with the demo CT (npm run demo-ct
 * first), so checking it without the CT shows what ignoring the bone in the PA beam costs.
 * Run: npm run demo-clinic
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadMachine } from '../src/beamdata/index.js';
import { checkPlan, DEFAULT_POLICY } from '../src/check/index.js';
import { loadPatientCts } from '../src/run/index.js';
import { importPlanFile } from '../src/dicom/index.js';
import { RT_PLAN_STORAGE, writeDataset } from './lib/dcmjs-writer.js';
import { arcBeam } from './fixtures/demo-plans.js';
import { type PlanSpec, coordinatesDoseReference, ellipseLeaves, planDataset, round, staticBeam } from './fixtures/plan-parts.js';

const OUT = fileURLToPath(new URL('../fixtures/demo/clinic/', import.meta.url));
type Point = [number, number, number];

interface DemoPlan {
  spec: PlanSpec;
  /** Per beam: the invented planning system's dose over the demo machine's, minus 1. */
  tpsDifference: number[];
  /** Per beam: a factor the MU were mis-typed by (1 = typed correctly). */
  misTyped?: number[];
  /** The planning system corrected for heterogeneity with this patient's demo CT. */
  withCt?: boolean;
}

const fg = (fractions: number, rxGy: number, beams: { number: number; doseGy: number; point: Point }[]) => [
  { number: 1, fractions, prescriptionGy: rxGy, beams: beams.map((b) => ({ number: b.number, mu: 100, doseGy: b.doseGy, specPoint: b.point })) },
];

function pelvisBox(): DemoPlan {
  const iso: Point = [0, 10, -80];
  const jaws = { jawsXMm: [-75, 75] as const, jawsYMm: [-90, 90] as const };
  return {
    spec: {
      file: 'pelvis-box.dcm',
      patientId: 'NG-1001',
      patientName: 'Demo^Quill',
      label: 'PELVIS BOX',
      name: 'Four-field pelvis box, 15 MV',
      description: 'Invented demo plan: four-field box, 15 MV, 2 Gy per fraction at the isocenter',
      doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 50)],
      fractionGroups: fg(
        25,
        50,
        [1, 2, 3, 4].map((n) => ({ number: n, doseGy: n <= 2 ? 0.45 : 0.55, point: iso })),
      ),
      beams: [
        staticBeam(1, 'AP', 15, 0, 900, iso, { first: jaws }),
        staticBeam(2, 'PA', 15, 180, 880, iso, { first: jaws }),
        staticBeam(3, 'LLAT', 15, 90, 830, iso, { first: jaws }),
        staticBeam(4, 'RLAT', 15, 270, 835, iso, { first: jaws }),
      ],
    },
    tpsDifference: [0.006, -0.004, 0.011, -0.008],
    withCt: true,
  };
}

function brainLaterals(): DemoPlan {
  const iso: Point = [0, 0, 120];
  const jaws = { jawsXMm: [-60, 60] as const, jawsYMm: [-70, 70] as const };
  return {
    spec: {
      file: 'brain-laterals.dcm',
      patientId: 'NG-1002',
      patientName: 'Demo^Wren',
      label: 'BRAIN LATS',
      name: 'Opposed lateral pair, 6 MV',
      description: 'Invented demo plan: opposed laterals, 6 MV, 2 Gy per fraction',
      doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 60)],
      fractionGroups: fg(
        30,
        60,
        [1, 2].map((n) => ({ number: n, doseGy: 1, point: iso })),
      ),
      beams: [staticBeam(1, 'LLAT', 6, 90, 925, iso, { first: jaws }), staticBeam(2, 'RLAT', 6, 270, 928, iso, { first: jaws })],
    },
    tpsDifference: [-0.007, 0.005],
  };
}

function spineSsd(): DemoPlan {
  // SSD setup: the isocenter on the posterior skin, the point 5 cm deep on the central axis (anterior of it).
  const iso: Point = [0, 60, -250];
  const point: Point = [0, 10, -250];
  return {
    spec: {
      file: 'spine-ssd.dcm',
      patientId: 'NG-1003',
      patientName: 'Demo^Lark',
      label: 'SPINE PA',
      name: 'Single PA spine field at SSD 100 cm, 6 MV',
      description: 'Invented demo plan: SSD setup, 3 Gy per fraction at 5 cm depth',
      doseReferences: [coordinatesDoseReference(1, 'prescription point 5 cm deep', point, 30)],
      fractionGroups: fg(10, 30, [{ number: 1, doseGy: 3, point }]),
      beams: [staticBeam(1, 'PA SPINE', 6, 180, 1000, iso, { first: { jawsXMm: [-40, 40], jawsYMm: [-150, 150] } })],
    },
    tpsDifference: [0.009],
  };
}

function breastTangentsMistyped(): DemoPlan {
  const iso: Point = [70, -40, 30];
  const jaws = { wedgeIn: true, jawsXMm: [-50, 50] as const, jawsYMm: [-100, 100] as const };
  return {
    spec: {
      file: 'breast-tangents.dcm',
      patientId: 'NG-1004',
      patientName: 'Demo^Finch',
      label: 'L BREAST TG',
      name: 'Wedged tangents, 6 MV',
      description: 'Invented demo plan: wedged tangent pair; the MU of the lateral field were mis-typed 10 % high',
      doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 50)],
      fractionGroups: fg(
        25,
        50,
        [1, 2].map((n) => ({ number: n, doseGy: 1, point: iso })),
      ),
      beams: [
        staticBeam(1, 'MED TG W15', 6, 300, 915, iso, { wedge: { id: 'W15', angle: 15, factor: 0.82, orientation: 90 }, first: jaws }),
        staticBeam(2, 'LAT TG W15', 6, 120, 920, iso, { wedge: { id: 'W15', angle: 15, factor: 0.82, orientation: 270 }, first: jaws }),
      ],
    },
    tpsDifference: [0.008, -0.003],
    misTyped: [1, 1.1],
  };
}

function lungMlc(): DemoPlan {
  const iso: Point = [-32.5, 10, -112];
  return {
    spec: {
      file: 'lung-mlc.dcm',
      patientId: 'NG-1005',
      patientName: 'Demo^Heron',
      label: 'LUNG 3D',
      name: 'MLC-shaped oblique field, 6 MV',
      description: 'Invented demo plan: one oblique field shaped by the MLC',
      doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 60)],
      fractionGroups: fg(30, 60, [{ number: 1, doseGy: 2, point: iso }]),
      beams: [
        staticBeam(1, 'RAO30', 6, 330, 915, iso, {
          mlc: true,
          first: { collimatorDeg: 15, jawsXMm: [-50, 50], jawsYMm: [-40, 40], leaves: ellipseLeaves(45, 35) },
        }),
      ],
    },
    tpsDifference: [-0.012],
  };
}

function prostateVmat(): DemoPlan {
  const iso: Point = [5, -10, -60];
  return {
    spec: {
      file: 'prostate-vmat.dcm',
      patientId: 'NG-1007',
      patientName: 'Demo^Plover',
      label: 'PROST VMAT',
      name: 'Two-arc VMAT, 6 MV',
      description: 'Invented demo plan: two 6 MV arcs of 178 control points with moving leaves, the SSD at every control point',
      doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 60)],
      fractionGroups: [
        {
          number: 1,
          fractions: 20,
          prescriptionGy: 60,
          beams: [
            { number: 1, mu: 300, doseGy: 1.5, specPoint: iso },
            { number: 2, mu: 300, doseGy: 1.5, specPoint: iso },
          ],
        },
      ],
      beams: [arcBeam(1, 'ARC1 CW', iso, 181, 358, 'CW', 0), arcBeam(2, 'ARC2 CC', iso, 179, 358, 'CC', 1.3)],
    },
    tpsDifference: [0.021, 0.014],
  };
}

function chestwallElectron(): DemoPlan {
  // The applicator's isocenter on the skin (SSD 100 cm); the dose prescribed at 1.9 cm, about this field's dmax.
  const iso: Point = [-60, -95, 20];
  const point: Point = [-60, -76, 20];
  const cutout = Array.from(
    { length: 24 },
    (_, i) => [round(30 * Math.cos((2 * Math.PI * i) / 24), 2), round(30 * Math.sin((2 * Math.PI * i) / 24), 2)] as const,
  );
  return {
    spec: {
      file: 'chestwall-electron.dcm',
      patientId: 'NG-1006',
      patientName: 'Demo^Tern',
      label: 'SCAR E9',
      name: 'Electron scar boost, 9 MeV',
      description: 'Invented demo plan: 9 MeV electrons with an applicator and a 6 cm circular cutout, 2 Gy at 1.9 cm depth',
      doseReferences: [coordinatesDoseReference(1, 'prescription point', point, 10)],
      fractionGroups: [{ number: 1, fractions: 5, prescriptionGy: 10, beams: [{ number: 1, mu: 221.8, doseGy: 2, specPoint: point }] }],
      beams: [
        staticBeam(1, 'E9 SCAR', 9, 0, 1000, iso, {
          radiation: 'ELECTRON',
          applicator: { id: 'A10', type: 'ELECTRON_SQUARE', description: '10 x 10 cm electron applicator' },
          cutout,
          first: { jawsXMm: [-100, 100], jawsYMm: [-100, 100] },
        }),
      ],
    },
    tpsDifference: [-0.009],
  };
}

const loaded = loadMachine(fileURLToPath(new URL('../fixtures/demo/beam-data/manifest.json', import.meta.url)));
if (!loaded.ok) throw new Error(loaded.issues.map((i) => i.message).join('; '));
const cts = loadPatientCts(
  [fileURLToPath(new URL('../fixtures/demo/clinic-ct/', import.meta.url))],
  fileURLToPath(new URL('../fixtures/demo/ct/hu-to-density.csv', import.meta.url)),
  DEFAULT_POLICY.ct.bodyThresholdHu,
);
if (!cts.ok) throw new Error(cts.issues.map((i) => i.message).join('; '));
const work = mkdtempSync(join(tmpdir(), 'plumbline-clinic-'));
try {
  for (const demo of [pelvisBox(), brainLaterals(), spineSsd(), breastTangentsMistyped(), lungMlc(), chestwallElectron(), prostateVmat()]) {
    // First pass: the demo machine's dose per MU for each beam at its point.
    const draft = join(work, demo.spec.file);
    writeDataset(draft, planDataset(demo.spec), RT_PLAN_STORAGE);
    const imported = importPlanFile(draft);
    if (!imported.ok) throw new Error(imported.issues.map((i) => i.message).join('; '));
    const ct = demo.withCt ? cts.value.find((c) => c.volume.frameOfReferenceUid === imported.value.plan.frameOfReferenceUid) : undefined;
    if (demo.withCt && !ct) throw new Error(`no demo CT for ${demo.spec.file}: run npm run demo-ct first`);
    const result = checkPlan(
      imported.value.plan,
      { path: draft, sha256: '' },
      { machine: loaded.value.machine, policy: DEFAULT_POLICY, aliases: new Map(), suggestPoint: false, ...(ct ? { ct } : {}) },
    );
    const beams = result.fractionGroups.flatMap((g) => g.beams);
    // Second pass: MU such that the beam dose is the planning system's, which differs by tpsDifference.
    // A planning system that computed on the CT states each beam's depth, equivalent depth and SSD along the ray.
    const spec: PlanSpec = {
      ...demo.spec,
      beams: demo.spec.beams.map((b) => {
        const found = beams.find((x) => x.beamNumber === b.number);
        const ct = found?.status === 'checked' ? found.calculation.ct : undefined;
        if (!ct?.alongRay) return b;
        const depthData = {
          depthMm: round(ct.alongRay.geometricDepthMm, 1),
          equivalentDepthMm: round(ct.alongRay.radiologicalDepthMm, 1),
          ssdMm: round(ct.ssdAlongRayMm, 1),
        };
        return { ...b, depthData };
      }),
      fractionGroups: demo.spec.fractionGroups.map((g) => ({
        ...g,
        beams: g.beams.map((b) => {
          const i = demo.spec.beams.findIndex((x) => x.number === b.number);
          const found = beams.find((x) => x.beamNumber === b.number);
          const dpm = found?.status === 'checked' ? found.calculation.dosePerMuCGy : undefined;
          if (dpm === undefined) return b;
          const mu = ((b.doseGy * 100) / (dpm * (1 + demo.tpsDifference[i]!))) * (demo.misTyped?.[i] ?? 1);
          return { ...b, mu: round(mu, 1) };
        }),
      })),
    };
    writeDataset(join(OUT, spec.file), planDataset(spec), RT_PLAN_STORAGE);
    console.log(`wrote fixtures/demo/clinic/${spec.file}`);
  }
} finally {
  rmSync(work, { recursive: true, force: true });
}
