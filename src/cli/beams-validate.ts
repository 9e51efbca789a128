import { loadMachine, validateTables } from '../beamdata/index.js';
import type { Issue } from '../model/index.js';
import { formatIssue } from '../model/index.js';
import { pddTprAgreement, referenceFieldFactors } from '../physics/index.js';
import { CAUTION } from '../report/caution.js';
import { resolveBeamDataPath } from './beam-data-path.js';
import type { CommandOutcome } from './outcome.js';

/** Largest PDD/TPR disagreement (after exact conversion) accepted between two measured tables. */
const PDD_TPR_TOLERANCE_PERCENT = 1;
/** Sc and Sp of the reference field must be 1 within this. */
const REFERENCE_TOLERANCE = 0.005;

/** `plumbline beams validate`: every problem with file:line:column; exit 0 clean, 1 warnings, 2 errors. */
export function runBeamsValidate(manifestArg: string): CommandOutcome {
  const file = resolveBeamDataPath(manifestArg);
  const loaded = loadMachine(file);
  if (!loaded.ok) return finish(file, loaded.issues);
  const lm = loaded.value;
  const issues: Issue[] = [...loaded.warnings, ...validateTables(lm)];
  for (const [bi, beam] of lm.machine.beams.entries()) {
    const ref = referenceFieldFactors(beam, lm.machine.sadCm);
    for (const [name, side, v] of [['Sc', ref.scCm, ref.sc], ['Sp', ref.spCm, ref.sp]] as const) {
      if (!(Math.abs(v - 1) <= REFERENCE_TOLERANCE)) {
        issues.push({ severity: 'error', code: 'physical-range', file, path: `beams[${bi}].calibration`,
          message: `beam ${beam.id}: ${name} of the reference field (${side.toFixed(2)} cm, as defined ${beam.calibration.referenceFieldAt === 'surface' ? 'at the surface' : 'at the normalization point'}) is not 1`,
          expected: `1.000 ± ${REFERENCE_TOLERANCE}`, found: Number.isFinite(v) ? v.toFixed(4) : 'outside the table' });
      }
    }
    const agreement = pddTprAgreement(beam);
    if (agreement) {
      const pddTable = lm.tables.find((t) => t.beamId === beam.id && t.quantity === 'pdd')!;
      const bad = agreement.differences.filter((d) => Math.abs(d.differencePercent) > PDD_TPR_TOLERANCE_PERCENT);
      for (const d of bad) {
        const n = pddTable.lookup.columns!.values.length;
        issues.push({ severity: 'error', code: 'tables-disagree', file: pddTable.csv.file, ...pddTable.csv.valuePositions[d.row * n + d.column]!,
          message: `beam ${beam.id}: PDD at ${d.depthCm} cm for ${d.surfaceSideCm} cm converted to ${beam.tpr!.kind} differs from the ${beam.tpr!.kind} table by ${d.differencePercent.toFixed(2)} %`,
          expected: `within ±${PDD_TPR_TOLERANCE_PERCENT} %`, found: `${d.differencePercent.toFixed(2)} %` });
      }
    }
  }
  return finish(file, issues, lm.machine.beams.length, lm.tables.length);
}

function finish(file: string, issues: readonly Issue[], beams?: number, tables?: number): CommandOutcome {
  const errors = issues.filter((i) => i.severity === 'error').length;
  const warnings = issues.length - errors;
  const summary = `${file}: ${beams !== undefined ? `${beams} beam(s), ${tables} table(s), ` : ''}${errors} error(s), ${warnings} warning(s)`;
  return { stdout: [...issues.map(formatIssue), summary, CAUTION], stderr: [], exitCode: errors ? 2 : warnings ? 1 : 0 };
}
