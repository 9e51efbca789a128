import type { Factor, Issue, LookupNote, PhotonBeamModel, PhotonPointInput, PhotonPointOutcome, PhotonPointResult } from '../model/index.js';
import { pddAt, scAt, spAt, tprAt } from './beam-factors.js';
import { clarksonSpTpr } from './clarkson.js';
import { collimatorEquivalentSquareCm, equivalentSquareCm } from './equivalent-square.js';
import { inverseSquareFactor, projectFieldCm } from './inverse-square.js';
import { refusals } from './refusals.js';

/**
 * Dose per MU at a point (AAPM TG-71):
 *   SSD setup: D/MU = D'0 · Sc(rc) · Sp(rd0) · PDD(d, r, SSD)/100 · ((SSD0 + d0)/(SSD + d0))² · OAR · WF · TF
 *   SAD setup: D/MU = D'0 · Sc(rc) · Sp(rd) · TPR(d, rd) · ((SSD0 + d0)/SPD)² · OAR · WF · TF
 * rc: collimator field at the isocenter plane; r, rd0, rd: irradiated field at the surface, at d0
 * below it, and at the point's depth; SPD = SSD + d, the point's distance from the source along
 * the central axis. Returns every factor, or the issues that prevent a number.
 */
export function photonDosePerMu(beam: PhotonBeamModel, sadCm: number, input: PhotonPointInput): PhotonPointOutcome {
  if (!inputIsValid(input)) return { ok: false, issues: checkInput(input) };
  const log: LookupNote[] = [];
  const cal = beam.calibration;
  const { x, y } = input.collimatorFieldCm;
  const d = input.depthCm;
  const ssd = input.ssdCm;
  const spd = ssd + d;
  const collimatorSquare = collimatorEquivalentSquareCm(x, y, beam.collimatorExchangeK ?? 1);
  const irradiatedAtIso = input.irradiatedSquareCm ?? equivalentSquareCm(x, y);
  const surfaceSquare = projectFieldCm(irradiatedAtIso, sadCm, ssd);
  const squareAtD0 = projectFieldCm(irradiatedAtIso, sadCm, ssd + cal.d0Cm);
  const squareAtDepth = projectFieldCm(irradiatedAtIso, sadCm, spd);
  const offAxis = input.offAxisCm ?? 0;
  // With Clarkson integration: the primary's share of Sp·TPR (the off-axis ratio applies to it alone).
  let primaryShare: number | undefined;

  const factors: Factor[] = [
    { key: 'D0', value: cal.doseCGyPerMu, args: [] },
    { key: 'Sc', value: scAt(beam, x, y, log), args: [collimatorSquare] },
  ];
  if (input.setup === 'SSD') {
    factors.push(
      { key: 'Sp', value: spAt(beam, squareAtD0, log), args: [squareAtD0] },
      { key: 'PDD', value: pddAt(beam, d, surfaceSquare, ssd, log) / 100, args: [d, surfaceSquare, ssd], ...pddSource(beam, ssd) },
      { key: 'ISF', value: inverseSquareFactor(cal.ssd0Cm + cal.d0Cm, ssd + cal.d0Cm), args: [cal.ssd0Cm + cal.d0Cm, ssd + cal.d0Cm] },
    );
  } else {
    if (input.clarksonSectors) {
      const c = clarksonSpTpr(beam, d, input.clarksonSectors, log, beam.mlcTransmission ?? 0, input.primaryWeight ?? 1);
      const primary = (input.primaryWeight ?? 1) * c.tpr0;
      primaryShare = primary / (primary + c.meanSpr);
      factors.push({ key: 'SpTPR', value: c.spTpr, args: [d, c.sectors, c.sp0, c.tpr0], name: beam.tpr?.kind ?? 'TPR' });
    } else {
      factors.push(
        { key: 'Sp', value: spAt(beam, squareAtDepth, log), args: [squareAtDepth] },
        { key: 'TPR', value: tprAt(beam, d, squareAtDepth, log), args: [d, squareAtDepth], name: beam.tpr?.kind ?? 'TPR' },
      );
    }
    factors.push({ key: 'ISF', value: inverseSquareFactor(cal.ssd0Cm + cal.d0Cm, spd), args: [cal.ssd0Cm + cal.d0Cm, spd] });
  }
  if (beam.oar) {
    const xAt = beam.oar.offAxisAt === 'depth' ? offAxis : projectFieldCm(offAxis, spd, sadCm);
    const oar = beam.oar.at(d, xAt, log);
    // Clarkson integrates the scatter of the field around the point: the off-axis ratio (the beam's
    // horns, in the primary fluence) applies to the primary only (common practice, no source).
    factors.push(
      primaryShare === undefined || offAxis === 0
        ? { key: 'OAR', value: oar, args: [d, xAt], name: beam.oar.offAxisAt }
        : { key: 'OAR', value: primaryShare * oar + (1 - primaryShare), args: [d, xAt, oar, primaryShare], name: beam.oar.offAxisAt },
    );
  } else if (offAxis !== 0) {
    return {
      ok: false,
      issues: [{ severity: 'error', code: 'missing-table', message: `beam ${beam.id} has no OAR table, so an off-axis point cannot be calculated` }],
    };
  }
  if (input.wedgeId !== undefined) {
    const w = beam.wedges.find((v) => v.id === input.wedgeId);
    if (!w) {
      return {
        ok: false,
        issues: [
          {
            severity: 'error',
            code: 'missing-table',
            message: `beam ${beam.id} has no wedge "${input.wedgeId}"`,
            expected: beam.wedges.map((v) => v.id).join(', ') || 'no wedges',
            found: input.wedgeId,
          },
        ],
      };
    }
    // Wedge factors are measured for square jaw settings: a rectangle takes the square of equal 4A/P.
    // The collimator-exchange weighting is a head-scatter effect of Sc, not of the wedge's ratio.
    const jawSquare = equivalentSquareCm(x, y);
    factors.push(
      w.byDepth
        ? { key: 'WF', value: w.factor.at(d, jawSquare, log), args: [d, jawSquare], name: w.id }
        : { key: 'WF', value: w.factor.at(jawSquare, 0, log), args: [jawSquare], name: w.id },
    );
    // Off axis along the wedge, the wedged / open ratio of the clinic's wedged profiles.
    if (w.profile && input.towardHeelCm !== undefined)
      factors.push({ key: 'WP', value: w.profile.at(d, input.towardHeelCm, log), args: [d, input.towardHeelCm], name: w.id });
  }
  if (input.sweptWedge) {
    if (!beam.sweptWedge) {
      return {
        ok: false,
        issues: [
          {
            severity: 'error',
            code: 'missing-table',
            message: `beam ${beam.id} has no swept-wedge table, so a jaw-swept (dynamic) wedge cannot be calculated`,
            expected: 'a sweptWedge table',
            found: 'none',
          },
        ],
      };
    }
    const { angleDeg, fieldLengthCm } = input.sweptWedge;
    factors.push({ key: 'WF', value: beam.sweptWedge.at(angleDeg, fieldLengthCm, log), args: [fieldLengthCm], name: `swept ${angleDeg}°` });
    if (beam.sweptWedgeProfile && input.towardHeelCm !== undefined) {
      const x = input.towardHeelCm;
      factors.push({ key: 'WP', value: beam.sweptWedgeProfile.at(angleDeg, x, log), args: [x], name: `swept ${angleDeg}°` });
    }
  }
  if (input.trayId !== undefined) {
    const t = beam.trays.find((v) => v.id === input.trayId);
    if (!t) {
      return {
        ok: false,
        issues: [
          {
            severity: 'error',
            code: 'missing-table',
            message: `beam ${beam.id} has no tray "${input.trayId}"`,
            expected: beam.trays.map((v) => v.id).join(', ') || 'no trays',
            found: input.trayId,
          },
        ],
      };
    }
    factors.push({ key: 'TF', value: t.factor, args: [], name: t.id });
  }

  let dosePerMu = 1;
  for (const f of factors) dosePerMu *= f.value;
  if (!Number.isFinite(dosePerMu) || log.some((n) => n.kind === 'out-of-range')) return { ok: false, issues: refusals(log, beam.id) };
  return {
    ok: true,
    value: {
      setup: input.setup,
      dosePerMuCGy: dosePerMu,
      factors,
      geometry: {
        sourceToPointCm: spd,
        collimatorSquareCm: collimatorSquare,
        surfaceSquareCm: surfaceSquare,
        squareAtD0Cm: squareAtD0,
        squareAtDepthCm: squareAtDepth,
        offAxisCm: offAxis,
      },
      clamps: log,
    },
  };
}

/** Where the PDD comes from: the table itself, the table renormalised at d0, or derived from TPR (another SSD, or no table). */
function pddSource(beam: PhotonBeamModel, ssdCm: number): { name?: string } {
  const t = beam.pdd;
  if (!t || Math.abs(ssdCm - t.ssdCm) >= 1e-6) return { name: 'from-tpr' };
  return Math.abs(t.normalizationDepthCm - beam.calibration.d0Cm) < 1e-9 ? {} : { name: 'table-at-d0' };
}

/** MU that deliver `doseCGy` at the point: the dose-per-MU product inverted. */
export function muForDose(result: PhotonPointResult, doseCGy: number): number {
  return doseCGy / result.dosePerMuCGy;
}

/** The common case checked without allocating; checkInput then says what is wrong. */
function inputIsValid(i: PhotonPointInput): boolean {
  return (
    positiveOrAbsent(i.collimatorFieldCm.x) &&
    positiveOrAbsent(i.collimatorFieldCm.y) &&
    positiveOrAbsent(i.irradiatedSquareCm) &&
    nonNegativeOrAbsent(i.depthCm) &&
    positiveOrAbsent(i.ssdCm) &&
    nonNegativeOrAbsent(i.offAxisCm)
  );
}
function positiveOrAbsent(v: number | undefined): boolean {
  return v === undefined || (Number.isFinite(v) && v > 0);
}
function nonNegativeOrAbsent(v: number | undefined): boolean {
  return v === undefined || (Number.isFinite(v) && v >= 0);
}

function checkInput(i: PhotonPointInput): Issue[] {
  const out: Issue[] = [];
  const need = (name: string, v: number | undefined, min: number, strict: boolean) => {
    if (v === undefined) return;
    if (!Number.isFinite(v) || (strict ? v <= min : v < min)) {
      out.push({
        severity: 'error',
        code: 'invalid-option',
        message: `${name} must be a finite number ${strict ? '>' : '>='} ${min}`,
        expected: `${strict ? '>' : '>='} ${min}`,
        found: String(v),
      });
    }
  };
  need('field X (cm)', i.collimatorFieldCm.x, 0, true);
  need('field Y (cm)', i.collimatorFieldCm.y, 0, true);
  need('irradiated equivalent square (cm)', i.irradiatedSquareCm, 0, true);
  need('depth (cm)', i.depthCm, 0, false);
  need('SSD (cm)', i.ssdCm, 0, true);
  need('off-axis distance (cm)', i.offAxisCm, 0, false);
  return out;
}
