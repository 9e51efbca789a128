/**
 * pydicom's own sample RT files (Debian python3-pydicom, pydicom/data/test_files), read by the
 * importer and checked value for value against dcmtk's dcmdump reading of the same file.
 */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { importPlanFile } from '../../src/dicom/index.js';
import { runPython } from '../../scripts/lib/find-python.js';
import { comparePlanWithReference } from '../helpers/compare-plan.js';
import { dcmdumpTree } from '../helpers/reference-tree.js';

const samples = runPython('import pydicom, os; print(os.path.join(os.path.dirname(pydicom.__file__), "data", "test_files"))').trim();
const sample = (name: string) => join(samples, name);

describe('pydicom sample rtplan.dcm (source: pydicom test files; reference: dcmtk dcmdump)', () => {
  it('imports to a plan whose every extracted value equals what dcmdump prints', () => {
    const r = importPlanFile(sample('rtplan.dcm'));
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const { checked, mismatches } = comparePlanWithReference(r.value.plan, dcmdumpTree(sample('rtplan.dcm')));
    expect(mismatches).toEqual([]);
    expect(checked).toBeGreaterThan(100);
  });

  it('carries unchanged values forward to control point 1, which holds only its index, weight and dose references', () => {
    // dcmdump shows CP1 with ControlPointIndex, CumulativeMetersetWeight and ReferencedDoseReferenceSequence only.
    const r = importPlanFile(sample('rtplan.dcm'));
    if (!r.ok) throw new Error('not imported');
    const [cp0, cp1] = r.value.plan.beams[0]!.controlPoints;
    expect(cp1!.nominalEnergyMeV).toBe(cp0!.nominalEnergyMeV);
    expect(cp1!.isocenterPatientMm).toEqual(cp0!.isocenterPatientMm);
    expect(cp1!.devices).toEqual(cp0!.devices);
    expect(cp1!.cumulativeMetersetWeight).toBe(1);
  });
});

describe('pydicom sample files that are not RT Plans or are broken', () => {
  it('refuses rtplan_truncated.dcm as truncated, with no plan', () => {
    // dcmdump on the same file: "IsocenterPosition (300a,012c) larger (50) than remaining bytes (29) in file".
    const r = importPlanFile(sample('rtplan_truncated.dcm'));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues.map((i) => i.code)).toEqual(['truncated']);
    expect(r.issues[0]!.message).toMatch(/ends before the data it declares/);
  });

  it('refuses CT_small.dcm as "not an RT Plan" and says it is a CT image', () => {
    const r = importPlanFile(sample('CT_small.dcm'));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues[0]!.code).toBe('not-rt-plan');
    expect(r.issues[0]!.message).toMatch(/not an RT Plan: the file is CT Image Storage/);
  });

  it('recognises rtstruct.dcm, a dataset without a Part-10 header, as an RT Structure Set', () => {
    const r = importPlanFile(sample('rtstruct.dcm'));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issues[0]!.message).toMatch(/RT Structure Set Storage/);
  });
});

describe('the value-by-value comparison itself', () => {
  it('notices a changed meterset and a value that was not carried forward', () => {
    const r = importPlanFile(sample('rtplan.dcm'));
    if (!r.ok) throw new Error('not imported');
    const plan = structuredClone(r.value.plan) as any;
    plan.fractionGroups[0].beams[0].beamMeterset = 116.0;
    plan.beams[0].controlPoints[1].gantryAngleDeg = 5;
    const { mismatches } = comparePlanWithReference(plan, dcmdumpTree(sample('rtplan.dcm')));
    expect(mismatches).toHaveLength(2);
    expect(mismatches.join('\n')).toMatch(/BeamMeterset/);
    expect(mismatches.join('\n')).toMatch(/ControlPointSequence\[1\]\.GantryAngle: absent here/);
  });
});
