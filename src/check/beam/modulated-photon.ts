import { type CaseCategory, type Factor, MM_PER_CM, note, type Note } from '../../model/index.js';
import { CLARKSON_SECTORS } from '../field-input.js';
import { isHeterogeneous, levelsOf } from './category.js';
import { beamIdentity, type BeamCheckContext, type BeamOutcome, isStopped, stopNotChecked } from './context.js';
import { clampRows, compareDose, factorRows } from './dose-comparison.js';
import { beamSadMm } from './static-geometry.js';
import { photonBeamData } from './static-photon.js';
import { type SegmentDose, segmentDose } from './segment-dose.js';
import { segmentsOf } from './segments.js';

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
  const cp0 = cps[0]!;
  const data = photonBeamData(ctx);
  if (isStopped(data)) return data.stopped;
  const unsupported = unsupportedModulation(ctx);
  if (unsupported) return stopNotChecked(ctx, unsupported).stopped;
  const sadMm = beamSadMm(ctx);
  if (typeof sadMm !== 'number') return sadMm.stopped;
  const segments = segmentsOf(cps, beam.finalCumulativeMetersetWeight);
  if (!segments.length) return stopNotChecked(ctx, 'no-meterset-delivered').stopped;
  const doses: SegmentDose[] = [];
  for (const s of segments) {
    const d = segmentDose(ctx, data, s, sadMm);
    if (isStopped(d)) return d.stopped;
    doses.push(d);
  }
  const w = weighted(doses);
  const { dosePerMuCGy, homogeneousPerMuCGy } = w;
  const mu = ctx.entry.beamMeterset!;
  const identity = beamIdentity(beam, ctx.entry);
  const depths = doses.map((d) => d.depthCm);
  const radiological = doses.flatMap((d) => (d.radiologicalDepthCm !== undefined ? [d.radiologicalDepthCm] : []));
  const gantryMoves = cps.some((c) => c.gantryAngleDeg !== cp0.gantryAngleDeg);
  const depthSource = ctx.ct ? 'ct' : gantryMoves ? 'plan-ssd-per-control-point' : 'plan-ssd';
  const correctionFactor = dosePerMuCGy / homogeneousPerMuCGy;
  const d0CGyPerMu = data.calibration.doseCGyPerMu;
  const factors: Factor[] = [
    { key: 'D0', value: d0CGyPerMu, args: [] },
    { key: 'MCI', value: dosePerMuCGy / d0CGyPerMu, args: [segments.length, CLARKSON_SECTORS], name: data.tpr?.kind ?? 'TPR' },
  ];
  const approximations: Note[] = [
    note('modulated-clarkson', {
      segments: segments.length,
      controlPoints: cps.length,
      sectors: CLARKSON_SECTORS,
      leafTransmission: data.mlcTransmission ?? 0,
    }),
    note('modulated-depths', { source: depthSource, body: ctx.ct?.bodySource }),
    ...(radiological.length
      ? [
          note('modulated-heterogeneity', {
            method: ctx.heterogeneity ?? 'tpr-ratio',
            correctionFactor,
            homogeneousDoseCGy: mu * homogeneousPerMuCGy,
          }),
        ]
      : []),
    note('leaf-ends-not-modelled'),
  ];
  const densities = doses.flatMap((d) => (d.densityRange ? [...d.densityRange] : []));
  const ssdDifferences = doses.flatMap((d) => (d.ssdDifferenceMm !== undefined ? [d.ssdDifferenceMm] : []));
  // The largest difference by magnitude, the first one met on a tie.
  const maxSsdDifferenceMm = ssdDifferences.length ? ssdDifferences.reduce((a, b) => (Math.abs(b) > Math.abs(a) ? b : a)) : undefined;
  const heterogeneous = radiological.length > 0 && isHeterogeneous(policy, [Math.min(...densities), Math.max(...densities)]);
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
        approximations,
        factors: factorRows(factors),
        dosePerMuCGy,
        ...compareDose(mu, dosePerMuCGy, identity.planningSystemDoseCGy),
        clamps: clampRows(doses.flatMap((d) => d.lookups)),
        modulated: {
          method: 'modified Clarkson integration',
          controlPoints: cps.length,
          segments: segments.length,
          gantryStartDeg: cp0.gantryAngleDeg,
          gantryEndDeg: cps[cps.length - 1]!.gantryAngleDeg,
          depthSource,
          depthRangeCm: [Math.min(...depths), Math.max(...depths)],
          ...(radiological.length
            ? {
                radiologicalDepthRangeCm: [Math.min(...radiological), Math.max(...radiological)] as [number, number],
                correctionFactor,
                homogeneousDoseCGy: mu * homogeneousPerMuCGy,
              }
            : {}),
          ...(maxSsdDifferenceMm !== undefined ? { maxSsdDifferenceMm } : {}),
          pointCoveredMuPercent: 100 * w.coveredShare,
          clarksonMuPercent: 100 * w.clarksonShare,
        },
      },
      ...levelsOf(policy, category),
      fitness: {
        edgeDistanceCm: w.edgeDistanceCm,
        flags: modulatedFlags(ctx, w.coveredShare, Math.min(...depths), data.calibration.dmaxCm, maxSsdDifferenceMm),
      },
    },
  };
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
    w.edgeDistanceCm += (s * d.edgeDistanceMm * d.depthScale) / MM_PER_CM;
    if (d.covered) w.coveredShare += s;
    if (d.clarkson) w.clarksonShare += s;
  }
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
