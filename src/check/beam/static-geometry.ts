import {
  type Aperture,
  apertureAt,
  type BeamFrame,
  beamFrame,
  type BlockOutline,
  type FlatDepth,
  flatDepth,
  pointIsOpen,
} from '../../geometry/index.js';
import { MM_PER_CM, note, type Note } from '../../model/index.js';
import { type BeamCheckContext, isStopped, type Stopped, stopNotChecked } from './context.js';
import { type Traced, traceToPoint } from './ct-trace.js';
import { jawEnvelope, type Modifiers } from './modifiers.js';

/** Where a static beam meets the patient: the frame, the point's depth and the field's aperture. */
export interface StaticGeometry {
  readonly sadMm: number;
  readonly frame: BeamFrame;
  /** The point below a flat surface at the plan's SSD (its position in the field, its off-axis distance). */
  readonly at: FlatDepth;
  readonly aperture: Aperture;
  readonly blocks: readonly BlockOutline[];
  /** With the CT: the traced ray. */
  readonly traced?: Traced;
  readonly depthCm: number;
  readonly ssdCm: number;
  readonly offAxisCm: number;
  /** The SSD along the central axis (CT, else the plan's), which decides the setup. */
  readonly axisSsdMm: number;
  readonly setup: 'SSD' | 'SAD';
  readonly setupBasis: Note;
}

/** The beam's SAD, or why it cannot be checked with this machine's data. */
export function beamSadMm(ctx: BeamCheckContext): number | Stopped {
  const sadMm = ctx.beam.sourceAxisDistanceMm ?? ctx.machine.sadCm * MM_PER_CM;
  if (Math.abs(sadMm - ctx.machine.sadCm * MM_PER_CM) > 1) return stopNotChecked(ctx, 'sad-differs', { sadMm, machineSadCm: ctx.machine.sadCm });
  return sadMm;
}

/**
 * A static photon beam's geometry in mm: the IEC 61217 frame, the depth below the plan's SSD or
 * traced through the CT, the aperture (a swept wedge's jaw envelope; open leaf pairs widened by the
 * dosimetric leaf gap), and the setup it implies.
 */
export function staticGeometry(ctx: BeamCheckContext, modifiers: Modifiers, leafGapMm: number): StaticGeometry | Stopped {
  const { beam, point, policy } = ctx;
  const cp0 = beam.controlPoints[0]!;
  const sadMm = beamSadMm(ctx);
  if (typeof sadMm !== 'number') return sadMm;
  if (cp0.ssdMm === undefined && !ctx.ct) return stopNotChecked(ctx, 'no-ssd-no-ct');
  const frame = beamFrame(cp0, ctx.patientPosition, sadMm)!;
  const at = flatDepth(frame, point.patientMm, cp0.ssdMm ?? 0);
  if (!ctx.ct && at.depthMm < 0) return stopNotChecked(ctx, 'point-above-surface', { heightCm: -at.depthMm / MM_PER_CM });
  // A swept wedge's jaw moves during delivery: the field is the jaws' envelope over the control points.
  const aperture = apertureAt(beam, modifiers.swept ? jawEnvelope(beam) : cp0, leafGapMm);
  if (!aperture || aperture.areaMm2 <= 0) return stopNotChecked(ctx, 'no-open-aperture');
  const traced = ctx.ct ? traceToPoint({ ...ctx, ct: ctx.ct }, frame, sadMm) : undefined;
  if (traced && isStopped(traced)) return traced;
  const axisSsdMm = traced ? (traced.axisSsdMm ?? cp0.ssdMm) : cp0.ssdMm;
  if (axisSsdMm === undefined) return stopNotChecked(ctx, 'no-axis-ssd');
  const blocks: BlockOutline[] = beam.blocks.map((b) => ({ kind: b.type, outlineMm: b.outlineMm, transmission: b.transmission ?? 0 }));
  if (blocks.length && !pointIsOpen(aperture, blocks, at.atIsocenterPlaneMm[0], at.atIsocenterPlaneMm[1]))
    return stopNotChecked(ctx, 'point-blocked');
  const setup: 'SSD' | 'SAD' = Math.abs(axisSsdMm - sadMm) <= policy.classification.ssdSetupWithinMm ? 'SSD' : 'SAD';
  return {
    sadMm,
    frame,
    at,
    aperture,
    blocks,
    ...(traced ? { traced } : {}),
    depthCm: (traced ? traced.depth.geometricDepthMm : at.depthMm) / MM_PER_CM,
    ssdCm: (traced ? traced.depth.ssdMm : cp0.ssdMm!) / MM_PER_CM,
    offAxisCm: at.offAxisMm / MM_PER_CM,
    axisSsdMm,
    setup,
    setupBasis:
      setup === 'SSD'
        ? note('ssd-equals-sad', { ssdCm: axisSsdMm / MM_PER_CM })
        : note('isocenter-deep', { depthCm: (sadMm - axisSsdMm) / MM_PER_CM }),
  };
}
