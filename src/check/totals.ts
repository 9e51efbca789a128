import { type BeamCheck, cGyFromGy, type FractionGroup, type FractionGroupCheck, type Plan, type PlanCheck } from '../model/index.js';
import { percentDeviation } from './deviation.js';

type Total = PlanCheck['courseTotals'][number];

/** Points written to 0.1 mm are the same point. */
export const pointKey = (p: readonly number[]): string => p.map((v) => v.toFixed(1)).join(',');

/** Per point of one fraction group: the sum of the checked beams, against the planning system and the prescription. */
export function groupTotals(plan: Plan, g: FractionGroup, beams: readonly BeamCheck[]): Total[] {
  const points = new Map<string, BeamCheck[]>();
  for (const b of beams) if (b.point) points.set(pointKey(b.point.patientMm), [...(points.get(pointKey(b.point.patientMm)) ?? []), b]);
  const out: Total[] = [];
  for (const at of points.values()) {
    const checked = at.filter((b) => b.status === 'checked' && b.planningSystemDoseCGy !== undefined);
    if (!checked.length) continue;
    const ind = checked.reduce((s, b) => s + (b.status === 'checked' ? b.calculation.independentDoseCGy : 0), 0);
    const tps = checked.reduce((s, b) => s + b.planningSystemDoseCGy!, 0);
    const point = at[0]!.point!.patientMm;
    const rx = prescriptionPerFractionCGy(plan, g, point);
    out.push({
      pointPatientMm: point,
      beams: checked.map((b) => b.beamNumber),
      independentDoseCGy: ind,
      planningSystemDoseCGy: tps,
      ...deviation('deviationPercent', ind, tps),
      ...(rx !== undefined
        ? {
            prescriptionPerFractionCGy: rx,
            ...deviation('independentVsPrescriptionPercent', ind, rx),
            ...deviation('planningSystemVsPrescriptionPercent', tps, rx),
          }
        : {}),
      // Beams not checked have no point of ours: any of them makes the group's totals incomplete.
      complete: checked.length === at.length && beams.every((b) => b.status === 'checked'),
    });
  }
  return out;
}

/** Over the course: Σ over fraction groups of fractions × the group's total, per point. */
export function courseTotals(groups: readonly FractionGroupCheck[]): Total[] {
  const byPoint = new Map<string, Total>();
  for (const g of groups) {
    const n = g.fractionsPlanned ?? 0;
    for (const t of g.totals) {
      const k = pointKey(t.pointPatientMm);
      const prev = byPoint.get(k);
      const ind = (prev?.independentDoseCGy ?? 0) + n * t.independentDoseCGy;
      const tps = (prev?.planningSystemDoseCGy ?? 0) + n * t.planningSystemDoseCGy;
      byPoint.set(k, {
        pointPatientMm: t.pointPatientMm,
        beams: [...(prev?.beams ?? []), ...t.beams],
        independentDoseCGy: ind,
        planningSystemDoseCGy: tps,
        ...deviation('deviationPercent', ind, tps),
        complete: (prev?.complete ?? true) && t.complete,
      });
    }
  }
  return [...byPoint.values()];
}

/** A deviation under its name, left out when there is nothing to compare with. */
function deviation<K extends string>(name: K, value: number, reference: number): Partial<Record<K, number>> {
  const d = percentDeviation(value, reference);
  return d === undefined ? {} : ({ [name]: d } as Record<K, number>);
}

/** The fraction group's prescription at a point, per fraction, when its dose reference lies there. */
function prescriptionPerFractionCGy(plan: Plan, g: FractionGroup, point: readonly number[]): number | undefined {
  if (!g.fractionsPlanned) return undefined;
  for (const r of g.doseReferences) {
    const d = plan.doseReferences.find((x) => x.number === r.doseReferenceNumber);
    const gy = r.targetPrescriptionDoseGy ?? d?.targetPrescriptionDoseGy;
    if (d?.pointPatientMm && gy !== undefined && pointKey(d.pointPatientMm) === pointKey(point)) return cGyFromGy(gy) / g.fractionsPlanned;
  }
  if (plan.fractionGroups.length === 1) {
    const d = plan.doseReferences.find(
      (x) => x.pointPatientMm && x.targetPrescriptionDoseGy !== undefined && pointKey(x.pointPatientMm) === pointKey(point),
    );
    if (d) return cGyFromGy(d.targetPrescriptionDoseGy!) / g.fractionsPlanned;
  }
  return undefined;
}
