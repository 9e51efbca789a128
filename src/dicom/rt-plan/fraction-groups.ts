import type { FractionGroup, ReferencedBeam } from '../../model/index.js';
import { type ItemReader, need } from '../item-reader.js';
import { checkUnique } from './beams.js';
import { opt } from './optional.js';

/** Reads the Fraction Group Sequence; each group (a phase, a boost) is kept apart. */
export function readFractionGroups(root: ItemReader, treatmentBeams: ReadonlySet<number>): FractionGroup[] {
  const groups = root.sequence('FractionGroupSequence');
  const out = groups.map((g) => readGroup(g, treatmentBeams));
  checkUnique(
    root,
    'FractionGroupSequence',
    out.map((g) => g.number),
    'fraction group number',
  );
  return out;
}

function readGroup(g: ItemReader, treatmentBeams: ReadonlySet<number>): FractionGroup {
  const number = need(g, 'FractionGroupNumber', g.integer('FractionGroupNumber'), 'the fraction group number') ?? -1;
  const fractions = g.integer('NumberOfFractionsPlanned');
  if (fractions !== undefined && fractions < 0) {
    g.report('error', 'invalid-value', 'NumberOfFractionsPlanned', 'is negative', '>= 0', `${fractions}`);
  }
  need(g, 'NumberOfFractionsPlanned', fractions, 'the number of fractions planned', 'warning');
  const beams = g.sequence('ReferencedBeamSequence').map((rb) => readReferencedBeam(rb, treatmentBeams));
  const declared = g.integer('NumberOfBeams');
  if (declared !== undefined && declared !== beams.length) {
    g.report(
      'error',
      'inconsistent',
      'NumberOfBeams',
      'does not match the Referenced Beam Sequence',
      `${beams.length} (items present)`,
      `${declared}`,
    );
  }
  checkUnique(
    g,
    'ReferencedBeamSequence',
    beams.map((b) => b.beamNumber),
    'referenced beam number',
  );
  return {
    number,
    ...opt('description', g.string('FractionGroupDescription')),
    ...opt('fractionsPlanned', fractions !== undefined && fractions >= 0 ? fractions : undefined),
    ...opt('beamDoseMeaning', g.string('BeamDoseMeaning')),
    doseReferences: g.sequence('ReferencedDoseReferenceSequence').map((r) => ({
      doseReferenceNumber: need(r, 'ReferencedDoseReferenceNumber', r.integer('ReferencedDoseReferenceNumber'), 'a dose reference number') ?? -1,
      ...opt('targetPrescriptionDoseGy', r.number('TargetPrescriptionDose')),
    })),
    beams,
  };
}

function readReferencedBeam(rb: ItemReader, treatmentBeams: ReadonlySet<number>): ReferencedBeam {
  const beamNumber = need(rb, 'ReferencedBeamNumber', rb.integer('ReferencedBeamNumber'), 'the number of a beam in the Beam Sequence') ?? -1;
  const r = rb.within({ beamNumber });
  // A negative or absurd meterset is refused by the reader's plausible range.
  const meterset = r.number('BeamMeterset');
  // Type 2: a setup beam may leave it empty; a treatment beam without it cannot be checked at all.
  if (treatmentBeams.has(beamNumber)) need(r, 'BeamMeterset', meterset, 'the beam meterset (MU)');
  const point = r.tuple('BeamDoseSpecificationPoint', 3);
  return {
    beamNumber,
    ...opt('beamMeterset', meterset),
    ...opt('beamDoseGy', r.number('BeamDose')),
    ...opt('beamDoseSpecificationPointPatientMm', point as [number, number, number] | undefined),
    ...opt('beamDoseType', r.string('BeamDoseType')),
    ...opt('alternateBeamDoseGy', r.number('AlternateBeamDose')),
    ...opt('alternateBeamDoseType', r.string('AlternateBeamDoseType')),
    ...opt('doseReferenceUid', r.string('ReferencedDoseReferenceUID')),
    ...opt('pointDepthMm', r.number('BeamDosePointDepth')),
    ...opt('equivalentDepthMm', r.number('BeamDosePointEquivalentDepth')),
    ...opt('pointSsdMm', r.number('BeamDosePointSSD')),
  };
}
