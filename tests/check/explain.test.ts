/**
 * Explaining a deviation: plans with one cause planted each, the planted effect computed here by the
 * formalism's own relations (AAPM TG-71: the dose at depth in an SAD setup scales as TPR(d, rd); the
 * TPR-ratio heterogeneity correction CF = TPR(d_eff)/TPR(d)). Each planted cause must rank first
 * with a contribution within 20 % of the planted effect; a plan with nothing planted explains nothing.
 */
import { describe, expect, it } from 'vitest';
import { type BeamSpec, coordinatesDoseReference, MLC_BOUNDARIES_MM, MLC_PAIRS, staticBeam } from '../../scripts/fixtures/plan-parts.js';
import { checkPlan, DEFAULT_POLICY, type PatientCt } from '../../src/check/index.js';
import type { CheckedBeam, DoseGrid, PhotonBeamModel, Plan } from '../../src/model/index.js';
import { pddAt, projectFieldCm, tprAt } from '../../src/physics/index.js';
import { beams, planFromSpec, oneBeamPlan } from '../helpers/check-run.js';
import { DEMO_MANIFEST, beam as dataBeam, machine } from '../helpers/machines.js';
import { phantomCt } from '../helpers/phantom-ct.js';

const demo = machine(DEMO_MANIFEST);
const x6 = dataBeam(demo, '6X') as PhotonBeamModel;
const iso: [number, number, number] = [0, 0, 0];
/** TPR of the 10 × 10 field (at the isocenter plane) at depth d, the point at the isocenter (SAD 100). */
const tpr = (d: number) => tprAt(x6, d, projectFieldCm(10, 100, 100), []);

type Planted = { mu?: number[]; doseGy: number[]; depthData?: BeamSpec['depthData'] };
type Extra = {
  ct?: PatientCt;
  explainAll?: boolean;
  gantries?: number[];
  ssdMm?: number;
  grids?: (p: Plan) => DoseGrid[];
  jawsXMm?: [number, number];
  machine?: typeof demo;
  point?: [number, number, number];
};
function run(name: string, planted: Planted, extra: Extra = {}) {
  const point = extra.point ?? iso;
  const gantries = extra.gantries ?? [0];
  const { plan } = planFromSpec({
    file: `${name}.dcm`,
    patientId: 'WHY-1',
    patientName: 'Why^Differ',
    label: name,
    name,
    description: 'test',
    doseReferences: [coordinatesDoseReference(1, 'point', point, 2)],
    fractionGroups: [
      {
        number: 1,
        fractions: 1,
        prescriptionGy: 2,
        beams: gantries.map((_, k) => ({ number: k + 1, mu: planted.mu?.[k] ?? 100, doseGy: planted.doseGy[k]!, specPoint: point })),
      },
    ],
    beams: gantries.map((g, k) =>
      staticBeam(k + 1, `G${g}`, 6, g, extra.ssdMm ?? 900, iso, {
        first: { jawsXMm: extra.jawsXMm ?? [-50, 50], jawsYMm: [-50, 50] },
        ...(k === 0 && planted.depthData ? { depthData: planted.depthData } : {}),
      }),
    ),
  });
  const r = checkPlan(
    plan,
    { path: `${name}.dcm`, sha256: '' },
    {
      machine: extra.machine ?? demo,
      policy: DEFAULT_POLICY,
      aliases: new Map(),
      suggestPoint: false,
      ...(extra.ct ? { ct: extra.ct } : {}),
      ...(extra.grids ? { doseGrids: extra.grids(plan) } : {}),
      explainAll: extra.explainAll ?? false,
    },
  );
  return { plan, check: r, beams: beams(r) as CheckedBeam[] };
}
/** A 2 × 2 × 2 RT Dose grid of the plan, 20 mm apart around the isocenter. */
function cubeGrid(plan: Plan, doseGy: Float32Array, o: Pick<DoseGrid, 'summationType'> & Partial<DoseGrid>): DoseGrid {
  return {
    file: 'dose.dcm',
    frameOfReferenceUid: plan.frameOfReferenceUid!,
    referencedPlanUid: plan.sopInstanceUid,
    units: 'GY',
    type: 'PHYSICAL',
    columns: 2,
    rows: 2,
    originMm: [-10, -10, -10],
    rowDirection: [1, 0, 0],
    columnDirection: [0, 1, 0],
    normal: [0, 0, 1],
    columnSpacingMm: 20,
    rowSpacingMm: 20,
    frameOffsetsMm: [0, 20],
    doseGy,
    ...o,
  };
}

/** Eleven control points at gantry 0 (ten equal segments), jaws X ±50 mm and Y as given, each control point's leaves as given. */
function stillArc(name: string, jawsYMm: readonly [number, number], leavesAt: (j: number) => number[]): BeamSpec {
  const base = staticBeam(1, name, 6, 0, 900, iso, { mlc: true, first: { jawsXMm: [-50, 50], jawsYMm } });
  return {
    ...base,
    dynamic: true,
    controlPoints: Array.from({ length: 11 }, (_, j) => ({
      ...(j === 0 ? base.controlPoints[0]! : { gantryDeg: 0, jawsXMm: [-50, 50] as const, jawsYMm }),
      leaves: leavesAt(j),
      weight: j / 10,
      doseCoefficient: j / 10,
    })),
  };
}

/** The demo machine with its 6X beam data edited. */
const with6X = (edit: Partial<PhotonBeamModel>) => ({ ...demo, beams: demo.beams.map((x) => (x.id === '6X' ? { ...x, ...edit } : x)) });

/** A one-beam plan of `arc` at the isocenter, 100 MU, the planning system's dose as given, checked and explained. */
function checkedArc(name: string, arc: BeamSpec, doseGy: number, m = demo): CheckedBeam {
  return beams(
    checkPlan(
      oneBeamPlan(name, arc, iso, { mu: 100, doseGy, patientId: name.toUpperCase() }),
      { path: `${name}.dcm`, sha256: '' },
      {
        machine: m,
        policy: DEFAULT_POLICY,
        aliases: new Map(),
        suggestPoint: false,
        explainAll: true,
      },
    ),
  )[0] as CheckedBeam;
}

/** Our dose (cGy) for 100 MU of a 10 × 10 AP beam at 10 cm, SAD setup: from a first run with the planning system agreeing exactly. */
/** A 256 × 256 × 32 mm CT of 4 mm voxels around the isocenter, HU by position, in the plan's frame (body from −400 HU). */
const slabCt = (name: string, frameOfReferenceUid: string, hu: (x: number, y: number, z: number) => number) =>
  phantomCt({ name, columns: 64, rows: 64, slices: 8, spacingMm: [4, 4, 4], originMm: [-126, -126, -14], frameOfReferenceUid, hu }, -400);
const ours = () => run('ours', { doseGy: [1] }).beams[0]!.calculation.independentDoseCGy;

describe('explaining a deviation', () => {
  it('a planning-system depth 1 cm deeper than ours: the depth ranks first, TPR(10)/TPR(11) − 1', () => {
    const planted = tpr(10) / tpr(11) - 1;
    const b = run('why-depth', { doseGy: [(ours() / 100) * (1 / (1 + planted))], depthData: { depthMm: 110, equivalentDepthMm: 110, ssdMm: 890 } })
      .beams[0]!;
    const first = b.explanation!.causes[0]!;
    expect(first.code).toBe('depth');
    expect(Math.abs(first.contributionPercent / (100 * planted) - 1)).toBeLessThan(0.2);
  });
  it('a heterogeneity-corrected planning-system dose (equivalent depth 8 cm at 10 cm: a lung slab) against ours without the CT', () => {
    const planted = tpr(10) / tpr(8) - 1; // ours homogeneous over theirs corrected by TPR(8)/TPR(10)
    const b = run(
      'why-lung',
      { doseGy: [(ours() / 100) * (1 / (1 + planted))], depthData: { depthMm: 100, equivalentDepthMm: 80, ssdMm: 900 } },
      { explainAll: true },
    ).beams[0]!;
    const first = b.explanation!.causes[0]!;
    expect(first.code).toBe('heterogeneity');
    expect(Math.abs(first.contributionPercent / (100 * planted) - 1)).toBeLessThan(0.2);
  });
  it('an MU typed 1.1 times too high, the other beams agreeing: "MU as typed?" first, +10 %', () => {
    const each = ours() / 100;
    const { beams: bs } = run('why-mu', { mu: [110, 100, 100], doseGy: [each, each * 0.999, each * 1.001] }, { gantries: [0, 0, 0] });
    const first = bs[0]!.explanation!.causes[0]!;
    expect(first.code).toBe('mu-as-typed');
    expect(Math.abs(first.contributionPercent / 10 - 1)).toBeLessThan(0.2);
  });
  it("the CT's SSD 1 cm shorter than the plan's: the point 1 cm deeper by the plan, TPR(10)/TPR(11) − 1", () => {
    // A water box whose surface lies 110 mm above the isocenter (the CT's SSD 890 mm) under a plan that says 900 mm.
    const { plan } = run('why-ssd-frame', { doseGy: [1] });
    const ct = slabCt('why-ssd', plan.frameOfReferenceUid!, (_x, y) => (y >= -110 ? 0 : -1000));
    const withCt = run('why-ssd-ours', { doseGy: [1] }, { ct }).beams[0]!.calculation.independentDoseCGy;
    const planted = tpr(11) / tpr(10) - 1;
    const b = run('why-ssd', { doseGy: [(withCt / 100) * (1 / (1 + planted))] }, { ct, explainAll: true }).beams[0]!;
    const first = b.explanation!.causes[0]!;
    expect(first.code).toBe('ssd-ct-vs-plan');
    expect(Math.abs(first.contributionPercent / (100 * planted) - 1)).toBeLessThan(0.2);
  });
  it("a point in a steep gradient of the planning system's RT Dose (2.5 %/mm along x): the gradient ranks first, as a possible cause", () => {
    // A per-beam grid 1 Gy at the point rising 2.5 % per mm along x: a 2 mm shift changes it by 5 % (by hand).
    const grid = (plan: Plan): DoseGrid => {
      const xs = [-10, 10];
      const doseGy = new Float32Array(8);
      for (let k = 0; k < 2; k++) for (let j = 0; j < 2; j++) for (let i = 0; i < 2; i++) doseGy[(k * 2 + j) * 2 + i] = 1 + 0.025 * xs[i]!;
      return cubeGrid(plan, doseGy, { summationType: 'BEAM', referencedBeamNumber: 1 });
    };
    const planted = 0.05; // the planning system's dose 5 % below ours, as a 2 mm shift in this gradient gives
    const b = run('why-gradient', { doseGy: [(ours() / 100) * (1 - planted)] }, { grids: (p) => [grid(p)] }).beams[0]!;
    const first = b.explanation!.causes[0]!;
    expect(first.code).toBe('gradient');
    expect(first.confidence).toBe('possible');
    expect(first.evidence.percentPerMm).toBeCloseTo(2.5, 6);
    expect(Math.abs(first.contributionPercent / (100 * (1 / (1 - planted) - 1)) - 1)).toBeLessThan(0.2);
  });
  it('a VMAT point under the leaves for 60 % of the MU, the planning system modelling a leaf transmission 20 % higher: the leaves rank first', () => {
    // Ten segments at gantry 0: the first six with the leaf pairs within ±10 mm of the point closed at x = +30 mm (the point
    // under a leaf), the last four open. The planted effect is the real one: the check run with the transmission 20 % higher.
    const leavesFor = (closed: boolean) => {
      const a = Array.from({ length: MLC_PAIRS }, (_, i) => (closed && Math.abs(MLC_BOUNDARIES_MM[i]! + 2.5) <= 10 ? 30 : -50));
      const bb = Array.from({ length: MLC_PAIRS }, (_, i) => (closed && Math.abs(MLC_BOUNDARIES_MM[i]! + 2.5) <= 10 ? 30 : 50));
      return [...a, ...bb];
    };
    const arc = stillArc('ARC', [-50, 50], (j) => leavesFor(j <= 6));
    const higherT = with6X({ mlcTransmission: 1.2 * (x6.mlcTransmission ?? 0) });
    const at = (doseGy: number, m = demo) => checkedArc('why-leaves', arc, doseGy, m);
    const theirs = at(1, higherT).calculation.independentDoseCGy;
    const b = at(theirs / 100);
    expect(b.calculation.modulated!.pointCoveredMuPercent).toBeCloseTo(60, 6);
    const planted = b.calculation.doseDeviationPercent!;
    const first = b.explanation!.causes[0]!;
    expect(first.code).toBe('leaf-transmission');
    expect(Math.abs(first.contributionPercent / planted - 1)).toBeLessThan(0.2);
  });
  it('a plan with nothing planted explains nothing spurious (no cause above 0.5 %)', () => {
    const each = ours() / 100;
    const { beams: bs } = run('why-none', { doseGy: [each, each] }, { gantries: [0, 180], explainAll: true });
    for (const b of bs) expect(b.explanation!.causes.every((c) => Math.abs(c.contributionPercent) <= 0.5)).toBe(true);
  });
  it('a point 3 mm inside a field edge, no RT Dose: the field edge ranks first, its slope from a blurred edge', () => {
    // A 10 × 10 field, the point 47 mm off axis in the isocenter plane (3 mm inside the edge). The edge as a step blurred by
    // a Gaussian whose 80–20 % width is 6 mm: σ = 6/1.683 = 3.565 mm; 2 mm toward the edge the dose falls by
    // Φ(1/3.565)/Φ(3/3.565) − 1 = Φ(0.28)/Φ(0.84) − 1 = 0.6103/0.7995 − 1 = −23.7 % (standard normal table values).
    const point: [number, number, number] = [47, 0, 0];
    const mine = run('why-edge-ours', { doseGy: [1] }, { point }).beams[0]!.calculation.independentDoseCGy;
    const planted = 0.1; // the planning system's dose 10 % below ours, as one modelling the penumbra would be
    const b = run('why-edge', { doseGy: [(mine / 100) * (1 - planted)] }, { point }).beams[0]!;
    expect(b.fitness.edgeDistanceCm).toBeCloseTo(0.3, 6);
    const first = b.explanation!.causes[0]!;
    expect(first.code).toBe('field-edge');
    expect(first.confidence).toBe('possible');
    expect(first.evidence.edgeChangeFor2MmPercent as number).toBeCloseTo(23.7, 0);
    expect(Math.abs(first.contributionPercent / (100 * (1 / (1 - planted) - 1)) - 1)).toBeLessThan(0.2);
  });
  it('a narrow sliding window whose planning system puts the leaf ends 0.5 mm wider: the leaf ends rank first', () => {
    // Eleven identical control points, the leaves open 10 mm around the point (the demo gap 1.5 mm widens it to 11.5 mm): every
    // MU through an opening under 2 cm. The planted effect is the real one: the check run with the leaf-end offset 0.5 mm wider
    // (with the point open throughout, only the output and scatter of the wider opening: small, but above noise).
    const leaves = [...Array.from({ length: MLC_PAIRS }, () => -5), ...Array.from({ length: MLC_PAIRS }, () => 5)];
    const arc = stillArc('WINDOW', [-20, 20], () => leaves);
    const wider = with6X({ dosimetricLeafGapMm: (x6.dosimetricLeafGapMm ?? 0) + 0.5 });
    const at = (doseGy: number, m = demo) => checkedArc('why-leaf-ends', arc, doseGy, m);
    const theirs = at(1, wider).calculation.independentDoseCGy;
    const b = at(theirs / 100);
    const planted = b.calculation.doseDeviationPercent!;
    expect(Math.abs(planted)).toBeGreaterThan(0.2);
    const first = b.explanation!.causes[0]!;
    expect(first.code).toBe('leaf-end-offset');
    expect(first.evidence.narrowMuPercent).toBeCloseTo(100, 6);
    expect(Math.abs(first.contributionPercent / planted - 1)).toBeLessThan(0.2);
  });
  it('an extended SSD (120 cm) whose planning system carried the PDD by the Mayneord F factor: the extended SSD ranks first', () => {
    // The point 10 cm deep under an SSD of 120 cm (gantry 0, surface 200 mm beyond the isocenter). Mayneord's F factor from the
    // table's SSD f0 to f at depth d, normalised at d0: F = ((f + d0)/(f0 + d0))² · ((f0 + d)/(f + d))²; the surface field
    // 10 cm × 120/100 = 12 cm.
    const point: [number, number, number] = [0, 300, 0];
    const [f0, f, d, d0, r] = [x6.pdd!.ssdCm, 120, 10, x6.calibration.d0Cm, 12];
    const F = ((f + d0) / (f0 + d0)) ** 2 * ((f0 + d) / (f + d)) ** 2;
    const planted = (pddAt(x6, d, r, f0, []) * F) / pddAt(x6, d, r, f, []) - 1;
    const mine = run('why-ssd120-ours', { doseGy: [1] }, { point, ssdMm: 1200 }).beams[0]!;
    expect(mine.calculation.ssdCm).toBeCloseTo(120, 6);
    expect(mine.calculation.depthCm).toBeCloseTo(10, 6);
    const b = run('why-ssd120', { doseGy: [(mine.calculation.independentDoseCGy / 100) * (1 + planted)] }, { point, ssdMm: 1200, explainAll: true })
      .beams[0]!;
    const first = b.explanation!.causes[0]!;
    expect(first.code).toBe('extended-ssd');
    expect(first.evidence.mayneordAgainstTprPercent as number).toBeCloseTo(100 * planted, 6);
    expect(Math.abs(first.contributionPercent / b.calculation.doseDeviationPercent! - 1)).toBeLessThan(0.2);
  });
  it('names, without a share, the machine alias the plan was matched through when the deviation stays unexplained', () => {
    const other = { ...demo, name: 'OTHER_LINAC', aliases: ['OTHER_LINAC', 'NG_LINAC1'] };
    const mine = run('why-alias-ours', { doseGy: [1] }, { machine: other }).beams[0]!.calculation.independentDoseCGy;
    const b = run('why-alias', { doseGy: [(mine / 100) * 0.9] }, { machine: other }).beams[0]!;
    const alias = b.explanation!.causes.find((c) => c.code === 'machine-alias')!;
    expect(alias.estimated).toBe(false);
    expect(alias.contributionPercent).toBe(0);
    expect(alias.evidence).toMatchObject({ planMachine: 'NG_LINAC1', beamData: 'OTHER_LINAC' });
    expect(b.explanation!.unexplained).toBe(true);
    // Matched by its own name: no alias named.
    const same = run('why-no-alias', { doseGy: [(ours() / 100) * 0.9] }).beams[0]!;
    expect(same.explanation!.causes.some((c) => c.code === 'machine-alias')).toBe(false);
  });
  it('a plan total beyond tolerance: its causes from its beams, weighed by their share of the point dose', () => {
    // Two equal AP beams; the first's planning system states a depth 2 cm deeper (its dose TPR(12)/TPR(10) of ours), the second
    // agrees. The total's deviation is the first's weighed by its share of the planning system's dose: p·w1 with
    // w1 = (1/(1+p))/(1/(1+p) + 1), p = TPR(10)/TPR(12) − 1.
    const each = ours() / 100;
    const p = tpr(10) / tpr(12) - 1;
    const { check, beams: bs } = run(
      'why-total',
      { doseGy: [each / (1 + p), each], depthData: { depthMm: 120, equivalentDepthMm: 120, ssdMm: 880 } },
      { gantries: [0, 0] },
    );
    const total = check.fractionGroups[0]!.totals[0]!;
    const w1 = 1 / (1 + p) / (1 / (1 + p) + 1);
    expect(total.deviationPercent! / (100 * p * w1)).toBeCloseTo(1, 6);
    const first = total.explanation!.causes[0]!;
    expect(first.code).toBe('depth');
    expect(first.beams).toEqual([1]);
    expect(Math.abs(first.contributionPercent / total.deviationPercent! - 1)).toBeLessThan(0.2);
    // The second beam, within tolerance, keeps no explanation of its own; the course total (one fraction) is explained too.
    expect(bs[1]!.verdict).toBe('within tolerance');
    expect(bs[1]!.explanation).toBeUndefined();
    expect(check.courseTotals[0]!.explanation!.causes[0]!.code).toBe('depth');
  });
  it('a lung slab corrected by us through the CT, the planning system stating in its RT Dose that it did not correct (WATER)', () => {
    // Water from 10 cm above the isocenter, lung (−750 HU) from 6 to 2 cm above it. The planted effect: the TPR-ratio correction
    // CF = TPR(d_eff)/TPR(d) (AAPM TG-71's heterogeneity correction by effective depth), d and d_eff as traced through the CT.
    const { plan } = run('why-lung-frame', { doseGy: [1] });
    const ct = slabCt('why-lung', plan.frameOfReferenceUid!, (_x, y) => (y < -100 ? -1000 : y >= -60 && y < -20 ? -750 : 0));
    const water = (p: Plan): DoseGrid =>
      cubeGrid(p, new Float32Array(8).fill(1), { summationType: 'PLAN', tissueHeterogeneityCorrection: ['WATER'] });
    const mine = run('why-lung-ours', { doseGy: [1] }, { ct, grids: (p) => [water(p)] }).beams[0]!;
    const t = mine.calculation.ct!;
    const planted = tpr(t.radiologicalDepthMm / 10) / tpr(t.geometricDepthMm / 10) - 1;
    expect(planted).toBeGreaterThan(0.03);
    // The planning system's dose: ours without the correction.
    const b = run('why-lung-stated', { doseGy: [t.homogeneousDoseCGy / 100] }, { ct, grids: (p) => [water(p)], explainAll: true }).beams[0]!;
    const first = b.explanation!.causes[0]!;
    expect(first.code).toBe('heterogeneity');
    expect(first.confidence).toBe('measured');
    expect(Math.abs(first.contributionPercent / (100 * planted) - 1)).toBeLessThan(0.2);
  });
});
