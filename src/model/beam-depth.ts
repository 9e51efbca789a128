import type { Note } from './check-note.js';
import type { CalculationPoint } from './check-result.js';

/** One beam's geometry through the patient's CT, as `plumbline depth` reports it (mm). */
export interface BeamDepth {
  readonly beamNumber: number;
  readonly beamName?: string;
  /** For an arc: the control point of this row (one row per control point). */
  readonly controlPointIndex?: number;
  readonly gantryAngleDeg: number;
  readonly point: Pick<CalculationPoint, 'source' | 'doseReferenceVia' | 'doseReferenceNumber' | 'patientMm'>;
  readonly planSsdMm?: number;
  readonly ctSsdAlongAxisMm?: number;
  readonly ssdDifferenceMm?: number;
  readonly entryPatientMm?: [number, number, number];
  readonly geometricDepthMm?: number;
  readonly radiologicalDepthMm?: number;
  readonly densityRange?: [number, number];
  readonly nearestInterfaceMm?: number;
  /** The planning system's own depth data for the beam, where the plan carries them. */
  readonly planningSystem?: PlanningSystemDepths;
  /** Why the beam has no depths. */
  readonly problem?: Note;
}

export interface PlanningSystemDepths {
  readonly depthMm?: number;
  readonly equivalentDepthMm?: number;
  readonly ssdMm?: number;
}
