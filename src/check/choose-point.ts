import type { Beam, CalculationPoint, FractionGroup, Plan, ReferencedBeam } from '../model/index.js';

type Point3 = [number, number, number];

/**
 * Where to calculate, and why: a point the user gave; else where the planning system states the
 * beam's dose (its Beam Dose Specification Point, the Dose Reference its Beam Dose refers to, the
 * fraction group's dose reference, the plan's one target point); else the isocenter, where the
 * comparison with Beam Dose is an assumption and says so.
 */
export function choosePoint(plan: Plan, group: FractionGroup, entry: ReferencedBeam, beam: Beam, userPointMm?: Point3): CalculationPoint | undefined {
  if (userPointMm) {
    const same = stated(plan, group, entry);
    const planningSystemDoseHere = !!same && same.every((v, i) => Math.abs(v - userPointMm[i]!) < 0.5);
    return { source: 'user', patientMm: userPointMm, planningSystemDoseHere };
  }
  if (entry.beamDoseSpecificationPointPatientMm) {
    return {
      source: 'beam-dose-specification-point',
      patientMm: [...entry.beamDoseSpecificationPointPatientMm] as Point3,
      planningSystemDoseHere: true,
    };
  }
  const byUid = entry.doseReferenceUid ? plan.doseReferences.find((d) => d.uid === entry.doseReferenceUid && d.pointPatientMm) : undefined;
  if (byUid) {
    return {
      source: 'dose-reference',
      doseReferenceVia: 'referenced-uid',
      patientMm: [...byUid.pointPatientMm!] as Point3,
      planningSystemDoseHere: true,
      doseReferenceNumber: byUid.number,
    };
  }
  const groupRefs = group.doseReferences
    .map((r) => plan.doseReferences.find((d) => d.number === r.doseReferenceNumber))
    .filter((d) => d?.pointPatientMm);
  if (groupRefs.length === 1) {
    const d = groupRefs[0]!;
    return {
      source: 'dose-reference',
      doseReferenceVia: 'only-in-fraction-group',
      patientMm: [...d.pointPatientMm!] as Point3,
      planningSystemDoseHere: true,
      doseReferenceNumber: d.number,
    };
  }
  const targets = plan.doseReferences.filter((d) => d.pointPatientMm && d.type === 'TARGET');
  if (targets.length === 1) {
    const d = targets[0]!;
    return { source: 'prescription-point', patientMm: [...d.pointPatientMm!] as Point3, planningSystemDoseHere: true, doseReferenceNumber: d.number };
  }
  const iso = beam.controlPoints[0]?.isocenterPatientMm;
  if (!iso) return undefined;
  return { source: 'isocenter', patientMm: [...iso] as Point3, planningSystemDoseHere: false };
}

function stated(plan: Plan, group: FractionGroup, entry: ReferencedBeam): readonly number[] | undefined {
  if (entry.beamDoseSpecificationPointPatientMm) return entry.beamDoseSpecificationPointPatientMm;
  const byUid = entry.doseReferenceUid ? plan.doseReferences.find((d) => d.uid === entry.doseReferenceUid) : undefined;
  if (byUid?.pointPatientMm) return byUid.pointPatientMm;
  const refs = group.doseReferences.map((r) => plan.doseReferences.find((d) => d.number === r.doseReferenceNumber)?.pointPatientMm).filter(Boolean);
  return refs.length === 1 ? refs[0] : undefined;
}
