import type { LookupLog, PhotonBeamModel } from '../model/index.js';
import { collimatorEquivalentSquareCm } from './equivalent-square.js';
import { projectFieldCm } from './inverse-square.js';
import { pddFromTpr, tprFromPdd } from './pdd-tpr.js';

/**
 * The dosimetric functions of one beam at any geometry, from whichever tables the clinic measured:
 * PDD and TPR normalized at the calibration depth d0, either derived from the other when only one
 * was measured (exactly, through Sp). NaN with a note in `log` when a table refuses a lookup.
 */

/** In-air output ratio for jaws X × Y at the isocenter plane (with the collimator-exchange constant, if any). */
export function scAt(beam: PhotonBeamModel, xCm: number, yCm: number, log: LookupLog): number {
  const side = collimatorEquivalentSquareCm(xCm, yCm, beam.collimatorExchangeK ?? 1);
  return beam.sc.at(side, 0, log);
}

/** Phantom scatter factor for an equivalent square at d0; from Scp / Sc when Sp was not measured. */
export function spAt(beam: PhotonBeamModel, sideCm: number, log: LookupLog): number {
  const measured = beam.sp ? beam.sp.at(sideCm, 0, log) : beam.scp!.at(sideCm, 0, log) / beam.sc.at(sideCm, 0, log);
  const dm = beam.spMeasuredAtDepthCm;
  if (dm === undefined || Math.abs(dm - beam.calibration.d0Cm) < 1e-9 || !beam.tpr) return measured;
  // Measured at dm: the same dose per MU at d0 reads Sp(r, dm)·TPR_dm(d0, r) = Sp(r, d0)·const, so
  // Sp(r, d0) = Sp(r, dm)·TPR(dm, r_ref)/TPR(dm, r) with TPR normalised at d0 (the reference field's Sp stays 1).
  const c = beam.calibration;
  const ref = c.referenceFieldAt === 'normalization-depth' ? c.referenceFieldCm : projectFieldCm(c.referenceFieldCm, c.ssd0Cm, c.ssd0Cm + c.d0Cm);
  return (measured * tprAt(beam, dm, ref, log)) / tprAt(beam, dm, sideCm, log);
}

/** PDD table value renormalized to 100 % at d0 (the table may be normalized at dmax). */
function pddTableAtD0(beam: PhotonBeamModel, depthCm: number, surfaceSideCm: number, log: LookupLog): number {
  const t = beam.pdd!;
  const d0 = beam.calibration.d0Cm;
  const v = t.at(depthCm, surfaceSideCm, log);
  return Math.abs(t.normalizationDepthCm - d0) < 1e-9 ? v : (100 * v) / t.at(d0, surfaceSideCm, log);
}

/**
 * `tprAt` at one depth as a function of the field side: the same values, the depth interpolation
 * of a measured TPR table done once (Clarkson sums look up many sides at one depth).
 */
export function tprAtDepth(beam: PhotonBeamModel, depthCm: number, log: LookupLog): (sideAtDepthCm: number, log: LookupLog) => number {
  const t = beam.tpr;
  if (!t) return (side, l) => tprAt(beam, depthCm, side, l);
  const at = t.atRow(depthCm, log);
  if (Math.abs(t.normalizationDepthCm - beam.calibration.d0Cm) < 1e-9) return at;
  const atD0 = t.atRow(beam.calibration.d0Cm, log);
  return (side, l) => at(side, l) / atD0(side, l);
}

/** TPR normalized at d0 for a field side at depth rd. */
export function tprAt(beam: PhotonBeamModel, depthCm: number, sideAtDepthCm: number, log: LookupLog): number {
  const d0 = beam.calibration.d0Cm;
  if (beam.tpr) {
    const t = beam.tpr;
    const v = t.at(depthCm, sideAtDepthCm, log);
    return Math.abs(t.normalizationDepthCm - d0) < 1e-9 ? v : v / t.at(d0, sideAtDepthCm, log);
  }
  const f = beam.pdd!.ssdCm;
  const r = projectFieldCm(sideAtDepthCm, f + depthCm, f);
  const rd0 = projectFieldCm(r, f, f + d0);
  return tprFromPdd(pddTableAtD0(beam, depthCm, r, log), depthCm, f, d0, spAt(beam, rd0, log), spAt(beam, sideAtDepthCm, log));
}

/**
 * PDD (percent, normalized at d0) at depth d for a surface field r at SSD f: the measured table at
 * its own SSD, else through TPR (exact, unlike the Mayneord F factor).
 */
export function pddAt(beam: PhotonBeamModel, depthCm: number, surfaceSideCm: number, ssdCm: number, log: LookupLog): number {
  if (beam.pdd && Math.abs(ssdCm - beam.pdd.ssdCm) < 1e-6) return pddTableAtD0(beam, depthCm, surfaceSideCm, log);
  const d0 = beam.calibration.d0Cm;
  const rd = projectFieldCm(surfaceSideCm, ssdCm, ssdCm + depthCm);
  const rd0 = projectFieldCm(surfaceSideCm, ssdCm, ssdCm + d0);
  return pddFromTpr(tprAt(beam, depthCm, rd, log), depthCm, ssdCm, d0, spAt(beam, rd0, log), spAt(beam, rd, log));
}
