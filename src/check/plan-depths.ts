import { beamFrame, ctDepth, SUPPORTED_POSITIONS } from '../geometry/index.js';
import { type BeamDepth, note, type Plan } from '../model/index.js';
import { choosePoint } from './choose-point.js';
import { ctAxisSsdMm, ctDepthOptions, type PatientCt } from './patient-ct.js';
import { planningSystemDepths } from './planning-system-depths.js';

const DEFAULT_SAD_MM = 1000;

/** Per beam of every fraction group (per control point for an arc): the SSD from the plan and from the CT, the traced depths. */
export function planDepths(plan: Plan, ct: PatientCt): BeamDepth[] {
  const rows: BeamDepth[] = [];
  const body = ctDepthOptions(ct);
  for (const g of plan.fractionGroups) {
    for (const entry of g.beams) {
      const beam = plan.beams.find((b) => b.number === entry.beamNumber)!;
      const cps = beam.controlPoints;
      const arc = cps.some((c) => c.gantryAngleDeg !== cps[0]!.gantryAngleDeg);
      const sadMm = beam.sourceAxisDistanceMm ?? DEFAULT_SAD_MM;
      const position = plan.patientSetups.find((s) => s.number === beam.patientSetupNumber)?.position ?? plan.patientSetups[0]?.position;
      const point = choosePoint(plan, g, entry, beam);
      const theirs = planningSystemDepths(plan, g, entry, beam, point);
      for (const cp of arc ? cps : [cps[0]!]) {
        const base = {
          beamNumber: beam.number,
          ...(beam.name ? { beamName: beam.name } : {}),
          ...(arc ? { controlPointIndex: cp.index } : {}),
          gantryAngleDeg: cp.gantryAngleDeg,
          ...(cp.ssdMm !== undefined ? { planSsdMm: cp.ssdMm } : {}),
          ...(theirs && !arc ? { planningSystem: theirs } : {}),
        };
        const frame = position ? beamFrame(cp, position, sadMm) : undefined;
        if (!point || !frame) {
          rows.push({
            ...base,
            point: { source: 'isocenter', patientMm: [0, 0, 0] },
            problem: !point
              ? note('no-point')
              : position
                ? note('patient-position', { position, supported: SUPPORTED_POSITIONS.join(', ') })
                : note('no-patient-position'),
          });
          continue;
        }
        const axis = ctAxisSsdMm(ct, frame, sadMm);
        const d = ctDepth(ct.volume, frame.sourcePatientMm, point.patientMm, body);
        rows.push({
          ...base,
          point: {
            source: point.source,
            ...(point.doseReferenceVia ? { doseReferenceVia: point.doseReferenceVia } : {}),
            ...(point.doseReferenceNumber !== undefined ? { doseReferenceNumber: point.doseReferenceNumber } : {}),
            patientMm: point.patientMm,
          },
          ...(axis !== undefined ? { ctSsdAlongAxisMm: axis, ...(cp.ssdMm !== undefined ? { ssdDifferenceMm: axis - cp.ssdMm } : {}) } : {}),
          ...(d.ok
            ? {
                entryPatientMm: [...d.value.entryPatientMm] as [number, number, number],
                geometricDepthMm: d.value.geometricDepthMm,
                radiologicalDepthMm: d.value.radiologicalDepthMm,
                densityRange: [...d.value.densityRange] as [number, number],
                ...(d.value.nearestInterfaceMm !== undefined ? { nearestInterfaceMm: d.value.nearestInterfaceMm } : {}),
              }
            : { problem: note('ct-trace', { ...d.refusal }) }),
        });
      }
    }
  }
  return rows;
}
