import { type Aperture, type BlockOutline, pointIsOpen, sectorRings } from '../geometry/index.js';
import { type ClarksonSector, MM_PER_CM } from '../model/index.js';
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
  readonly clarksonSectors?: readonly ClarksonSector[];
  /** The fluence at the point: 1 open, the leaf transmission under the leaves, 0 beyond the jaws. */
  readonly primaryWeight: number;
}

/**
 * The field of one aperture at a point (x, y at the isocenter plane, mm). `depthScale` takes lengths
 * at the isocenter plane to the point's depth. A plain rectangle with the point open uses the
 * equivalent square; anything else gets Clarkson sectors (geometry in mm hands over to cm here).
 */
export function fieldInput(aperture: Aperture, blocks: readonly BlockOutline[], x: number, y: number, depthScale: number, leafTransmission: number): FieldInput {
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
    collimatorFieldCm, jawAreaMm2, irradiatedSquareCm,
    openAreaMm2: rings && blocks.length ? openArea(rings) : aperture.areaMm2,
    ...(rings ? { clarksonSectors: rings.map((sector) => ({ crossingsCm: [], rings: sector.map((r) => ({ outerCm: (r.outerMm * depthScale) / MM_PER_CM, weight: r.weight })) })) } : {}),
    primaryWeight,
  };
}

/** Area of the open rings (weight 1) of n equal sectors: Σ (π/n)(r_out² − r_in²). */
function openArea(sectors: readonly (readonly { outerMm: number; weight: number }[])[]): number {
  let area = 0;
  for (const rings of sectors) {
    let inner = 0;
    for (const r of rings) {
      if (r.weight === 1) area += (Math.PI / sectors.length) * (r.outerMm * r.outerMm - inner * inner);
      inner = r.outerMm;
    }
  }
  return area;
}
