import type { ElectronBeamModel, ElectronPointInput, ElectronPointOutcome, Factor, Issue, LookupNote } from '../model/index.js';
import { inverseSquareFactor } from './inverse-square.js';
import { refusals } from './refusals.js';

/**
 * Dose per MU at a point of an electron beam (AAPM TG-71):
 *   D/MU = D'0 · Se(applicator, cutout) · PDD(d, cutout, SSD0)/100 · ((SSDeff + d0)/(SSDeff + d0 + g))²
 * with g = SSD − SSD0 the air gap beyond the nominal SSD and SSDeff the applicator's effective
 * (virtual) SSD for the cutout. D'0 is for the reference applicator, open, at d0 (its dmax); Se and
 * each PDD column are at the field's own dmax. For a rectangular cutout X × Y, Se and PDD follow the
 * square-root rule: f(X × Y) = √(f(X × X) · f(Y × Y)). The PDD at an extended SSD is taken as the
 * nominal SSD's (its change is small; the caller says so).
 */
export function electronDosePerMu(beam: ElectronBeamModel, input: ElectronPointInput): ElectronPointOutcome {
  const log: LookupNote[] = [];
  const cal = beam.calibration;
  const app = beam.applicators.find((a) => a.id === input.applicatorId);
  if (!app) {
    return {
      ok: false,
      issues: [
        {
          severity: 'error',
          code: 'missing-table',
          message: `electron beam ${beam.id} has no applicator "${input.applicatorId}"`,
          expected: beam.applicators.map((a) => a.id).join(', '),
          found: input.applicatorId,
        },
      ],
    };
  }
  const bad = checkInput(input);
  if (bad.length) return { ok: false, issues: bad };
  const f = input.field;
  const d = input.depthCm;
  const sides = f.kind === 'rectangle' ? [f.xCm, f.yCm] : [f.sideCm];
  const fieldSideCm = f.kind === 'rectangle' ? Math.sqrt(f.xCm * f.yCm) : f.sideCm;
  const sqrtRule = (value: (side: number) => number) => (sides.length === 2 ? Math.sqrt(value(sides[0]!) * value(sides[1]!)) : value(sides[0]!));
  const se = sqrtRule((s) => app.outputFactor.at(s, 0, log));
  const pdd = electronPddPercent(beam, f, d, log);
  const effectiveSsdCm = typeof app.effectiveSsdCm === 'number' ? app.effectiveSsdCm : app.effectiveSsdCm.at(fieldSideCm, 0, log);
  const gap = input.ssdCm - cal.ssd0Cm;
  const factors: Factor[] = [
    { key: 'D0', value: cal.doseCGyPerMu, args: [] },
    { key: 'Se', value: se, args: sides, name: app.id },
    f.kind === 'rectangle'
      ? { key: 'PDD', value: pdd / 100, args: [d, f.xCm, f.yCm, beam.pdd.ssdCm], name: 'square-root' }
      : { key: 'PDD', value: pdd / 100, args: [d, f.sideCm, beam.pdd.ssdCm] },
    {
      key: 'ISF',
      value: inverseSquareFactor(effectiveSsdCm + cal.d0Cm, effectiveSsdCm + cal.d0Cm + gap),
      args: [effectiveSsdCm + cal.d0Cm, effectiveSsdCm + cal.d0Cm + gap],
      name: `effective SSD ${effectiveSsdCm.toFixed(1)} cm, air gap ${gap.toFixed(1)} cm`,
    },
  ];
  let dosePerMuCGy = 1;
  for (const x of factors) dosePerMuCGy *= x.value;
  if (!Number.isFinite(dosePerMuCGy) || log.some((n) => n.kind === 'out-of-range')) return { ok: false, issues: refusals(log, beam.id) };
  return { ok: true, value: { dosePerMuCGy, factors, airGapCm: gap, effectiveSsdCm, fieldSideCm, clamps: log } };
}

/** The field's PDD (percent) at a depth: the table's, by the square-root rule for a rectangle. NaN (with a note) outside the table. */
export function electronPddPercent(beam: ElectronBeamModel, field: ElectronPointInput['field'], depthCm: number, log: LookupNote[]): number {
  if (field.kind === 'rectangle') return Math.sqrt(beam.pdd.at(depthCm, field.xCm, log) * beam.pdd.at(depthCm, field.yCm, log));
  return beam.pdd.at(depthCm, field.sideCm, log);
}

/** The depth of the field's maximum on the central axis: the table row of its largest PDD. */
export function electronDmaxCm(beam: ElectronBeamModel, field: ElectronPointInput['field']): number | undefined {
  const rows = beam.pdd.rows.values;
  let best: number | undefined;
  let bestValue = -Infinity;
  for (const d of rows) {
    const v = electronPddPercent(beam, field, d, []);
    if (v > bestValue) [best, bestValue] = [d, v];
  }
  return best;
}

/** The depth on the central axis where the PDD falls to `percent` beyond dmax (prescription to an isodose), or undefined. */
export function electronIsodoseDepthCm(beam: ElectronBeamModel, field: ElectronPointInput['field'], percent: number): number | undefined {
  const pdd = (d: number) => {
    const log: LookupNote[] = [];
    const v = electronPddPercent(beam, field, d, log);
    return log.some((n) => n.kind === 'out-of-range') ? Number.NaN : v;
  };
  const dmax = electronDmaxCm(beam, field);
  if (dmax === undefined) return undefined;
  // Past the maximum, the PDD falls monotonically: bisect between the rows that bracket the level.
  const depths = beam.pdd.rows.values.filter((d) => d >= dmax);
  for (let i = 0; i + 1 < depths.length; i++) {
    const [a, b] = [depths[i]!, depths[i + 1]!];
    if (pdd(a) >= percent && pdd(b) < percent) {
      let [lo, hi] = [a, b];
      for (let n = 0; n < 60; n++) {
        const mid = (lo + hi) / 2;
        if (pdd(mid) >= percent) lo = mid;
        else hi = mid;
      }
      return (lo + hi) / 2;
    }
  }
  return undefined;
}

function checkInput(i: ElectronPointInput): Issue[] {
  const out: Issue[] = [];
  const need = (name: string, v: number, min: number, strict: boolean) => {
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
  if (i.field.kind === 'rectangle') {
    need('cutout X (cm)', i.field.xCm, 0, true);
    need('cutout Y (cm)', i.field.yCm, 0, true);
  } else need('cutout equivalent square (cm)', i.field.sideCm, 0, true);
  need('depth (cm)', i.depthCm, 0, false);
  need('SSD (cm)', i.ssdCm, 0, true);
  return out;
}
