import type { Factor, Issue, LookupNote, PhotonBeamModel, PhotonPointInput, PhotonPointOutcome, PhotonPointResult } from '../model/index.js';
import { pddAt, scAt, spAt, tprAt } from './beam-factors.js';
import { collimatorEquivalentSquareCm, equivalentSquareCm } from './equivalent-square.js';
import { inverseSquareFactor, projectFieldCm } from './inverse-square.js';

const fmt = (v: number, digits = 2) => v.toFixed(digits);

/**
 * Dose per MU at a point (AAPM TG-71):
 *   SSD setup: D/MU = D'0 · Sc(rc) · Sp(rd0) · PDD(d, r, SSD)/100 · ((SSD0 + d0)/(SSD + d0))² · OAR · WF · TF
 *   SAD setup: D/MU = D'0 · Sc(rc) · Sp(rd) · TPR(d, rd) · ((SSD0 + d0)/SPD)² · OAR · WF · TF
 * rc: collimator field at the isocenter plane; r, rd0, rd: irradiated field at the surface, at d0
 * below it, and at the point's depth; SPD = SSD + d, the point's distance from the source along
 * the central axis. Returns every factor, or the issues that prevent a number.
 */
export function photonDosePerMu(beam: PhotonBeamModel, sadCm: number, input: PhotonPointInput): PhotonPointOutcome {
  const bad = checkInput(input);
  if (bad.length) return { ok: false, issues: bad };
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

  const factors: Factor[] = [{ key: 'D0', label: "D'0", value: cal.doseCGyPerMu, unit: 'cGy/MU' }];
  factors.push({ key: 'Sc', label: `Sc(${fmt(collimatorSquare)} cm)`, value: scAt(beam, x, y, log), unit: '' });
  if (input.setup === 'SSD') {
    factors.push({ key: 'Sp', label: `Sp(${fmt(squareAtD0)} cm)`, value: spAt(beam, squareAtD0, log), unit: '' });
    factors.push({ key: 'PDD', label: `PDD(${fmt(d)} cm, ${fmt(surfaceSquare)} cm, SSD ${fmt(ssd, 1)} cm)/100`,
      value: pddAt(beam, d, surfaceSquare, ssd, log) / 100, unit: '' });
    factors.push({ key: 'ISF', label: `((${fmt(cal.ssd0Cm, 1)} + ${fmt(cal.d0Cm)})/(${fmt(ssd, 1)} + ${fmt(cal.d0Cm)}))²`,
      value: inverseSquareFactor(cal.ssd0Cm + cal.d0Cm, ssd + cal.d0Cm), unit: '' });
  } else {
    factors.push({ key: 'Sp', label: `Sp(${fmt(squareAtDepth)} cm)`, value: spAt(beam, squareAtDepth, log), unit: '' });
    factors.push({ key: 'TPR', label: `${beam.tpr?.kind ?? 'TPR'}(${fmt(d)} cm, ${fmt(squareAtDepth)} cm)`, value: tprAt(beam, d, squareAtDepth, log), unit: '' });
    factors.push({ key: 'ISF', label: `((${fmt(cal.ssd0Cm, 1)} + ${fmt(cal.d0Cm)})/${fmt(spd, 1)})²`,
      value: inverseSquareFactor(cal.ssd0Cm + cal.d0Cm, spd), unit: '' });
  }
  if (offAxis !== 0 || beam.oar) {
    if (!beam.oar && offAxis !== 0) {
      return { ok: false, issues: [{ severity: 'error', code: 'missing-table', message: `beam ${beam.id} has no OAR table, so an off-axis point cannot be calculated` }] };
    }
    if (beam.oar) {
      const xAt = beam.oar.offAxisAt === 'depth' ? offAxis : projectFieldCm(offAxis, spd, sadCm);
      factors.push({ key: 'OAR', label: `OAR(${fmt(d)} cm, ${fmt(xAt)} cm${beam.oar.offAxisAt === 'depth' ? '' : ' at isocenter plane'})`, value: beam.oar.at(d, xAt, log), unit: '' });
    }
  }
  if (input.wedgeId !== undefined) {
    const w = beam.wedges.find((v) => v.id === input.wedgeId);
    if (!w) {
      return { ok: false, issues: [{ severity: 'error', code: 'missing-table', message: `beam ${beam.id} has no wedge "${input.wedgeId}"`,
        expected: beam.wedges.map((v) => v.id).join(', ') || 'no wedges', found: input.wedgeId }] };
    }
    const value = w.byDepth ? w.factor.at(d, collimatorSquare, log) : w.factor.at(collimatorSquare, 0, log);
    factors.push({ key: 'WF', label: `WF ${w.id}(${w.byDepth ? `${fmt(d)} cm, ` : ''}${fmt(collimatorSquare)} cm)`, value, unit: '' });
  }
  if (input.trayId !== undefined) {
    const t = beam.trays.find((v) => v.id === input.trayId);
    if (!t) {
      return { ok: false, issues: [{ severity: 'error', code: 'missing-table', message: `beam ${beam.id} has no tray "${input.trayId}"`,
        expected: beam.trays.map((v) => v.id).join(', ') || 'no trays', found: input.trayId }] };
    }
    factors.push({ key: 'TF', label: `TF ${t.id}`, value: t.factor, unit: '' });
  }

  const refused = log.filter((n) => n.kind === 'out-of-range');
  if (refused.length || factors.some((f) => !Number.isFinite(f.value))) {
    return { ok: false, issues: (refused.length ? refused : [undefined]).map((n) => n
      ? { severity: 'error' as const, code: 'out-of-range' as const,
          message: `${n.table}: ${n.axis} ${fmt(n.requested)} ${n.unit} is outside the table (${fmt(n.range[0])} to ${fmt(n.range[1])} ${n.unit}) and no clamp is allowed there`,
          expected: `${n.axis} within ${fmt(n.range[0])} to ${fmt(n.range[1])} ${n.unit}`, found: `${fmt(n.requested)} ${n.unit}` }
      : { severity: 'error' as const, code: 'physical-range' as const, message: `beam ${beam.id}: a factor is not a finite number` }) };
  }
  let dosePerMu = 1;
  for (const f of factors) dosePerMu *= f.value;
  return {
    ok: true,
    value: {
      setup: input.setup,
      dosePerMuCGy: dosePerMu,
      factors,
      geometry: { sourceToPointCm: spd, collimatorSquareCm: collimatorSquare, surfaceSquareCm: surfaceSquare, squareAtD0Cm: squareAtD0, squareAtDepthCm: squareAtDepth, offAxisCm: offAxis },
      clamps: log,
    },
  };
}

/** MU that deliver `doseCGy` at the point: the dose-per-MU product inverted. */
export function muForDose(result: PhotonPointResult, doseCGy: number): number {
  return doseCGy / result.dosePerMuCGy;
}

function checkInput(i: PhotonPointInput): Issue[] {
  const out: Issue[] = [];
  const need = (name: string, v: number | undefined, min: number, strict: boolean) => {
    if (v === undefined) return;
    if (!Number.isFinite(v) || (strict ? v <= min : v < min)) {
      out.push({ severity: 'error', code: 'invalid-option', message: `${name} must be a finite number ${strict ? '>' : '>='} ${min}`, expected: `${strict ? '>' : '>='} ${min}`, found: String(v) });
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
