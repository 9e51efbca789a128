import { isModulated } from '../beam-support.js';
import type { BeamCheckContext, BeamOutcome } from './context.js';
import { checkElectronBeam } from './electron.js';
import { checkModulatedPhotonBeam } from './modulated-photon.js';
import { checkStaticPhotonBeam } from './static-photon.js';

export { type BeamCheckContext, type BeamOutcome, notCheckedBeam } from './context.js';

/** Any beam the engine supports: electrons, modulated photon beams segment by segment, static photon beams. */
export function checkBeam(ctx: BeamCheckContext): BeamOutcome {
  if (ctx.beam.radiationType === 'ELECTRON') return checkElectronBeam(ctx);
  return isModulated(ctx.beam) ? checkModulatedPhotonBeam(ctx) : checkStaticPhotonBeam(ctx);
}
