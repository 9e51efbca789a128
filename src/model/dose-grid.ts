/**
 * A planning system's RT Dose grid, in Gy (Dose Grid Scaling applied), x fastest then y then frame.
 * Frame k lies at originMm + normal·frameOffsetsMm[k]; voxel (i, j) within a frame as for CT.
 */
import type { ImageGrid } from './ct-volume.js';

export interface DoseGrid extends ImageGrid {
  readonly file: string;
  readonly frameOfReferenceUid: string;
  readonly summationType: string;
  readonly units: string;
  readonly type: string;
  /** Tissue Heterogeneity Correction (3004,0014) as the planning system states it: IMAGE, ROI_OVERRIDE, WATER. */
  readonly tissueHeterogeneityCorrection?: readonly string[];
  readonly referencedPlanUid?: string;
  /** For a per-beam grid (summation BEAM): the beam it belongs to. */
  readonly referencedBeamNumber?: number;
  readonly frameOffsetsMm: readonly number[];
  readonly doseGy: Float32Array;
}
