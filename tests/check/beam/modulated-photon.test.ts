/**
 * Modulated beams by the modified Clarkson integration. Check values are identities that follow
 * from the method's definition (a static field written as an "arc" of identical control points must
 * give the static result exactly; a uniform leaf transmission scales the dose linearly) and from
 * geometry (every gantry angle of an arc round a cylinder centred on the isocenter sees the same
 * depth, so the arc gives the static dose at that depth; with a CT of a water cylinder, traced per
 * control point, to within the voxel size).
 */
import { describe, expect, it } from 'vitest';
import { checkPlan, DEFAULT_POLICY } from '../../../src/check/index.js';
import {
  type BeamSpec,
  type ControlPointSpec,
  coordinatesDoseReference,
  ellipseLeaves,
  MLC_PAIRS,
  type PlanSpec,
  staticBeam,
} from '../../../scripts/fixtures/plan-parts.js';
import { phantomCt } from '../../helpers/phantom-ct.js';
import { beams, check, importOrThrow, planFromSpec, type TestBeam } from '../../helpers/check-run.js';
import { demoPlan } from '../../helpers/fixtures.js';
import { DEMO_MANIFEST, beam as dataBeam, machine } from '../../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const iso: [number, number, number] = [0, 0, 0];
const spec = (name: string, b: BeamSpec): PlanSpec => ({
  file: `${name}.dcm`,
  patientId: 'MOD-1',
  patientName: 'Modulated^Test',
  label: name,
  name,
  description: 'test',
  doseReferences: [coordinatesDoseReference(1, 'point', iso, 2)],
  fractionGroups: [{ number: 1, fractions: 1, prescriptionGy: 2, beams: [{ number: 1, mu: 200, doseGy: 2, specPoint: iso }] }],
  beams: [b],
});
const run = (name: string, b: BeamSpec): TestBeam => beams(check(planFromSpec(spec(name, b)).plan, demo))[0]!;

/** The same first control point, repeated n times with the meterset spread evenly (the gantry never moves). */
function asArc(b: BeamSpec, n: number, perControlPoint: (j: number) => Partial<ControlPointSpec> = () => ({})): BeamSpec {
  const first = b.controlPoints[0]!;
  const cps: ControlPointSpec[] = Array.from({ length: n }, (_, j) => ({
    ...(j === 0
      ? first
      : { gantryDeg: first.gantryDeg, jawsXMm: first.jawsXMm, jawsYMm: first.jawsYMm, ...(first.leaves ? { leaves: first.leaves } : {}) }),
    weight: j / (n - 1),
    doseCoefficient: j / (n - 1),
    ...perControlPoint(j),
  }));
  return { ...b, dynamic: true, controlPoints: cps };
}

describe('modulated beams (modified Clarkson integration)', () => {
  it('a static open field written as an arc of identical control points gives the static result exactly', () => {
    const field = staticBeam(1, 'AP', 6, 0, 900, iso, { first: { jawsXMm: [-60, 40], jawsYMm: [-50, 70] } });
    const stat = run('static-open', field);
    const arc = run('arc-open', asArc(field, 12));
    expect(stat.calculation!.factors.map((f) => f.key)).not.toContain('MCI');
    expect(arc.calculation!.factors.map((f) => f.key)).toContain('MCI');
    expect(arc.calculation!.modulated!.segments).toBe(11);
    expect(arc.calculation!.dosePerMuCGy / stat.calculation!.dosePerMuCGy - 1).toBeCloseTo(0, 12);
    expect(arc.category).toBe('modulated');
  });

  it('the same holds for an MLC-shaped field (Clarkson in both) and for an off-axis point', () => {
    const field = staticBeam(1, 'AP', 6, 0, 900, iso, {
      mlc: true,
      first: { jawsXMm: [-60, 60], jawsYMm: [-50, 50], leaves: ellipseLeaves(55, 45, 5) },
    });
    for (const point of [undefined, [15, 0, -10] as [number, number, number]]) {
      const stat = beams(check(planFromSpec(spec('static-mlc', field)).plan, demo, point ? { point } : {}))[0]!;
      const arc = beams(check(planFromSpec(spec('arc-mlc', asArc(field, 5))).plan, demo, point ? { point } : {}))[0]!;
      expect(stat.calculation!.factors.map((f) => f.key)).toContain('SpTPR');
      expect(arc.calculation!.dosePerMuCGy / stat.calculation!.dosePerMuCGy - 1).toBeCloseTo(0, 12);
    }
  });

  it('a segment with every leaf closed adds the leaf transmission times the open field: linear in the fluence', () => {
    const open = staticBeam(1, 'AP', 6, 0, 900, iso, {
      mlc: true,
      first: { jawsXMm: [-50, 50], jawsYMm: [-50, 50], leaves: [...Array(MLC_PAIRS).fill(-100), ...Array(MLC_PAIRS).fill(100)] },
    });
    const stat = run('open-leaves', open);
    const closed = Array(2 * MLC_PAIRS).fill(0);
    // Half the MU through the open field, half with the leaves shut (a sliding window that never opens).
    const b = asArc(open, 4, (j) => (j >= 2 ? { leaves: closed } : {}));
    const r = run('half-closed', {
      ...b,
      controlPoints: b.controlPoints.map((c, j) => ({ ...c, weight: [0, 0.5, 0.5, 1][j]!, doseCoefficient: [0, 0.5, 0.5, 1][j]! })),
    });
    const t = dataBeam(demo, '6X').mlcTransmission!;
    // The closed segment's Clarkson integral is t × the open field's by Clarkson, which agrees with the equivalent square within 0.5 % (BJR 52:398).
    const expected = 0.5 * stat.calculation!.dosePerMuCGy * (1 + t);
    expect(Math.abs(r.calculation!.dosePerMuCGy / expected - 1)).toBeLessThan(0.005 * t);
    expect(r.calculation!.modulated!.pointCoveredMuPercent).toBeCloseTo(50, 9);
  });

  it("an arc round a water cylinder centred on the isocenter gives the static dose at the cylinder's depth", () => {
    // Radius 100 mm: at every gantry angle the SSD is 900 mm and the isocenter 10 cm deep.
    const field = staticBeam(1, 'ARC', 6, 0, 900, iso, { first: { jawsXMm: [-50, 50], jawsYMm: [-50, 50] } });
    const stat = run('cylinder-static', field);
    const n = 91;
    const arcCps: ControlPointSpec[] = Array.from({ length: n }, (_, j) => ({
      ...(j === 0 ? field.controlPoints[0]! : {}),
      gantryDeg: (181 + 2 * j) % 360,
      gantryDirection: j === n - 1 ? 'NONE' : 'CW',
      ssdMm: 900,
      weight: j / (n - 1),
      doseCoefficient: j / (n - 1),
    }));
    const arc = run('cylinder-arc', { ...field, dynamic: true, controlPoints: arcCps });
    expect(arc.calculation!.modulated!.depthRangeCm[0]).toBeCloseTo(10, 9);
    expect(arc.calculation!.modulated!.depthRangeCm[1]).toBeCloseTo(10, 9);
    expect(arc.calculation!.dosePerMuCGy / stat.calculation!.dosePerMuCGy - 1).toBeCloseTo(0, 12);
  });

  it('with the CT of a water cylinder (radius 100 mm, 2 mm voxels) traced per control point, the arc gives the static dose at 10 cm within 0.5 %', () => {
    const field = staticBeam(1, 'ARC', 6, 0, 900, iso, { first: { jawsXMm: [-50, 50], jawsYMm: [-50, 50] } });
    const stat = run('cylinder-static-ct', field);
    const n = 37;
    const cps: ControlPointSpec[] = Array.from({ length: n }, (_, j) => ({
      ...(j === 0 ? { ...field.controlPoints[0]!, ssdMm: undefined } : {}),
      gantryDeg: (181 + 10 * j) % 360,
      gantryDirection: j === n - 1 ? 'NONE' : 'CW',
      weight: j / (n - 1),
      doseCoefficient: j / (n - 1),
    }));
    const { plan } = planFromSpec(spec('cylinder-arc-ct', { ...field, dynamic: true, controlPoints: cps }));
    // Voxel centres at odd millimetres, so the cylinder's surface falls between them within 1 mm.
    const ct = phantomCt(
      {
        name: 'cyl',
        columns: 128,
        rows: 128,
        slices: 40,
        spacingMm: [2, 2, 2],
        originMm: [-127, -127, -39],
        frameOfReferenceUid: plan.frameOfReferenceUid!,
        hu: (x, y) => (x * x + y * y <= 100 * 100 ? 0 : -1000),
      },
      -400,
    );
    const r = beams(
      checkPlan(plan, { path: 'arc.dcm', sha256: '' }, { machine: demo, policy: DEFAULT_POLICY, aliases: new Map(), suggestPoint: false, ct }),
    )[0]!;
    expect(r.status).toBe('checked');
    const m = r.calculation!.modulated!;
    expect(m.depthSource).toBe('ct');
    expect(m.depthRangeCm[0]).toBeGreaterThan(9.85);
    expect(m.depthRangeCm[1]).toBeLessThan(10.15);
    expect(Math.abs(r.calculation!.dosePerMuCGy / stat.calculation!.dosePerMuCGy - 1)).toBeLessThan(0.005);
  });

  it('an arc without an SSD at its control points and without the CT is not checked, naming the control points', () => {
    const field = staticBeam(1, 'ARC', 6, 0, 900, iso, { first: { jawsXMm: [-50, 50], jawsYMm: [-50, 50] } });
    const cps: ControlPointSpec[] = [field.controlPoints[0]!, { gantryDeg: 10, weight: 0.5 }, { gantryDeg: 20, weight: 1 }];
    const r = run('arc-no-ssd', {
      ...field,
      dynamic: true,
      controlPoints: cps.map((c, j) => ({ ...c, ...(j ? { gantryDirection: 'CW' as const } : {}) })),
    });
    expect(r.status).toBe('not checked');
    expect(r.reason).toEqual({ code: 'segment-no-ssd', values: { controlPoint: 1 } });
  });

  it('the two-arc VMAT fixture (2 × 178 control points) is checked with a dose, in the modulated category', () => {
    const r = check(importOrThrow(demoPlan('two-arc-vmat.dcm')), demo, { aliases: { NG_LINAC1: demo.name } });
    for (const b of beams(r)) {
      expect(b.status).toBe('checked');
      expect(b.calculation!.modulated!.segments).toBe(177);
      expect(b.category).toBe('modulated');
      expect(b.calculation!.independentDoseCGy).toBeGreaterThan(0);
    }
  });
});

describe('the audit of a modulated sum', () => {
  it("gives every segment's row, and the rows add up to the beam: MU shares to 1, doses to its independent dose", () => {
    const r = check(importOrThrow(demoPlan('two-arc-vmat.dcm')), demo, { aliases: { NG_LINAC1: demo.name } });
    for (const b of beams(r)) {
      if (b.status !== 'checked') throw new Error('not checked');
      const rows = b.calculation.modulated!.segmentRows!;
      expect(rows).toHaveLength(177);
      expect(rows.reduce((s, x) => s + x.muShare, 0)).toBeCloseTo(1, 12);
      expect(rows.reduce((s, x) => s + x.doseCGy, 0) / b.calculation.independentDoseCGy).toBeCloseTo(1, 12);
      // Each row: the dose per MU for its MU; the primary at an open point is Sp(0)·TPR(d, 0), the rest is scatter.
      for (const x of rows) {
        expect(x.doseCGy).toBeCloseTo(b.plannedMu! * x.muShare * x.dosePerMuCGy, 9);
        if (x.scatterSpTpr !== undefined) expect(x.scatterSpTpr).toBeLessThan(x.spTpr);
      }
      expect(new Set(rows.map((x) => x.gantryDeg)).size).toBeGreaterThan(100);
    }
  });
});

describe('closed leaves in an arc', () => {
  const arc = importOrThrow(demoPlan('two-arc-vmat.dcm'));
  const closeLeaves = (every: (index: number) => boolean) => ({
    ...arc,
    beams: arc.beams.map((b) => ({
      ...b,
      controlPoints: b.controlPoints.map((cp) => ({
        ...cp,
        devices: cp.devices.map((d) => (d.type === 'MLCX' && every(cp.index) ? { ...d, positionsMm: d.positionsMm.map(() => 0) } : d)),
      })),
    })),
  });

  it('all leaves closed at every control point: not checked, the beam has no field (never a crash on an empty aperture)', () => {
    const r = check(
      closeLeaves(() => true),
      demo,
    );
    expect(beams(r).map((b) => (b.status === 'checked' ? 'checked' : b.reason!.code))).toEqual(['aperture-closed', 'aperture-closed']);
    expect(r.verdict).toBe('not verified');
  });

  it('closed at every other control point: checked, the edge distance taken over the open segments only', () => {
    const b = beams(
      check(
        closeLeaves((i) => i % 2 === 0),
        demo,
      ),
    )[0]!;
    if (b.status !== 'checked') throw new Error('not checked');
    expect(Number.isFinite(b.fitness.edgeDistanceCm)).toBe(true);
  });
});
