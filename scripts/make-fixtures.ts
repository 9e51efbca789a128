/**
 * Writes the demo RT Plans into fixtures/demo/ with dcmjs. Run with `npm run fixtures`; the output is
 * deterministic, so a regenerated fixture differs only where this script changed. All values are
 * invented for the demo scenario (see fixtures/demo/README.md).
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { RT_PLAN_STORAGE, writeDataset } from './lib/dcmjs-writer.js';
import {
  type BeamSpec,
  type ControlPointSpec,
  type PlanSpec,
  MLC_BOUNDARIES_MM,
  MLC_PAIRS,
  coordinatesDoseReference,
  planDataset,
} from './fixtures/plan-parts.js';

const OUT = fileURLToPath(new URL('../fixtures/demo/', import.meta.url));
type Point = readonly [number, number, number];

/** A static beam: two control points, the aperture given once at the first. */
function staticBeam(
  number: number, name: string, energy: number, gantry: number, ssdMm: number, iso: Point,
  extra: Partial<BeamSpec> & { first?: Partial<ControlPointSpec> } = {},
): BeamSpec {
  const { first, ...rest } = extra;
  return {
    number, name,
    controlPoints: [
      { energy, gantry, gantryDirection: 'NONE', isocenter: iso, ssdMm, weight: 0, jawsX: [-50, 50], jawsY: [-50, 50], doseRate: 600, doseCoefficient: 0, ...first },
      { weight: 1, doseCoefficient: 1 },
    ],
    ...rest,
  };
}

/** Leaf positions of an elliptical aperture (semi-axes rx along the leaves, ry across), closed pairs at x0. */
function ellipseLeaves(rx: number, ry: number, x0 = 0): number[] {
  const bank1: number[] = [];
  const bank2: number[] = [];
  for (let k = 0; k < MLC_PAIRS; k++) {
    const yc = (MLC_BOUNDARIES_MM[k]! + MLC_BOUNDARIES_MM[k + 1]!) / 2;
    const half = Math.abs(yc) < ry ? rx * Math.sqrt(1 - (yc / ry) ** 2) : 0;
    bank1.push(round(x0 - half, 1));
    bank2.push(round(x0 + half, 1));
  }
  return [...bank1, ...bank2];
}

function round(x: number, decimals: number): number {
  const f = 10 ** decimals;
  return Math.round(x * f) / f;
}

function fourFieldBox(): PlanSpec {
  const iso: Point = [5, -20, 30];
  const jaws = { jawsX: [-80, 80] as const, jawsY: [-90, 90] as const };
  return {
    file: 'four-field-box.dcm', patientId: 'NG-0001', patientName: 'Demo^Pelvis', label: 'PELVIS 4F', name: 'Pelvis four-field box',
    description: 'Invented demo plan: four-field box, 18 MV, 2 Gy per fraction at the isocenter',
    doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 50)],
    fractionGroups: [{ number: 1, fractions: 25, prescriptionGy: 50, beams: [
      { number: 1, mu: 112.4, doseGy: 0.5, specPoint: iso }, { number: 2, mu: 114.9, doseGy: 0.5, specPoint: iso },
      { number: 3, mu: 121.7, doseGy: 0.5, specPoint: iso }, { number: 4, mu: 121.2, doseGy: 0.5, specPoint: iso }] }],
    beams: [
      staticBeam(1, 'AP', 18, 0, 900, iso, { first: jaws, depthData: { depthMm: 100, equivalentDepthMm: 101.5, ssdMm: 900 } }),
      staticBeam(2, 'PA', 18, 180, 880, iso, { first: jaws }),
      staticBeam(3, 'LLAT', 18, 90, 840, iso, { first: jaws }),
      staticBeam(4, 'RLAT', 18, 270, 845, iso, { first: jaws }),
    ],
  };
}

function mlcConformal(): PlanSpec {
  const iso: Point = [-32.5, 10, -112];
  return {
    file: 'mlc-conformal.dcm', patientId: 'NG-0002', patientName: 'Demo^Lung', label: 'LUNG 3D', name: 'MLC-shaped oblique field',
    description: 'Invented demo plan: one 6 MV oblique field shaped by the MLC to an ellipse',
    doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 60)],
    fractionGroups: [{ number: 1, fractions: 30, prescriptionGy: 60, beams: [{ number: 1, mu: 231.5, doseGy: 2, specPoint: iso }] }],
    beams: [staticBeam(1, 'RAO30', 6, 330, 915, iso, { mlc: true, first: { collimator: 15, jawsX: [-50, 50], jawsY: [-40, 40], leaves: ellipseLeaves(45, 35) } })],
  };
}

function wedgedPair(): PlanSpec {
  const iso: Point = [40, -15, 60];
  return {
    file: 'wedged-pair.dcm', patientId: 'NG-0003', patientName: 'Demo^Parotid', label: 'PAROTID WP', name: 'Wedged pair',
    description: 'Invented demo plan: 6 MV wedged pair at right angles, 45 degree wedges',
    doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 54)],
    fractionGroups: [{ number: 1, fractions: 27, prescriptionGy: 54, beams: [
      { number: 1, mu: 188.3, doseGy: 1, specPoint: iso }, { number: 2, mu: 192.6, doseGy: 1, specPoint: iso }] }],
    beams: [
      staticBeam(1, 'ANT W45', 6, 0, 925, iso, { wedge: { id: 'W45', angle: 45, factor: 0.512, orientation: 90 }, first: { wedgeIn: true, jawsX: [-35, 35], jawsY: [-40, 40] } }),
      staticBeam(2, 'LLAT W45', 6, 90, 930, iso, { wedge: { id: 'W45', angle: 45, factor: 0.512, orientation: 270 }, first: { wedgeIn: true, jawsX: [-35, 35], jawsY: [-40, 40] } }),
    ],
  };
}

function electronField(): PlanSpec {
  const point: Point = [-60, -95, 20];
  const cutout = Array.from({ length: 24 }, (_, i) => {
    const a = (2 * Math.PI * i) / 24;
    return [round(30 * Math.cos(a), 2), round(30 * Math.sin(a), 2)] as const;
  });
  return {
    file: 'electron-applicator.dcm', patientId: 'NG-0004', patientName: 'Demo^Chestwall', label: 'SCAR E9', name: 'Electron boost with cutout',
    description: 'Invented demo plan: 9 MeV electrons, 10 x 10 applicator, 6 cm round cutout, 5 mm bolus, 100 cm SSD',
    doseReferences: [coordinatesDoseReference(1, 'prescription point', point, 10)],
    fractionGroups: [{ number: 1, fractions: 5, prescriptionGy: 10, beams: [{ number: 1, mu: 221.8, doseGy: 2, specPoint: point }] }],
    beams: [staticBeam(1, 'E9 SCAR', 9, 0, 1000, point, {
      radiation: 'ELECTRON', applicator: { id: 'A10', type: 'ELECTRON_SQUARE', description: '10 x 10 cm electron applicator' },
      cutout, bolusRoi: 7, first: { jawsX: [-100, 100], jawsY: [-100, 100] } })],
  };
}

function twoPhase(): PlanSpec {
  const iso: Point = [0, -35, -210];
  const boost: Point = [12, -40, -205];
  const jaws = { jawsX: [-75, 75] as const, jawsY: [-100, 100] as const };
  const boostJaws = { jawsX: [-40, 40] as const, jawsY: [-45, 45] as const };
  return {
    file: 'two-phase.dcm', patientId: 'NG-0005', patientName: 'Demo^Bladder', label: 'BLADDER 2PH', name: 'Phase 1 and boost',
    description: 'Invented demo plan: AP/PA phase of 23 fractions, then an oblique boost of 5',
    doseReferences: [coordinatesDoseReference(1, 'phase 1 isocenter', iso, 46), coordinatesDoseReference(2, 'boost isocenter', boost, 10)],
    fractionGroups: [
      { number: 1, fractions: 23, description: 'phase 1', prescriptionGy: 46, doseReferenceNumber: 1, beams: [
        { number: 1, mu: 119.2, doseGy: 1, specPoint: iso }, { number: 2, mu: 121.4, doseGy: 1, specPoint: iso }] },
      { number: 2, fractions: 5, description: 'boost', prescriptionGy: 10, doseReferenceNumber: 2, beams: [
        { number: 3, mu: 126.6, doseGy: 1, specPoint: boost }, { number: 4, mu: 129.9, doseGy: 1, specPoint: boost }] },
    ],
    beams: [
      staticBeam(1, 'AP', 10, 0, 895, iso, { first: jaws }),
      staticBeam(2, 'PA', 10, 180, 885, iso, { first: jaws }),
      staticBeam(3, 'RAO', 10, 315, 905, boost, { first: boostJaws }),
      staticBeam(4, 'LPO', 10, 135, 900, boost, { first: boostJaws }),
    ],
  };
}

/** A VMAT arc: gantry from start through `span` degrees in `n` control points with moving leaves. */
function arcBeam(number: number, name: string, iso: Point, start: number, span: number, dir: 'CW' | 'CC', phase: number, n = 178): BeamSpec {
  const weights = Array.from({ length: n - 1 }, (_, j) => 1 + 0.4 * Math.sin((2 * Math.PI * j) / (n - 1) + phase));
  const total = weights.reduce((a, b) => a + b, 0);
  let cum = 0;
  const cps: ControlPointSpec[] = [];
  for (let j = 0; j < n; j++) {
    const g = (((start + (dir === 'CW' ? 1 : -1) * (span * j) / (n - 1)) % 360) + 360) % 360;
    const leaves: number[] = [];
    const b1: number[] = [];
    const b2: number[] = [];
    for (let k = 0; k < MLC_PAIRS; k++) {
      const yc = (MLC_BOUNDARIES_MM[k]! + MLC_BOUNDARIES_MM[k + 1]!) / 2;
      const open = Math.abs(yc) < 45;
      const centre = 8 * Math.sin((2 * Math.PI * j) / 60 + yc / 20 + phase);
      const half = open ? 12 + 10 * Math.abs(Math.sin((Math.PI * j) / 45 + yc / 30)) : 0;
      b1.push(round(centre - half, 1));
      b2.push(round(centre + half, 1));
    }
    leaves.push(...b1, ...b2);
    cps.push({
      ...(j === 0 ? { energy: 6, doseRate: 600, isocenter: iso, jawsX: [-45, 45] as const, jawsY: [-50, 50] as const } : {}),
      gantry: round(g, 4),
      gantryDirection: j === n - 1 ? 'NONE' : dir,
      ssdMm: round(900 + 40 * Math.cos(((g - 20) * Math.PI) / 180), 1),
      weight: j === n - 1 ? 1 : round(cum / total, 6),
      leaves,
      doseCoefficient: j === n - 1 ? 1 : round(cum / total, 6),
    });
    if (j < n - 1) cum += weights[j]!;
  }
  return { number, name, dynamic: true, mlc: true, controlPoints: cps };
}

function twoArc(): PlanSpec {
  const iso: Point = [3.5, -12, -48];
  return {
    file: 'two-arc-vmat.dcm', patientId: 'NG-0006', patientName: 'Demo^Prostate', label: 'PROST VMAT', name: 'Two-arc VMAT',
    description: 'Invented demo plan: two full 6 MV arcs of 178 control points each',
    doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 60)],
    fractionGroups: [{ number: 1, fractions: 20, prescriptionGy: 60, beams: [
      { number: 1, mu: 312.7, doseGy: 1.5, specPoint: iso }, { number: 2, mu: 305.1, doseGy: 1.5, specPoint: iso }] }],
    beams: [arcBeam(1, 'ARC1 CW', iso, 181, 358, 'CW', 0), arcBeam(2, 'ARC2 CC', iso, 179, 358, 'CC', 1.3)],
  };
}

const plans = [fourFieldBox(), mlcConformal(), wedgedPair(), electronField(), twoPhase(), twoArc()];
for (const p of plans) {
  writeDataset(join(OUT, p.file), planDataset(p), RT_PLAN_STORAGE);
  console.log(`wrote fixtures/demo/${p.file}`);
}
