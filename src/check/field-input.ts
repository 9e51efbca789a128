import { type Aperture, type BlockOutline, type PackedRings, pointIsOpen, sectorRings } from '../geometry/index.js';
import { type ClarksonRings, MM_PER_CM } from '../model/index.js';
import { equivalentSquareOfOutlineCm } from '../physics/index.js';

/** Sectors of the Clarkson integration (at least 36 are recommended; more near edges do no harm). */
export const CLARKSON_SECTORS = 72;

/** What the physics needs of one aperture seen from one point: the collimator field, the irradiated field, and the sectors when irregular. */
export interface FieldInput {
  /** The collimating opening (jaws, or the leaves' extent along an axis without jaws), cm at the isocenter plane. */
  readonly collimatorFieldCm: { readonly x: number; readonly y: number };
  readonly jawAreaMm2: number;
  readonly irradiatedSquareCm: number;
  /** The open area: the aperture's, or with blocks the open rings' around the point. */
  readonly openAreaMm2: number;
  readonly clarksonSectors?: ClarksonRings;
  /** The fluence at the point: 1 open, the leaf transmission under the leaves, 0 beyond the jaws. */
  readonly primaryWeight: number;
}

/**
 * The field of one aperture at a point (x, y at the isocenter plane, mm). `depthScale` takes lengths
 * at the isocenter plane to the point's depth. A plain rectangle with the point open uses the
 * equivalent square; anything else gets Clarkson sectors (geometry in mm hands over to cm here).
 */
export function fieldInput(
  aperture: Aperture,
  blocks: readonly BlockOutline[],
  x: number,
  y: number,
  depthScale: number,
  leafTransmission: number,
): FieldInput {
  const j = aperture.collimatingMm;
  const collimatorFieldCm = { x: (j.x2 - j.x1) / MM_PER_CM, y: (j.y2 - j.y1) / MM_PER_CM };
  const jawAreaMm2 = (j.x2 - j.x1) * (j.y2 - j.y1);
  const irradiatedSquareCm = equivalentSquareOfOutlineCm(aperture.areaMm2 / (MM_PER_CM * MM_PER_CM), aperture.perimeterMm / MM_PER_CM);
  const open = pointIsOpen(aperture, blocks, x, y);
  const inJaws = x >= j.x1 && x <= j.x2 && y >= j.y1 && y <= j.y2;
  const primaryWeight = open ? 1 : inJaws && blocks.length === 0 ? leafTransmission : 0;
  // Shaped by leaves inside the jaws, or blocked, or (in a modulated beam) the point is covered: Clarkson.
  const irregular = (aperture.leaves && aperture.areaMm2 / jawAreaMm2 < 0.99) || blocks.length > 0 || !open;
  const rings = irregular ? sectorRings(aperture, blocks, x, y, CLARKSON_SECTORS, leafTransmission) : undefined;
  return {
    collimatorFieldCm,
    jawAreaMm2,
    irradiatedSquareCm,
    openAreaMm2: rings && blocks.length ? openArea(rings) : aperture.areaMm2,
    ...(rings ? { clarksonSectors: { start: rings.start, outerCm: atDepthCm(rings.outerMm, depthScale), weight: rings.weight } } : {}),
    primaryWeight,
  };
}

/** Ring radii at the isocenter plane (mm) to the point's depth (cm). */
function atDepthCm(outerMm: readonly number[], depthScale: number): number[] {
  const out = new Array<number>(outerMm.length);
  for (let k = 0; k < outerMm.length; k++) out[k] = (outerMm[k]! * depthScale) / MM_PER_CM;
  return out;
}

/** Area of the open rings (weight 1) of n equal sectors: Σ (π/n)(r_out² − r_in²). */
function openArea(p: PackedRings): number {
  const n = p.start.length - 1;
  let area = 0;
  for (let i = 0; i < n; i++) {
    let inner = 0;
    for (let k = p.start[i]!; k < p.start[i + 1]!; k++) {
      const outer = p.outerMm[k]!;
      if (p.weight[k] === 1) area += (Math.PI / n) * (outer * outer - inner * inner);
      inner = outer;
    }
  }
  return area;
}
