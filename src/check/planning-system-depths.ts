import type {
  Beam,
  Calculation,
  CalculationPoint,
  DoseVerificationPoint,
  FractionGroup,
  Plan,
  PlanningSystemDepths,
  ReferencedBeam,
} from '../model/index.js';
import { choosePoint } from './choose-point.js';

/** Points within this distance are the same point (coordinates are written to 0.1 mm or finer). */
const SAME_POINT_MM = 0.5;

/**
 * The planning system's Beam Dose Point Depth, Equivalent Depth and SSD for a beam at the point
 * where it states the beam's dose: from the Beam Dose Verification Control Point Sequence of that
 * point's dose reference, else from the retired per-beam attributes (which go with the Beam Dose).
 * None for a point of the user's elsewhere: the planning system's depths belong to its own point.
 * When the plan names no point (the isocenter is used), the first depths the beam carries.
 */
export function planningSystemDepths(
  plan: Plan,
  group: FractionGroup,
  entry: ReferencedBeam,
  beam: Beam,
  point: CalculationPoint | undefined,
): PlanningSystemDepths | undefined {
  if (point?.source === 'user' && !point.planningSystemDoseHere) return undefined;
  const stated = point?.source === 'user' ? choosePoint(plan, group, entry, beam) : point;
  const references =
    stated?.doseReferenceNumber !== undefined
      ? [stated.doseReferenceNumber]
      : stated?.source === 'beam-dose-specification-point'
        ? plan.doseReferences
            .filter((d) => d.pointPatientMm?.every((v, i) => Math.abs(v - stated.patientMm[i]!) < SAME_POINT_MM))
            .map((d) => d.number)
        : undefined;
  const v = beam.doseVerification
    .filter((d) => !references || references.includes(d.doseReferenceNumber))
    .flatMap((d) => d.points)
    .find(hasDepths);
  const depthMm = v?.pointDepthMm ?? entry.pointDepthMm;
  const equivalentDepthMm = v?.equivalentDepthMm ?? entry.equivalentDepthMm;
  const ssdMm = v?.ssdMm ?? entry.pointSsdMm;
  if (depthMm === undefined && equivalentDepthMm === undefined && ssdMm === undefined) return undefined;
  return {
    ...(depthMm !== undefined ? { depthMm } : {}),
    ...(equivalentDepthMm !== undefined ? { equivalentDepthMm } : {}),
    ...(ssdMm !== undefined ? { ssdMm } : {}),
  };
}

function hasDepths(p: DoseVerificationPoint): boolean {
  return p.pointDepthMm !== undefined || p.equivalentDepthMm !== undefined || p.ssdMm !== undefined;
}

/** Our depth, radiological depth (with the CT) and SSD along the ray from the source to the point, as DICOM states the planning system's. */
export interface RayDepths {
  readonly depthMm: number;
  readonly radiologicalMm?: number;
  readonly ssdMm: number;
}

/** The planning system's own depth data beside ours, with the differences. */
export function besideOurs(t: PlanningSystemDepths | undefined, ours: RayDepths): Calculation['planningSystemDepths'] {
  if (!t) return undefined;
  const { depthMm, radiologicalMm, ssdMm } = ours;
  return {
    ...(t.depthMm !== undefined ? { depthMm: t.depthMm, depthDifferenceMm: depthMm - t.depthMm } : {}),
    ...(t.equivalentDepthMm !== undefined
      ? {
          equivalentDepthMm: t.equivalentDepthMm,
          ...(radiologicalMm !== undefined ? { equivalentDepthDifferenceMm: radiologicalMm - t.equivalentDepthMm } : {}),
        }
      : {}),
    ...(t.ssdMm !== undefined ? { ssdMm: t.ssdMm, ssdDifferenceMm: ssdMm - t.ssdMm } : {}),
  };
}

/** An Equivalent Depth this far from the depth means the planning system corrected for heterogeneity. */
const CORRECTED_MM = 1;

/**
 * What the plan's own depth data say of the planning system's heterogeneity correction: true when
 * a beam's Equivalent Depth differs from its depth, false when all stated pairs agree, undefined
 * when the plan states none.
 */
export function planStatesCorrection(plan: Plan): boolean | undefined {
  const pairs: [number, number][] = [];
  const add = (d?: number, e?: number) => d !== undefined && e !== undefined && pairs.push([d, e]);
  for (const g of plan.fractionGroups) for (const r of g.beams) add(r.pointDepthMm, r.equivalentDepthMm);
  for (const b of plan.beams) for (const v of b.doseVerification) for (const p of v.points) add(p.pointDepthMm, p.equivalentDepthMm);
  if (!pairs.length) return undefined;
  return pairs.some(([d, e]) => Math.abs(d - e) > CORRECTED_MM);
}
