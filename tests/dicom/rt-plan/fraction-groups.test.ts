/**
 * The Fraction Group Sequence read (PS3.3 C.8.8.13): each referenced beam's meterset, dose and dose
 * point, counts checked against the items present, and a treatment beam without a meterset refused.
 */
import { describe, expect, it } from 'vitest';
import { staticBeam } from '../../../scripts/fixtures/plan-parts.js';
import { imported, POINT, refused } from '../../helpers/plan-bytes.js';

const group0 = (ds: any) => ds.FractionGroupSequence[0];

describe('fraction groups', () => {
  it("each beam's meterset, dose, dose type and specification point; the fractions and the prescription", () => {
    const g = imported().plan.fractionGroups[0]!;
    expect(g).toMatchObject({ number: 1, fractionsPlanned: 5, beamDoseMeaning: 'FRACTION_LEVEL' });
    expect(g.doseReferences).toEqual([{ doseReferenceNumber: 1, targetPrescriptionDoseGy: 2 }]);
    expect(g.beams[0]).toMatchObject({
      beamNumber: 1,
      beamMeterset: 100,
      beamDoseGy: 2,
      beamDoseType: 'PHYSICAL',
      beamDoseSpecificationPointPatientMm: POINT,
    });
  });
  it('Number of Beams that disagrees with the Referenced Beam Sequence is refused', () => {
    const issues = refused((ds) => (group0(ds).NumberOfBeams = '2'));
    expect(issues[0]).toMatchObject({ code: 'inconsistent', path: 'FractionGroupSequence[0].NumberOfBeams', found: '2' });
  });
  it('a treatment beam with no meterset is refused; a setup beam may leave it empty', () => {
    const issues = refused((ds) => (group0(ds).ReferencedBeamSequence[0].BeamMeterset = ''));
    expect(issues[0]).toMatchObject({ code: 'empty-attribute', beamNumber: 1 });
    const setup = staticBeam(2, 'SETUP', 6, 0, 900, POINT);
    const plan = imported(
      (ds) => {
        ds.BeamSequence[1].TreatmentDeliveryType = 'SETUP';
        group0(ds).ReferencedBeamSequence[1].BeamMeterset = '';
      },
      [staticBeam(1, 'AP', 6, 0, 900, POINT), setup],
    ).plan;
    expect(plan.fractionGroups[0]!.beams[1]!.beamMeterset).toBeUndefined();
  });
  it('a negative number of fractions is refused', () => {
    expect(refused((ds) => (group0(ds).NumberOfFractionsPlanned = '-1')).some((i) => i.path?.endsWith('NumberOfFractionsPlanned'))).toBe(true);
  });
  it('one beam referenced twice in a group is refused', () => {
    const issues = refused(
      (ds) => (group0(ds).ReferencedBeamSequence[1].ReferencedBeamNumber = '1'),
      [staticBeam(1, 'AP', 6, 0, 900, POINT), staticBeam(2, 'PA', 6, 180, 900, POINT)],
    );
    expect(issues.some((i) => i.code === 'duplicate')).toBe(true);
  });
});
