import { note, type Note, type PhotonBeamModel, type PhotonPointInput } from '../../model/index.js';
import { CLARKSON_SECTORS, type FieldInput, fieldInput } from '../field-input.js';
import type { BeamCheckContext } from './context.js';
import type { Modifiers } from './modifiers.js';
import type { StaticGeometry } from './static-geometry.js';
import type { WedgePosition } from './wedge-position.js';

/** The physics' input for a static photon beam at its point, and the approximations it makes. */
export interface StaticField {
  readonly field: FieldInput;
  readonly input: PhotonPointInput;
  /** Lengths at the isocenter plane to the point's depth. */
  readonly depthScale: number;
  readonly approximations: readonly Note[];
}

/**
 * Geometry (mm) hands over to physics (cm) here, through `fieldInput`: irregular fields get Clarkson
 * rings around the point, radii scaled to its depth; the wedge's profile position, the swept
 * wedge's field length and the tray join the input.
 */
export function staticField(ctx: BeamCheckContext, data: PhotonBeamModel, g: StaticGeometry, m: Modifiers, w: WedgePosition): StaticField {
  const { beam } = ctx;
  const cp0 = beam.controlPoints[0]!;
  const [px, py] = g.at.atIsocenterPlaneMm;
  const depthScale = g.at.sourceToPointAxialMm / g.sadMm;
  const leafTransmission = data.mlcTransmission ?? 0;
  const field = fieldInput(g.aperture, g.blocks, px, py, depthScale, leafTransmission);
  const clarkson = field.clarksonSectors;
  const approximations: Note[] = [];
  if (clarkson && g.setup === 'SSD') approximations.push(note('ssd-irregular-tpr-form'));
  if (clarkson) {
    approximations.push(
      note('clarkson-irregular', {
        mlc: g.aperture.leaves && g.aperture.areaMm2 / field.jawAreaMm2 < 0.99 ? 1 : 0,
        blocks: g.blocks.length,
        sectors: CLARKSON_SECTORS,
        leafTransmission,
        blockTransmissions: g.blocks.map((b) => b.transmission),
      }),
    );
  }
  if (g.aperture.leaves && !leavesOutside(g)) approximations.push(leafEndNote(data));
  approximations.push(...w.approximations);
  const towardHeelCm = w.towardHeelCm;
  let sweptWedge: PhotonPointInput['sweptWedge'];
  if (m.swept) {
    sweptWedge = { angleDeg: m.swept.angleDeg, fieldLengthCm: m.swept.axis === 'Y' ? field.collimatorFieldCm.y : field.collimatorFieldCm.x };
    const j = g.aperture.jawsMm;
    if (Math.abs(m.swept.axis === 'Y' ? j.y1 + j.y2 : j.x1 + j.x2) > 1) approximations.push(note('swept-wedge-asymmetric'));
  }
  if (beam.bolusRoiNumbers.length) approximations.push(note('bolus-depth'));
  if ((cp0.tableTopPitchDeg ?? 0) !== 0 || (cp0.tableTopRollDeg ?? 0) !== 0) approximations.push(note('table-pitch-roll-ignored'));
  const input: PhotonPointInput = {
    // Clarkson integrates Sp·TPR, so irregular fields use the TPR form whatever the setup.
    setup: clarkson ? 'SAD' : g.setup,
    collimatorFieldCm: field.collimatorFieldCm,
    irradiatedSquareCm: field.irradiatedSquareCm,
    depthCm: g.depthCm,
    ssdCm: g.ssdCm,
    offAxisCm: g.offAxisCm,
    ...(m.physical?.wedge.id ? { wedgeId: m.physical.wedge.id } : {}),
    ...(towardHeelCm !== undefined ? { towardHeelCm } : {}),
    ...(sweptWedge ? { sweptWedge } : {}),
    ...(clarkson ? { clarksonSectors: clarkson, primaryWeight: field.primaryWeight } : {}),
    ...(m.trayId !== undefined ? { trayId: m.trayId } : {}),
  };
  return { field, input, depthScale, approximations };
}

/** How the leaf ends were taken: widened by the beam data's dosimetric leaf gap, or not modelled. */
export function leafEndNote(data: PhotonBeamModel): Note {
  return data.dosimetricLeafGapMm !== undefined ? note('leaf-end-gap', { gapMm: data.dosimetricLeafGapMm }) : note('leaf-ends-not-modelled');
}

/** Whether every leaf pair stands outside the jaws' opening (the leaves shape nothing). */
function leavesOutside(g: StaticGeometry): boolean {
  const j = g.aperture.jawsMm;
  return g.aperture.areaMm2 >= (j.x2 - j.x1) * (j.y2 - j.y1) * (1 - 1e-9);
}
