import { comparePublishedPdd, type LoadedMachine, PUBLISHED_TOLERANCE_PERCENT, validateTables } from '../beamdata/index.js';
import type { ElectronBeamModel, Issue } from '../model/index.js';
import { pddTprAgreement, referenceFieldFactors } from '../physics/index.js';
import { coverageIssues, effectiveSsdIssues } from './validate-coverage.js';
import {
  compareElectronEnergy,
  E0_PER_R50_MEV_PER_CM,
  ELECTRON_ENERGY_TOLERANCE_PERCENT,
  PRACTICAL_RANGE_TOLERANCE_PERCENT,
  RP_PER_MEV_CM,
} from './electron-energy.js';

/** Largest PDD/TPR disagreement (after exact conversion) accepted between two measured tables. */
const PDD_TPR_TOLERANCE_PERCENT = 1;
/**
 * IEC 61217 turns the wedge filter frame counterclockwise about the beam axis seen from the source
 * (x to the right, y up): 90 degrees takes −Y to +X and +Y to −X.
 */
const QUARTER_TURN = { '-Y': '+X', '+Y': '-X' } as const;

/** Sc and Sp of the reference field must be 1 within this. */
const REFERENCE_TOLERANCE = 0.005;

/**
 * Every problem of a loaded machine's beam data: the tables' own checks, and those that need the
 * physics (Sc = Sp = 1 for the reference field as calibrated; PDD and TPR agreeing after conversion).
 */
export function validateBeamData(lm: LoadedMachine): Issue[] {
  const issues: Issue[] = [...validateTables(lm), ...coverageIssues(lm), ...effectiveSsdIssues(lm)];
  const heel = lm.machine.wedgeHeel;
  if (heel && QUARTER_TURN[heel.atOrientation0] !== heel.atOrientation90)
    issues.push({
      severity: 'error',
      code: 'inconsistent',
      file: lm.manifestFile,
      path: 'machine.wedgeHeel',
      message:
        'the heel at Wedge Orientation 90 must be a quarter turn counterclockwise (IEC 61217, seen from the source) from the heel at 0: ' +
        'one of the two was read in another sense',
      expected: `${heel.atOrientation0} at 0 with ${QUARTER_TURN[heel.atOrientation0]} at 90`,
      found: `${heel.atOrientation0} with ${heel.atOrientation90}`,
    });
  if (!lm.manifest.approval)
    issues.push({
      severity: 'warning',
      code: 'missing-attribute',
      file: lm.manifestFile,
      path: 'approval',
      message: 'the beam data do not record who approved them for clinical use, and when: every report will say so',
      expected: '{ "approvedOn": "YYYY-MM-DD", "approvedBy": "name, role" }',
    });
  for (const [bi, beam] of lm.machine.beams.entries()) {
    // A transcription error shows against what a beam of that quality should look like.
    for (const r of comparePublishedPdd(beam).rows.filter((x) => Math.abs(x.differencePercent) > PUBLISHED_TOLERANCE_PERCENT))
      issues.push({
        severity: 'warning',
        code: 'physical-range',
        file: lm.manifestFile,
        path: `beams[${bi}].pdd`,
        message:
          `beam ${beam.id}: PDD(${r.depthCm} cm, 10 × 10, SSD 100) differs from the published data of the same beam quality ` +
          `(BJR Supplement 25) by ${r.differencePercent.toFixed(1)} %: a shifted or mistyped column? (plumbline beams compare-published)`,
        expected: `${r.publishedPercent.toFixed(1)} % ± ${PUBLISHED_TOLERANCE_PERCENT} %`,
        found: `${r.clinicPercent.toFixed(1)} %`,
      });
    const ref = referenceFieldFactors(beam, lm.machine.sadCm);
    for (const [name, side, v] of [
      ['Sc', ref.scCm, ref.sc],
      ['Sp', ref.spCm, ref.sp],
    ] as const) {
      if (!(Math.abs(v - 1) <= REFERENCE_TOLERANCE)) {
        issues.push({
          severity: 'error',
          code: 'physical-range',
          file: lm.manifestFile,
          path: `beams[${bi}].calibration`,
          message:
            `beam ${beam.id}: ${name} of the reference field (${side.toFixed(2)} cm, ` +
            `as defined ${beam.calibration.referenceFieldAt === 'surface' ? 'at the surface' : 'at the normalization point'}) is not 1`,
          expected: `1.000 ± ${REFERENCE_TOLERANCE}`,
          found: Number.isFinite(v) ? v.toFixed(4) : 'outside the table',
        });
      }
    }
    const agreement = pddTprAgreement(beam);
    if (!agreement) continue;
    const pddTable = lm.tables.find((t) => t.beamId === beam.id && t.quantity === 'pdd')!;
    const n = pddTable.lookup.columns!.values.length;
    for (const d of agreement.differences.filter((x) => Math.abs(x.differencePercent) > PDD_TPR_TOLERANCE_PERCENT)) {
      issues.push({
        severity: 'error',
        code: 'tables-disagree',
        file: pddTable.csv.file,
        ...pddTable.csv.valuePositions[d.row * n + d.column]!,
        message:
          `beam ${beam.id}: PDD at ${d.depthCm} cm for ${d.surfaceSideCm} cm converted to ${beam.tpr!.kind} ` +
          `differs from the ${beam.tpr!.kind} table by ${d.differencePercent.toFixed(2)} %`,
        expected: `within ±${PDD_TPR_TOLERANCE_PERCENT} %`,
        found: `${d.differencePercent.toFixed(2)} %`,
      });
    }
  }
  for (const [bi, beam] of lm.machine.electronBeams.entries())
    issues.push(...electronEnergyWarnings(beam, `electronBeams[${bi}].pdd`, lm.manifestFile));
  return issues;
}

/** An electron PDD against its nominal energy: R50 (E0 ≈ 2.33 MeV/cm × R50) and the practical range (Rp ≈ E/2 cm). */
function electronEnergyWarnings(beam: ElectronBeamModel, path: string, file: string): Issue[] {
  const e = compareElectronEnergy(beam);
  const warn = (message: string, expected: string, found: string): Issue => ({
    severity: 'warning',
    code: 'physical-range',
    file,
    path,
    message: `beam ${beam.id}: ${message}: a table of another energy, or depths in another unit?`,
    expected,
    found,
  });
  const out: Issue[] = [];
  if (e.differencePercent !== undefined && Math.abs(e.differencePercent) > ELECTRON_ENERGY_TOLERANCE_PERCENT)
    out.push(
      warn(
        `its PDD gives R50 ${e.r50Cm!.toFixed(2)} cm, so E0 ≈ ${e.e0MeV!.toFixed(1)} MeV (${E0_PER_R50_MEV_PER_CM} MeV/cm × R50), ` +
          `${e.differencePercent.toFixed(0)} % from the nominal ${beam.nominalEnergyMeV} MeV`,
        `within ±${ELECTRON_ENERGY_TOLERANCE_PERCENT} % of ${beam.nominalEnergyMeV} MeV`,
        `${e.e0MeV!.toFixed(1)} MeV`,
      ),
    );
  const rpCm = RP_PER_MEV_CM * beam.nominalEnergyMeV;
  if (e.rpDifferencePercent !== undefined && Math.abs(e.rpDifferencePercent) > PRACTICAL_RANGE_TOLERANCE_PERCENT)
    out.push(
      warn(
        `its PDD gives a practical range of ${e.rpCm!.toFixed(2)} cm, ${e.rpDifferencePercent.toFixed(0)} % from ` +
          `E/2 = ${rpCm.toFixed(1)} cm for ${beam.nominalEnergyMeV} MeV`,
        `within ±${PRACTICAL_RANGE_TOLERANCE_PERCENT} % of ${rpCm.toFixed(1)} cm`,
        `${e.rpCm!.toFixed(2)} cm`,
      ),
    );
  return out;
}
