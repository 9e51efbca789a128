/**
 * `plumbline depth` and `check --ct` on the demo pelvis patient, whose CT is an analytic phantom
 * (scripts/make-demo-ct.ts: a water box with faces at x = −165 and 170 mm, y = −90 and 130 mm, and a
 * 700 HU bone block from y = 80 to 110 mm), so every depth below is a hand calculation.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { unwrapped } from '../helpers/text.js';
import { DepthDocument } from '../../src/report/depth-report.js';
import { CheckDocument } from '../../src/report/check-json.js';
import { staticBeam, coordinatesDoseReference } from '../../scripts/fixtures/plan-parts.js';
import { planFromSpec, beams as allBeams } from '../helpers/check-run.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const run = (...args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', ...args], { cwd: ROOT, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
const CT = ['--ct', 'fixtures/demo/clinic-ct', '--density', 'demo'];

describe('plumbline depth', () => {
  it('gives the SSDs and depths of the four fields through the phantom', () => {
    const r = run('depth', 'fixtures/demo/clinic/pelvis-box.dcm', ...CT, '--json');
    expect(r.status).toBe(0);
    const doc = DepthDocument.parse(JSON.parse(r.stdout));
    // Isocenter (0, 10, −80): AP surface y = −90, PA y = 130, left x = 170, right x = −165.
    expect(doc.beams.map((b) => Math.round(b.ctSsdAlongAxisMm! * 10) / 10)).toEqual([900, 880, 830, 835]);
    expect(doc.beams.map((b) => Math.round(b.geometricDepthMm! * 10) / 10)).toEqual([100, 120, 170, 165]);
    // PA: 30 mm of bone at 700 HU; the demo table gives 1.16 + (400/700)·0.39 (linear between 300 and 1000 HU).
    expect(doc.beams[1]!.radiologicalDepthMm).toBeCloseTo(120 + 30 * (1.16 + (400 / 700) * 0.39 - 1), 1);
    expect(doc.beams[1]!.nearestInterfaceMm).toBeCloseTo(70, 1);
    expect(doc.beams.every((b) => b.ssdDifferenceMm !== undefined && Math.abs(b.ssdDifferenceMm) < 0.1)).toBe(true);
  });

  it('for an arc, one row per control point: gantry 0, 90 and 180 meet the phantom where the static fields do', () => {
    const iso: [number, number, number] = [0, 10, -80];
    const field = staticBeam(1, 'ARC', 15, 0, 900, iso, { first: { jawsXMm: [-75, 75], jawsYMm: [-90, 90] } });
    const { file } = planFromSpec({
      file: 'pelvis-arc.dcm',
      patientId: 'NG-1001',
      patientName: 'Demo^Quill',
      label: 'PELVIS ARC',
      name: 'half arc',
      description: 'test',
      doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 2)],
      fractionGroups: [{ number: 1, fractions: 1, prescriptionGy: 2, beams: [{ number: 1, mu: 200, doseGy: 2, specPoint: iso }] }],
      beams: [
        {
          ...field,
          dynamic: true,
          controlPoints: [
            { ...field.controlPoints[0]!, gantryDirection: 'CW' },
            { gantryDeg: 90, ssdMm: 830, weight: 0.5 },
            { gantryDeg: 180, ssdMm: 880, weight: 1, gantryDirection: 'NONE' },
          ],
        },
      ],
    });
    const doc = DepthDocument.parse(JSON.parse(run('depth', file, ...CT, '--json').stdout));
    expect(doc.beams.map((b) => b.controlPointIndex)).toEqual([0, 1, 2]);
    expect(doc.beams.map((b) => Math.round(b.ctSsdAlongAxisMm! * 10) / 10)).toEqual([900, 830, 880]);
    expect(doc.beams.map((b) => Math.round(b.geometricDepthMm! * 10) / 10)).toEqual([100, 170, 120]);
    expect(doc.beams.every((b) => Math.abs(b.ssdDifferenceMm!) < 0.1)).toBe(true);
  });

  it('refuses --ct without a density table, and a CT of another patient', () => {
    expect(run('depth', 'fixtures/demo/clinic/pelvis-box.dcm', '--ct', 'fixtures/demo/clinic-ct').stderr).toMatch(/--ct needs --density/);
    const other = run('depth', 'fixtures/demo/clinic/brain-laterals.dcm', ...CT);
    expect(other.status).toBe(2);
    expect(other.stderr).toMatch(/no CT series in the plan's frame of reference/);
  });
});

describe('plumbline check --ct', () => {
  it('corrects the PA beam for the bone (CF < 1), calls it heterogeneous, and the others stay water', () => {
    const doc = CheckDocument.parse(JSON.parse(run('check', 'fixtures/demo/clinic/pelvis-box.dcm', '--beam-data', 'demo', ...CT, '--json').stdout));
    const beams = allBeams(doc.plans[0]!);
    expect(beams[1]!.category).toBe('heterogeneous');
    expect(beams[1]!.calculation!.ct!.correctionFactor).toBeLessThan(0.99);
    for (const b of beams.filter((x) => x.beamNumber !== 2)) expect(b.calculation!.ct!.correctionFactor).toBeCloseTo(1, 9);
    expect(doc.plans[0]!.verdict).toBe('within tolerance');
  });

  it("--heterogeneity batho: the PA beam through the bone by Batho's power law, named in the result; water beams still 1", () => {
    const doc = CheckDocument.parse(
      JSON.parse(run('check', 'fixtures/demo/clinic/pelvis-box.dcm', '--beam-data', 'demo', ...CT, '--heterogeneity', 'batho', '--json').stdout),
    );
    const beams = allBeams(doc.plans[0]!);
    expect(beams[1]!.calculation!.ct!.method).toBe('batho');
    expect(beams[1]!.calculation!.ct!.correctionFactor).toBeLessThan(0.99);
    for (const b of beams.filter((x) => x.beamNumber !== 2)) expect(b.calculation!.ct!.correctionFactor).toBeCloseTo(1, 9);
    expect(run('check', 'fixtures/demo/clinic/pelvis-box.dcm', '--beam-data', 'demo', ...CT, '--heterogeneity', 'modified').stderr).toMatch(
      /--heterogeneity must be tpr-ratio or batho/,
    );
  });

  it('reports an SSD that differs from the CT by more than 5 mm as a finding', () => {
    const iso: [number, number, number] = [0, 10, -80];
    const { file } = planFromSpec({
      file: 'pelvis-wrong-ssd.dcm',
      patientId: 'NG-1001',
      patientName: 'Demo^Quill',
      label: 'PELVIS AP',
      name: 'AP with a wrong SSD',
      description: 'test',
      doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 2)],
      fractionGroups: [{ number: 1, fractions: 1, prescriptionGy: 2, beams: [{ number: 1, mu: 200, doseGy: 2, specPoint: iso }] }],
      beams: [staticBeam(1, 'AP', 15, 0, 910, iso, { first: { jawsXMm: [-75, 75], jawsYMm: [-90, 90] } })],
    });
    const doc = CheckDocument.parse(JSON.parse(run('check', file, '--beam-data', 'demo', ...CT, '--json').stdout));
    const b = allBeams(doc.plans[0]!)[0]!;
    expect(b.calculation!.ct!.ssdDifferenceMm).toBeCloseTo(-10, 1);
    expect(b.verdictReasons).toContainEqual({
      code: 'ct-ssd-differs',
      values: { ctSsdMm: expect.closeTo(900, 1), planSsdMm: 910, differenceMm: expect.closeTo(-10, 1), toleranceMm: 5 },
    });
    expect(run('check', file, '--beam-data', 'demo', ...CT).stdout).toMatch(
      /the SSD from the CT \(90\.0 cm\) differs from the plan's \(91\.0 cm\) by -10\.0 mm/,
    );
    expect(b.verdict).not.toBe('within tolerance');
  });

  it('refuses one plan with one CT of another frame of reference, naming both', () => {
    const r = run('check', 'fixtures/demo/clinic/brain-laterals.dcm', '--beam-data', 'demo', ...CT);
    expect(r.status).toBe(2);
    expect(unwrapped(r.stdout)).toMatch(
      /the CT and the plan are in different frames of reference.*expected the plan's 2\.25\.\d+, found the CT's 2\.25\.\d+/,
    );
  });

  it('in a batch, plans without their own CT are checked without it and say so', () => {
    const r = run('check', 'fixtures/demo/clinic', '--beam-data', 'demo', ...CT);
    expect(r.status).toBe(1);
    // Said once for the run, with how many plans it concerns, not once per plan.
    expect(r.stdout.match(/no CT series in this plan's frame of reference among --ct: checked without CT/g)).toHaveLength(1);
    expect(r.stdout).toMatch(/warning for 6 plans: no CT series in this plan's frame of reference/);
  });
});

describe('plumbline check --dose', () => {
  it("shows the planning system's dose grid at the point beside the totals (PLAN: the course; FRACTION: one fraction)", async () => {
    const { writeRtDose } = await import('../../scripts/fixtures/rt-dose.js');
    const { fixtureUid } = await import('../../scripts/lib/dcmjs-writer.js');
    const { mkdtempSync } = await import('node:fs');
    const { tmpdir } = await import('node:os');
    const { join } = await import('node:path');
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-dose-'));
    const common = {
      planSopInstanceUid: fixtureUid('plan:brain-laterals.dcm'),
      frameOfReferenceUid: fixtureUid('for:NG-1002'),
      columns: 21,
      rows: 21,
      frames: 21,
      spacingMm: 5,
      originMm: [-50, -50, 70] as const,
    };
    // A dose falling linearly along x: at the isocenter (0, 0, 120) it is exactly the stated value.
    writeRtDose(join(dir, 'plan.dcm'), { ...common, name: 'plan', summation: 'PLAN', doseGy: (x) => 60.3 + 0.01 * x });
    writeRtDose(join(dir, 'fraction.dcm'), { ...common, name: 'fraction', summation: 'FRACTION', doseGy: (x) => 2.01 + 0.001 * x });
    const r = run(
      'check',
      'fixtures/demo/clinic/brain-laterals.dcm',
      '--beam-data',
      'demo',
      '--dose',
      join(dir, 'plan.dcm'),
      join(dir, 'fraction.dcm'),
      '--json',
    );
    const doc = CheckDocument.parse(JSON.parse(r.stdout));
    const plan = doc.plans[0]!;
    expect(plan.courseTotals[0]!.doseGridSummation).toBe('PLAN');
    expect(plan.courseTotals[0]!.doseGridCGy).toBeCloseTo(6030, 1);
    expect(plan.fractionGroups[0]!.totals[0]!.doseGridCGy).toBeCloseTo(201, 1);
  });
});
