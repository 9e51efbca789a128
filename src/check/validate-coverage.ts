import type { LoadedMachine } from '../beamdata/index.js';
import type { Issue, TableAxis } from '../model/index.js';

/** An electron beam's virtual source lies below its true one: an effective SSD beyond the nominal SSD by more than this (cm) is a slip. */
const EFFECTIVE_SSD_ABOVE_CM = 5;
/** ... and one shorter than this fraction of the nominal SSD is no applicator's (common practice, no source: 60–100 cm at SSD 100). */
const EFFECTIVE_SSD_BELOW = 0.5;

/** The open-field photon tables the declared range applies to (a wedge's own size limits its tables). */
const OPEN_FIELD_TABLES = new Set(['pdd', 'tpr', 'tmr', 'sc', 'sp', 'scp', 'oar']);

/**
 * Where the open-field photon tables do not reach the field sides and depths the clinic declares it treats
 * (`machine.clinicalRange`): a plan there would clamp or be refused at check time, so say it now,
 * per table, with the edge it has.
 */
export function coverageIssues(lm: LoadedMachine): Issue[] {
  const range = lm.manifest.machine.clinicalRange;
  if (!range) return [];
  const photonIds = new Set(lm.machine.beams.map((b) => b.id));
  const issues: Issue[] = [];
  for (const t of lm.tables.filter((x) => photonIds.has(x.beamId) && OPEN_FIELD_TABLES.has(x.quantity))) {
    for (const a of [t.lookup.rows, t.lookup.columns].filter((x): x is TableAxis => !!x)) {
      const wanted = a.name === 'depth' ? range.depthCm : a.name === 'fieldSide' ? range.fieldSideCm : undefined;
      if (!wanted) continue;
      const [first, last] = [a.values[0]!, a.values[a.values.length - 1]!];
      if (first <= wanted[0] + 1e-9 && last >= wanted[1] - 1e-9) continue;
      const what = a.name === 'depth' ? 'depths' : 'field sides';
      issues.push({
        severity: 'warning',
        code: 'physical-range',
        file: t.csv.file,
        message:
          `${t.beamId} ${t.quantity}: its ${what} run from ${first} to ${last} cm, short of the clinic's declared range ` +
          `${wanted[0]}–${wanted[1]} cm (machine.clinicalRange): a plan beyond it would be clamped or refused`,
        expected: `${what} from ${wanted[0]} cm or less to ${wanted[1]} cm or more`,
        found: `${first}–${last} cm`,
      });
    }
  }
  return issues;
}

/** Effective SSDs no applicator has: beyond the nominal SSD (a virtual source above the real one) or far short of it. */
export function effectiveSsdIssues(lm: LoadedMachine): Issue[] {
  const issues: Issue[] = [];
  for (const [bi, beam] of lm.machine.electronBeams.entries()) {
    const nominal = beam.calibration.ssd0Cm;
    const [lo, hi] = [EFFECTIVE_SSD_BELOW * nominal, nominal + EFFECTIVE_SSD_ABOVE_CM];
    for (const [ai, a] of beam.applicators.entries()) {
      const t = a.effectiveSsdCm;
      const values = typeof t === 'number' ? [t] : [...t.rows.values].map((side) => t.at(side, 0, []));
      const odd = values.filter((v) => v < lo || v > hi);
      if (!odd.length) continue;
      const table = typeof a.effectiveSsdCm === 'number' ? undefined : lm.tables.find((t) => t.lookup === a.effectiveSsdCm);
      issues.push({
        severity: 'warning',
        code: 'physical-range',
        file: table?.csv.file ?? lm.manifestFile,
        ...(table ? {} : { path: `electronBeams[${bi}].applicators[${ai}].effectiveSsdCm` }),
        message:
          `beam ${beam.id} applicator ${a.id}: effective SSD ${odd.map((v) => v.toFixed(1)).join(', ')} cm for a nominal SSD of ${nominal} cm: ` +
          'the virtual source of an electron beam lies below the real one, usually some 60–100 cm from the surface at SSD 100',
        expected: `${lo.toFixed(0)}–${hi.toFixed(0)} cm`,
        found: `${Math.min(...odd).toFixed(1)}–${Math.max(...odd).toFixed(1)} cm`,
      });
    }
  }
  return issues;
}
