import type { DataSet } from 'dicom-parser';
import { Plan, PATIENT_POSITIONS, type Beam, type DoseReference, type Issue, type PatientSetup, type Result } from '../../model/index.js';
import { SOP_CLASS_NAMES } from '../dictionary.js';
import { ItemReader, need, oneOf } from '../item-reader.js';
import { checkUnique, readBeam } from './beams.js';
import { readFractionGroups } from './fraction-groups.js';
import { opt } from './optional.js';

export const RT_PLAN_STORAGE = '1.2.840.10008.5.1.4.1.1.481.5';

/**
 * Maps a parsed RT Plan dataset to the validated, readonly `Plan`. Any error-level issue refuses the
 * whole plan: nothing half-read passes as a plan. Warnings travel with the result.
 */
export function readRtPlan(ds: DataSet, file: string): Result<Plan> {
  const issues: Issue[] = [];
  const charset = ds.string('x00080005') ?? '';
  // ISO_IR 192 is UTF-8; the default repertoire and ISO_IR 100 decode as Latin-1.
  const root = new ItemReader(ds, { file, path: '' }, issues, /ISO_IR 192/.test(charset) ? 'utf8' : 'latin1');

  const sopClass = root.string('SOPClassUID') ?? root.string('MediaStorageSOPClassUID');
  if (sopClass !== RT_PLAN_STORAGE) {
    const what = sopClass
      ? `${SOP_CLASS_NAMES[sopClass] ?? 'an unknown SOP class'} (${sopClass})`
      : `a dataset without a SOP Class UID${root.string('Modality') ? ` (modality ${root.string('Modality')})` : ''}`;
    return {
      ok: false,
      issues: [
        {
          severity: 'error',
          code: 'not-rt-plan',
          file,
          path: 'SOPClassUID',
          message: `not an RT Plan: the file is ${what}`,
          expected: `RT Plan Storage (${RT_PLAN_STORAGE})`,
          found: sopClass ?? 'none',
        },
      ],
    };
  }
  const sopInstanceUid = need(root, 'SOPInstanceUID', root.string('SOPInstanceUID'), 'the SOP Instance UID');
  const label = need(root, 'RTPlanLabel', root.string('RTPlanLabel'), 'the RT Plan Label');
  need(root, 'FrameOfReferenceUID', root.string('FrameOfReferenceUID'), 'the frame of reference UID', 'warning');
  const geometry = oneOf(root, 'RTPlanGeometry', ['PATIENT', 'TREATMENT_DEVICE'] as const);
  const approvalStatus = oneOf(root, 'ApprovalStatus', ['APPROVED', 'UNAPPROVED', 'REJECTED'] as const);

  const patientSetups = root.sequence('PatientSetupSequence').map(readSetup);
  checkUnique(
    root,
    'PatientSetupSequence',
    patientSetups.map((s) => s.number),
    'patient setup number',
  );
  const doseReferences = root.sequence('DoseReferenceSequence').map(readDoseReference);
  checkUnique(
    root,
    'DoseReferenceSequence',
    doseReferences.map((d) => d.number),
    'dose reference number',
  );

  const beamItems = root.sequence('BeamSequence');
  const beams = beamItems.map(readBeam).filter((b): b is Beam => b !== undefined);
  // Every beam dropped must have said why; one that did not is refused here, never left out unsaid.
  if (beams.length < beamItems.length && !issues.some((i) => i.severity === 'error'))
    root.report('error', 'unreadable', 'BeamSequence', `${beamItems.length - beams.length} beam(s) could not be read`);
  checkUnique(
    root,
    'BeamSequence',
    beams.map((b) => b.number),
    'beam number',
  );
  const treatmentBeams = new Set(beams.filter((b) => b.treatmentDeliveryType !== 'SETUP').map((b) => b.number));
  const fractionGroups = readFractionGroups(root, treatmentBeams);

  // Cross-references: every number a plan uses must name something the plan defines.
  const beamNumbers = new Set(beams.map((b) => b.number));
  fractionGroups.forEach((g, gi) => {
    g.beams.forEach((rb, bi) => {
      if (rb.beamNumber >= 0 && !beamNumbers.has(rb.beamNumber) && beamItems.length === beams.length) {
        issues.push({
          severity: 'error',
          code: 'unknown-reference',
          file,
          beamNumber: rb.beamNumber,
          path: `FractionGroupSequence[${gi}].ReferencedBeamSequence[${bi}].ReferencedBeamNumber`,
          message: `fraction group ${g.number} names beam ${rb.beamNumber}, which the Beam Sequence does not contain`,
          expected: [...beamNumbers].join(', ') || 'no beams',
          found: `${rb.beamNumber}`,
        });
      }
    });
  });
  const setupNumbers = new Set(patientSetups.map((s) => s.number));
  for (const b of beams) {
    if (b.patientSetupNumber !== undefined && !setupNumbers.has(b.patientSetupNumber)) {
      issues.push({
        severity: 'error',
        code: 'unknown-reference',
        file,
        beamNumber: b.number,
        ...opt('beamName', b.name),
        path: 'ReferencedPatientSetupNumber',
        message: `the beam names patient setup ${b.patientSetupNumber}, which the Patient Setup Sequence does not contain`,
        expected: [...setupNumbers].join(', ') || 'no setups',
        found: `${b.patientSetupNumber}`,
      });
    }
  }
  if (beamItems.length === 0) root.report('error', 'missing-attribute', 'BeamSequence', 'holds no beams', 'at least one beam');
  if (fractionGroups.length === 0)
    root.report(
      'warning',
      'missing-attribute',
      'FractionGroupSequence',
      'holds no fraction groups, so no beam has a meterset',
      'at least one fraction group',
    );

  if (issues.some((i) => i.severity === 'error') || sopInstanceUid === undefined || label === undefined) {
    return { ok: false, issues };
  }
  const candidate = {
    sopClassUid: sopClass,
    sopInstanceUid,
    ...opt('studyInstanceUid', root.string('StudyInstanceUID')),
    ...opt('seriesInstanceUid', root.string('SeriesInstanceUID')),
    ...opt('frameOfReferenceUid', root.string('FrameOfReferenceUID')),
    patient: { ...opt('id', root.string('PatientID')), ...opt('name', root.string('PatientName')) },
    label,
    ...opt('name', root.string('RTPlanName')),
    ...opt('description', root.string('RTPlanDescription')),
    ...opt('date', root.string('RTPlanDate')),
    ...opt('time', root.string('RTPlanTime')),
    ...opt('geometry', geometry),
    ...opt('intent', root.string('PlanIntent')),
    ...opt('approvalStatus', approvalStatus),
    referencedStructureSetUids: referencedUids(root, 'ReferencedStructureSetSequence'),
    referencedDoseUids: referencedUids(root, 'ReferencedDoseSequence'),
    patientSetups,
    doseReferences,
    fractionGroups,
    beams,
  };
  const parsed = Plan.safeParse(candidate);
  if (!parsed.success) {
    return {
      ok: false,
      issues: parsed.error.issues.map((z) => ({
        severity: 'error' as const,
        code: 'invalid-value' as const,
        file,
        path: z.path.join('.'),
        message: `the plan model rejected a value (${z.message}); this is a bug in plumbline if the file is valid`,
      })),
    };
  }
  return { ok: true, value: parsed.data, warnings: issues };
}

function readSetup(s: ItemReader): PatientSetup {
  const number = need(s, 'PatientSetupNumber', s.integer('PatientSetupNumber'), 'the patient setup number') ?? -1;
  const position = oneOf(s, 'PatientPosition', PATIENT_POSITIONS);
  const additional = s.string('PatientAdditionalPosition');
  if (position === undefined && additional === undefined && !s.has('PatientPosition')) {
    s.report(
      'error',
      'missing-attribute',
      'PatientPosition',
      'is missing (and no Patient Additional Position is given)',
      PATIENT_POSITIONS.join(', '),
    );
  }
  return { number, ...opt('position', position), ...opt('additionalPosition', additional), ...opt('setupTechnique', s.string('SetupTechnique')) };
}

function readDoseReference(d: ItemReader): DoseReference {
  const structureType = need(d, 'DoseReferenceStructureType', d.string('DoseReferenceStructureType'), 'POINT, VOLUME, COORDINATES or SITE') ?? '';
  const point = d.tuple('DoseReferencePointCoordinates', 3);
  if (structureType === 'COORDINATES') need(d, 'DoseReferencePointCoordinates', point, 'the point (x, y, z) in mm');
  return {
    number: need(d, 'DoseReferenceNumber', d.integer('DoseReferenceNumber'), 'the dose reference number') ?? -1,
    ...opt('uid', d.string('DoseReferenceUID')),
    structureType,
    ...opt('description', d.string('DoseReferenceDescription')),
    ...opt('roiNumber', d.integer('ReferencedROINumber')),
    ...opt('pointPatientMm', point as [number, number, number] | undefined),
    ...opt('type', d.string('DoseReferenceType')),
    ...opt('targetPrescriptionDoseGy', d.number('TargetPrescriptionDose')),
    ...opt('targetMinimumDoseGy', d.number('TargetMinimumDose')),
    ...opt('targetMaximumDoseGy', d.number('TargetMaximumDose')),
    ...opt('deliveryWarningDoseGy', d.number('DeliveryWarningDose')),
    ...opt('deliveryMaximumDoseGy', d.number('DeliveryMaximumDose')),
    ...opt('organAtRiskMaximumDoseGy', d.number('OrganAtRiskMaximumDose')),
  };
}

function referencedUids(root: ItemReader, kw: 'ReferencedStructureSetSequence' | 'ReferencedDoseSequence'): string[] {
  return root
    .sequence(kw)
    .map((r) => need(r, 'ReferencedSOPInstanceUID', r.string('ReferencedSOPInstanceUID'), 'the referenced SOP Instance UID'))
    .filter((u): u is string => u !== undefined);
}
