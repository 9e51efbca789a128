/**
 * The plan as a whole: its identity, setups and dose references, and the cross-references between
 * its sequences (every number it uses names something it defines), refused when they do not hold.
 */
import { describe, expect, it } from 'vitest';
import { importChanged, imported, refused } from '../../helpers/plan-bytes.js';

describe('the RT Plan', () => {
  it('its label, patient, position, prescription point and approval', () => {
    const { plan } = imported((ds) => (ds.PatientSetupSequence[0].PatientPosition = 'FFS'));
    expect(plan).toMatchObject({ label: 'UNIT', patient: { id: 'UNIT-1', name: 'Unit^Test' }, approvalStatus: 'APPROVED', geometry: 'PATIENT' });
    expect(plan.patientSetups[0]).toMatchObject({ number: 1, position: 'FFS' });
    expect(plan.doseReferences[0]).toMatchObject({ number: 1, structureType: 'COORDINATES', pointPatientMm: [0, 0, 0] });
  });
  it('a fraction group naming a beam the Beam Sequence lacks is refused, naming the numbers there are', () => {
    const issues = refused((ds) => (ds.FractionGroupSequence[0].ReferencedBeamSequence[0].ReferencedBeamNumber = '7'));
    expect(issues.find((i) => i.code === 'unknown-reference')).toMatchObject({ beamNumber: 7, expected: '1', found: '7' });
  });
  it('a beam naming a patient setup that is not there is refused', () => {
    const issues = refused((ds) => (ds.BeamSequence[0].ReferencedPatientSetupNumber = '4'));
    expect(issues.find((i) => i.code === 'unknown-reference')).toMatchObject({ path: 'ReferencedPatientSetupNumber', found: '4' });
  });
  it('no RT Plan Label, no plan', () => {
    expect(refused((ds) => delete ds.RTPlanLabel)[0]).toMatchObject({ code: 'missing-attribute', path: 'RTPlanLabel' });
  });
  it('no fraction groups: imported with a warning that no beam has a meterset', () => {
    const r = importChanged((ds) => delete ds.FractionGroupSequence);
    if (!r.ok) throw new Error('refused');
    expect(r.value.plan.fractionGroups).toEqual([]);
    expect(r.warnings?.map((w) => w.path)).toContain('FractionGroupSequence');
  });
});
