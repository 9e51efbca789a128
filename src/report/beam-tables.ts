import type { BeamCheck, CheckedBeam, FractionGroupCheck } from '../model/index.js';
import { deviationText, fixed, textTable } from './table.js';

/** A beam's name cut to a column's width. */
const NAME_WIDTH = 12;
const short = (s: string | undefined) => (s === undefined ? '—' : s.length > NAME_WIDTH ? `${s.slice(0, NAME_WIDTH - 1)}…` : s);
const energyOf = (b: BeamCheck) => (b.nominalEnergy !== undefined ? `${b.nominalEnergy} ${b.radiationType === 'PHOTON' ? 'MV' : 'MeV'}` : '—');

const MAIN = ['beam', 'name', 'energy', 'setup', 'depth cm', 'MU plan', 'MU indep', 'TPS cGy', 'indep cGy', 'dev %', 'verdict'];

/** The group's beams as a physicist scans them: geometry, MU, doses, deviation, verdict (fits 120 columns). */
export function beamTable(g: FractionGroupCheck): string[] {
  return textTable(
    MAIN,
    g.beams.map((b) => {
      const c = b.status === 'checked' ? b.calculation : undefined;
      return [
        String(b.beamNumber),
        short(b.beamName),
        energyOf(b),
        c?.setup ?? '—',
        fixed(c?.depthCm, 2),
        fixed(b.plannedMu, 1),
        fixed(c?.independentMu, 1),
        fixed(b.planningSystemDoseCGy, 1),
        fixed(c?.independentDoseCGy, 1),
        deviationText(b),
        b.status === 'checked' ? b.verdict : 'not checked',
      ];
    }),
  );
}

/** One column of the factor table: its header and how a beam fills it (undefined: the beam has no such factor). */
interface FactorColumn {
  readonly header: string;
  readonly value: (b: CheckedBeam) => string | undefined;
}

const factor =
  (key: string, digits: number, scale = 1) =>
  (b: CheckedBeam) => {
    const f = b.calculation.factors.find((x) => x.key === key);
    return f === undefined ? undefined : (scale * f.value).toFixed(digits);
  };

/** Static photon beams with the CT carry the heterogeneity correction outside their factors; elsewhere it is inside them. */
const separateCorrection = (b: CheckedBeam) => b.radiationType === 'PHOTON' && !b.calculation.modulated && b.calculation.ct !== undefined;

/** Every factor a dose can rest on, in the order of the formalism; only those some beam of the group has become columns. */
const FACTOR_COLUMNS: readonly FactorColumn[] = [
  { header: "D'0 cGy/MU", value: factor('D0', 4) },
  { header: 'Sc', value: factor('Sc', 4) },
  { header: 'Se', value: factor('Se', 4) },
  { header: 'Sp', value: factor('Sp', 4) },
  { header: 'PDD %', value: factor('PDD', 2, 100) },
  { header: 'TPR', value: factor('TPR', 4) },
  { header: 'Sp·TPR', value: factor('SpTPR', 4) },
  { header: 'MCI', value: factor('MCI', 4) },
  { header: 'ISF', value: factor('ISF', 4) },
  { header: 'OAR', value: factor('OAR', 4) },
  { header: 'WF', value: factor('WF', 4) },
  { header: 'WP', value: factor('WP', 4) },
  { header: 'TF', value: factor('TF', 4) },
  { header: 'CF', value: (b) => (separateCorrection(b) ? b.calculation.ct!.correctionFactor.toFixed(4) : undefined) },
];

/**
 * The factors of each checked beam, one column per factor present in the group, so that a row's
 * factors multiply to its dose per MU (PDD shown in percent, divided by 100 in the product); the
 * field sizes they were looked up at before them.
 */
export function factorTable(g: FractionGroupCheck): string[] {
  const beams = g.beams.filter((b): b is CheckedBeam => b.status === 'checked');
  if (!beams.length) return [];
  const columns = FACTOR_COLUMNS.filter((col) => beams.some((b) => col.value(b) !== undefined));
  const header = ['beam', 'off-axis cm', 'rc cm', 'irr cm', ...columns.map((c) => c.header), 'D/MU cGy'];
  const rows = beams.map((b) => {
    const c = b.calculation;
    const irregular = c.factors.some((x) => x.key === 'SpTPR')
      ? ' (Clarkson)'
      : c.approximations.some((a) => a.code === 'clarkson-irregular')
        ? '*'
        : '';
    return [
      String(b.beamNumber),
      c.offAxisCm.toFixed(2),
      c.collimatorSquareCm.toFixed(2),
      `${c.irradiatedSquareCm.toFixed(2)}${irregular}`,
      ...columns.map((col) => col.value(b) ?? '—'),
      c.dosePerMuCGy.toFixed(4),
    ];
  });
  return textTable(header, rows);
}

/** What the headers of the factor table mean. */
export const FACTOR_LEGEND =
  "rc: collimator (jaw) equivalent square and irr: irradiated equivalent square, at the isocenter plane; D'0: dose per MU in the calibration geometry; " +
  'Sc, Se: collimator (electron applicator) output; Sp: phantom scatter; ISF: inverse square; OAR: off-axis ratio; WF, WP: wedge factor and profile; ' +
  "TF: tray factor; MCI: a modulated beam's integrated factor; CF: heterogeneity correction; a row's factors multiply to its D/MU";
