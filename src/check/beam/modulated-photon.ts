import { type Calculation, type CaseCategory, type Factor, MM_PER_CM, note, type Note, type PhotonBeamModel } from '../../model/index.js';
import { CLARKSON_SECTORS } from '../field-input.js';
import { isHeterogeneous, levelsOf } from './category.js';
import { beamIdentity, type BeamCheckContext, type BeamOutcome, isStopped, type Stopped, stopNotChecked } from './context.js';
import { clampRows, compareDose, factorRows } from './dose-comparison.js';
import { beamSadMm } from './static-geometry.js';
import { photonBeamData } from './static-photon.js';
import { leafEndNote } from './static-field.js';
import { type SegmentDose, segmentDose } from './segment-dose.js';
import { type Segment, segmentsOf } from './segments.js';

/**
 * A modulated beam (step-and-shoot, sliding window, VMAT) by the modified Clarkson integration
 * (Kung, Chen and Kuchnir 2000): for every segment between two control points, the point's dose
 * per MU from that segment's own aperture (sector rings with leaf transmission, primary weighed by
 * the fluence at the point), gantry angle and so its own depth, summed with the segment's MU share.
 * Pie sectors with exact ring radii give the same sum as annular sectors over the azimuthally
 * averaged fluence, since each ring's scatter depends on its radius alone. A segment with a plain
 * rectangular opening over the point uses the equivalent square, as a static beam does, so a static
 * field written as an "arc" of identical control points gives the static result.
 */
export function checkModulatedPhotonBeam(ctx: BeamCheckContext): BeamOutcome {
  const { beam, machine, policy } = ctx;
  const cps = beam.controlPoints;
  const data = photonBeamData(ctx);
  if (isStopped(data)) return data.stopped;
  const unsupported = unsupportedModulation(ctx);
  if (unsupported) return stopNotChecked(ctx, unsupported).stopped;
  const sadMm = beamSadMm(ctx);
  if (typeof sadMm !== 'number') return sadMm.stopped;
  const segments = segmentsOf(cps, beam.finalCumulativeMetersetWeight);
  if (!segments.length) return stopNotChecked(ctx, 'no-meterset-delivered').stopped;
  const doses = segmentDoses(ctx, data, segments, sadMm);
  if (isStopped(doses)) return doses.stopped;
  const w = weighted(doses);
  // Every leaf pair closed at every control point: the beam delivers only transmission, no field to check.
  if (w.openShare === 0) return stopNotChecked(ctx, 'aperture-closed').stopped;
  const mu = ctx.entry.beamMeterset!;
  const identity = beamIdentity(beam, ctx.entry);
  const ranges = segmentRanges(doses);
  const factors: Factor[] = [
    { key: 'D0', value: data.calibration.doseCGyPerMu, args: [] },
    { key: 'MCI', value: w.dosePerMuCGy / data.calibration.doseCGyPerMu, args: [segments.length, CLARKSON_SECTORS], name: data.tpr?.kind ?? 'TPR' },
  ];
  const heterogeneous = ranges.densityRange !== undefined && isHeterogeneous(policy, ranges.densityRange);
  const category: CaseCategory =
    heterogeneous && policy.levels.heterogeneous!.actionPercent > policy.levels.modulated!.actionPercent ? 'heterogeneous' : 'modulated';
  return {
    ok: true,
    value: {
      ...identity,
      status: 'checked',
      point: ctx.point,
      calculation: {
        machineBeam: `${machine.name} ${data.id}`,
        setup: 'SAD',
        setupBasis: note('modulated-tpr-form'),
        ssdCm: w.ssdCm,
        depthCm: w.depthCm,
        offAxisCm: w.offAxisCm,
        collimatorFieldCm: { x: w.collimatorXCm, y: w.collimatorYCm },
        collimatorSquareCm: w.collimatorSquareCm,
        irradiatedSquareCm: w.irradiatedSquareCm,
        approximations: modulatedApproximations(ctx, data, segments.length, w, ranges),
        factors: factorRows(factors),
        dosePerMuCGy: w.dosePerMuCGy,
        ...compareDose(mu, w.dosePerMuCGy, identity.planningSystemDoseCGy),
        clamps: clampRows(doses.flatMap((d) => d.lookups)),
        modulated: { ...modulatedSummary(ctx, segments.length, w, ranges), segmentRows: segmentRows(doses, ctx.entry.beamMeterset!) },
      },
      ...levelsOf(policy, category),
      fitness: {
        edgeDistanceCm: w.edgeDistanceCm,
        flags: modulatedFlags(ctx, w.coveredShare, ranges.depthRangeCm[0], data.calibration.dmaxCm, ranges.maxSsdDifferenceMm),
      },
    },
  };
}

/** Every segment's dose per MU at the point, or the first segment's reason the beam cannot be checked. */
function segmentDoses(ctx: BeamCheckContext, data: PhotonBeamModel, segments: readonly Segment[], sadMm: number): SegmentDose[] | Stopped {
  const doses: SegmentDose[] = [];
  for (const s of segments) {
    const d = segmentDose(ctx, data, s, sadMm);
    if (isStopped(d)) return d;
    doses.push(d);
  }
  return doses;
}

/** Over the segments: the range of depths (and, with the CT, of radiological depths and densities), and the CT's largest SSD difference from the plan's. */
function segmentRanges(doses: readonly SegmentDose[]) {
  const depths = doses.map((d) => d.depthCm);
  const radiological = doses.flatMap((d) => (d.radiologicalDepthCm !== undefined ? [d.radiologicalDepthCm] : []));
  const densities = doses.flatMap((d) => (d.densityRange ? [...d.densityRange] : []));
  const ssdDifferences = doses.flatMap((d) => (d.ssdDifferenceMm !== undefined ? [d.ssdDifferenceMm] : []));
  const range = (v: readonly number[]): [number, number] => [Math.min(...v), Math.max(...v)];
  return {
    depthRangeCm: range(depths),
    ...(radiological.length ? { radiologicalDepthRangeCm: range(radiological), densityRange: range(densities) } : {}),
    // The largest difference by magnitude, the first one met on a tie.
    ...(ssdDifferences.length ? { maxSsdDifferenceMm: ssdDifferences.reduce((a, b) => (Math.abs(b) > Math.abs(a) ? b : a)) } : {}),
  };
}

/** Where a modulated beam's depths came from: the CT, or the plan's SSD at each control point (or at the first, the gantry still). */
function depthSourceOf(ctx: BeamCheckContext): 'ct' | 'plan-ssd-per-control-point' | 'plan-ssd' {
  const cps = ctx.beam.controlPoints;
  if (ctx.ct) return 'ct';
  return cps.some((c) => c.gantryAngleDeg !== cps[0]!.gantryAngleDeg) ? 'plan-ssd-per-control-point' : 'plan-ssd';
}

/** How the beam was summed: the method and its sectors, where the depths came from, the heterogeneity correction, what is not modelled. */
function modulatedApproximations(
  ctx: BeamCheckContext,
  data: PhotonBeamModel,
  segments: number,
  w: Weighted,
  ranges: ReturnType<typeof segmentRanges>,
): Note[] {
  const mu = ctx.entry.beamMeterset!;
  const clarkson = { segments, controlPoints: ctx.beam.controlPoints.length, sectors: CLARKSON_SECTORS, leafTransmission: data.mlcTransmission ?? 0 };
  const method = ctx.heterogeneity ?? 'tpr-ratio';
  const corrected = { method, correctionFactor: w.dosePerMuCGy / w.homogeneousPerMuCGy, homogeneousDoseCGy: mu * w.homogeneousPerMuCGy };
  return [
    note('modulated-clarkson', clarkson),
    note('modulated-depths', { source: depthSourceOf(ctx), body: ctx.ct?.bodySource }),
    ...(ranges.radiologicalDepthRangeCm ? [note('modulated-heterogeneity', corrected)] : []),
    leafEndNote(data),
  ];
}

/** The result's account of the modulated sum: control points, segments, gantry range, depth ranges, coverage of the point. */
function modulatedSummary(
  ctx: BeamCheckContext,
  segments: number,
  w: Weighted,
  ranges: ReturnType<typeof segmentRanges>,
): NonNullable<Calculation['modulated']> {
  const cps = ctx.beam.controlPoints;
  const mu = ctx.entry.beamMeterset!;
  return {
    method: 'modified Clarkson integration',
    controlPoints: cps.length,
    segments,
    gantryStartDeg: cps[0]!.gantryAngleDeg,
    gantryEndDeg: cps[cps.length - 1]!.gantryAngleDeg,
    depthSource: depthSourceOf(ctx),
    depthRangeCm: ranges.depthRangeCm,
    ...(ranges.radiologicalDepthRangeCm
      ? {
          radiologicalDepthRangeCm: ranges.radiologicalDepthRangeCm,
          correctionFactor: w.dosePerMuCGy / w.homogeneousPerMuCGy,
          homogeneousDoseCGy: mu * w.homogeneousPerMuCGy,
        }
      : {}),
    ...(ranges.maxSsdDifferenceMm !== undefined ? { maxSsdDifferenceMm: ranges.maxSsdDifferenceMm } : {}),
    pointCoveredMuPercent: 100 * w.coveredShare,
    clarksonMuPercent: 100 * w.clarksonShare,
  };
}

type Weighted = ReturnType<typeof weighted>;

/** Every segment's part of the sum, so the hand calculation of a modulated beam can be audited row by row. */
function segmentRows(doses: readonly SegmentDose[], mu: number): NonNullable<Calculation['modulated']>['segmentRows'] {
  return doses.map((d) => ({
    gantryDeg: d.gantryDeg,
    muShare: d.share,
    depthCm: d.depthCm,
    ...(d.radiologicalDepthCm !== undefined ? { radiologicalDepthCm: d.radiologicalDepthCm } : {}),
    sc: d.sc,
    primaryFluence: d.primaryFluence,
    openWidthCm: d.openWidthCm,
    spTpr: d.spTpr,
    ...(d.scatterSpTpr !== undefined ? { scatterSpTpr: d.scatterSpTpr } : {}),
    dosePerMuCGy: d.dosePerMuCGy * d.correction,
    doseCGy: mu * d.share * d.dosePerMuCGy * d.correction,
  }));
}

/** MU-weighted sums over the segments: each term share × value, added in segment order (one pass, no closure per term). */
function weighted(doses: readonly SegmentDose[]) {
  const w = {
    dosePerMuCGy: 0,
    homogeneousPerMuCGy: 0,
    depthCm: 0,
    ssdCm: 0,
    offAxisCm: 0,
    collimatorXCm: 0,
    collimatorYCm: 0,
    collimatorSquareCm: 0,
    irradiatedSquareCm: 0,
    edgeDistanceCm: 0,
    /** The MU share of segments with an opening (a closed one has no edge to be near). */
    openShare: 0,
    coveredShare: 0,
    clarksonShare: 0,
  };
  for (const d of doses) {
    const s = d.share;
    w.dosePerMuCGy += s * d.dosePerMuCGy * d.correction;
    w.homogeneousPerMuCGy += s * d.dosePerMuCGy;
    w.depthCm += s * d.depthCm;
    w.ssdCm += s * d.ssdCm;
    w.offAxisCm += s * d.offAxisCm;
    w.collimatorXCm += s * d.collimatorFieldCm.x;
    w.collimatorYCm += s * d.collimatorFieldCm.y;
    w.collimatorSquareCm += s * d.collimatorSquareCm;
    w.irradiatedSquareCm += s * d.irradiatedSquareCm;
    if (Number.isFinite(d.edgeDistanceMm)) {
      w.edgeDistanceCm += (s * d.edgeDistanceMm * d.depthScale) / MM_PER_CM;
      w.openShare += s;
    }
    if (d.covered) w.coveredShare += s;
    if (d.clarkson) w.clarksonShare += s;
  }
  if (w.openShare > 0) w.edgeDistanceCm /= w.openShare;
  return w;
}

/** What the engine does not follow in a modulated beam. */
function unsupportedModulation(
  ctx: BeamCheckContext,
): 'modulated-blocks' | 'modulated-wedge' | 'collimator-or-couch-turns' | 'energy-changes' | undefined {
  const cps = ctx.beam.controlPoints;
  const cp0 = cps[0]!;
  if (ctx.beam.blocks.length) return 'modulated-blocks';
  if (cps.some((c) => c.wedgePositions.some((w) => w.position === 'IN'))) return 'modulated-wedge';
  if (cps.some((c) => c.collimatorAngleDeg !== cp0.collimatorAngleDeg || c.couchAngleDeg !== cp0.couchAngleDeg)) return 'collimator-or-couch-turns';
  if (cps.some((c) => c.nominalEnergyMeV !== cp0.nominalEnergyMeV)) return 'energy-changes';
  return undefined;
}

/** A modulated beam's point fitness: covered for most of the MU, in the build-up at some angle, the CT's SSD away from the plan's. */
function modulatedFlags(
  ctx: BeamCheckContext,
  coveredShare: number,
  minDepthCm: number,
  dmaxCm: number,
  maxSsdDifferenceMm: number | undefined,
): Note[] {
  const flags: Note[] = [];
  if (coveredShare > 0.5) flags.push(note('covered-by-leaves', { percent: 100 * coveredShare }));
  if (minDepthCm < dmaxCm) flags.push(note('build-up-some-angles', { minDepthCm, dmaxCm }));
  const tolerance = ctx.policy.ct.ssdToleranceMm;
  if (maxSsdDifferenceMm !== undefined && Math.abs(maxSsdDifferenceMm) > tolerance)
    flags.push(note('ssd-differs-some-angle', { maxDifferenceMm: maxSsdDifferenceMm, toleranceMm: tolerance }));
  return flags;
}
