import { MM_PER_CM, note, type Note, type PhotonBeamModel } from '../../model/index.js';
import { type BeamCheckContext, type Stopped, stopNotChecked } from './context.js';
import { heelDirection, type Modifiers } from './modifiers.js';
import type { StaticGeometry } from './static-geometry.js';

/** Beyond this distance along the wedge's gradient (cm, isocenter plane) the central-axis wedge factor is no longer the point's. */
export const WEDGE_AXIS_LIMIT_CM = 0.5;

/** Where the point lies along the wedge: its position toward the heel when a profile applies, and what the result must say. */
export interface WedgePosition {
  readonly towardHeelCm?: number;
  readonly approximations: readonly Note[];
}

/**
 * A wedge's dose changes steeply along its gradient (roughly the PDD slope × tan(angle) per cm:
 * several percent per cm for a 60° wedge; common practice, no source). Off the central axis along
 * the gradient, the point takes the beam data's wedge profile (physical) or swept-wedge profile
 * (jaw-swept); without one, or without the heel's direction, a point more than 0.5 cm along the
 * gradient is not checked, and a point closer is said to take the central-axis factor.
 */
export function wedgePosition(ctx: BeamCheckContext, data: PhotonBeamModel, g: StaticGeometry, m: Modifiers): WedgePosition | Stopped {
  const wedge = m.physical?.wedge ?? m.swept?.wedge;
  if (!wedge) return { approximations: [] };
  const [px, py] = g.at.atIsocenterPlaneMm;
  const heel = heelDirection(ctx.machine, wedge.orientationDeg);
  const profile = m.physical ? m.physical.data.profile : data.sweptWedgeProfile;
  const towardHeelCm = heel ? (px * heel[0] + py * heel[1]) / MM_PER_CM : undefined;
  if (profile && towardHeelCm !== undefined) return { towardHeelCm, approximations: [] };
  // Along the gradient: the sweep's jaw axis, or the heel's axis; with neither known, any direction.
  const alongMm = m.swept ? Math.abs(m.swept.axis === 'Y' ? py : px) : heel ? Math.abs(px * heel[0] + py * heel[1]) : Math.hypot(px, py);
  const alongCm = alongMm / MM_PER_CM;
  const missing = profile ? 'heel' : 'profile';
  const values = { kind: m.swept ? 'swept' : 'physical', wedge: wedge.id ?? String(wedge.number), distanceCm: alongCm, missing };
  if (alongCm > WEDGE_AXIS_LIMIT_CM) return stopNotChecked(ctx, 'wedge-off-axis', { ...values, limitCm: WEDGE_AXIS_LIMIT_CM });
  return { approximations: alongCm > 0.05 ? [note('wedge-central-axis-factor', values)] : [] };
}
