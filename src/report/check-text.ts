import type { PlanCheck } from '../model/index.js';
import { CGY_PER_GY, formatIssue } from '../model/index.js';
import { beamTable, FACTOR_LEGEND, factorTable } from './beam-tables.js';
import { beamDataText } from './beam-data-text.js';
import type { CheckDocument } from './check-json.js';
import { explanationLines } from './explanation-text.js';
import { clampText, noteText, pointText, reasonTexts } from './note-text.js';
import { needsAttention, planHeadline } from './plan-headline.js';
import { pointMm as mm, signed, wrap } from './table.js';

/** The terminal report's width: tables are built to fit it, prose is wrapped to it. */
const WIDTH = 120;

export interface CheckTextOptions {
  /** Also a table of every beam's factors (`--factors`). */
  readonly factors?: boolean;
  /** Warnings not to repeat in the plan (said once for the whole run). */
  readonly saidOnce?: ReadonlySet<string>;
}

/** Prose lines wrapped to the report's width, continued under their own indentation. */
const wrapped = (lines: readonly string[]) => lines.flatMap((l) => wrap(l, WIDTH, `${' '.repeat(l.length - l.trimStart().length)}    `));

/** One plan as a physicist reads it: a row per beam, the totals, the point used, the notes. */
export function planCheckText(p: PlanCheck, o: CheckTextOptions = {}): string[] {
  const out: string[] = [];
  out.push(`RT Plan "${p.planLabel}"${p.planName ? ` (${p.planName})` : ''}, patient ${p.patientId ?? '—'}: ` + planHeadline(p).toUpperCase());
  const machine = p.machine ? `; machine ${p.machine.planName} → beam data ${p.machine.dataName} (${p.machine.via})` : '';
  out.push(`  file ${p.file}, SHA-256 ${p.fileSha256.slice(0, 16)}…${machine}`);
  for (const g of p.fractionGroups) {
    out.push(`  fraction group ${g.number}${g.fractionsPlanned !== undefined ? `, ${g.fractionsPlanned} fractions` : ''} (doses per fraction)`);
    out.push(...beamTable(g).map((l) => `    ${l}`));
    if (o.factors) out.push(...factorTable(g).map((l) => `    ${l}`));
    for (const t of g.totals) {
      const rx =
        t.prescriptionPerFractionCGy !== undefined
          ? `; prescription ${t.prescriptionPerFractionCGy.toFixed(1)} cGy (independent ${signed(t.independentVsPrescriptionPercent)} %, planning ` +
            `system ${signed(t.planningSystemVsPrescriptionPercent)} %)`
          : '';
      const grid = t.doseGridCGy !== undefined ? `; planning system's dose grid (${t.doseGridSummation}) ${t.doseGridCGy.toFixed(1)} cGy` : '';
      out.push(
        `    total at ${mm(t.pointPatientMm)}, beams ${t.beams.join(', ')}: independent ${t.independentDoseCGy.toFixed(1)} cGy, planning system ` +
          `${t.planningSystemDoseCGy.toFixed(1)} cGy, ${signed(t.deviationPercent)} ` +
          `%${rx}${grid}${t.complete ? '' : ' (incomplete: some beams at this point not checked)'}`,
      );
      if (t.explanation) out.push(...wrapped(explanationLines(t.explanation).map((l) => `      ${l}`)));
    }
  }
  for (const t of p.courseTotals) {
    const grid =
      t.doseGridCGy !== undefined ? `; planning system's dose grid (${t.doseGridSummation}) ${(t.doseGridCGy / CGY_PER_GY).toFixed(2)} Gy` : '';
    out.push(
      `  course total at ${mm(t.pointPatientMm)}: independent ${(t.independentDoseCGy / CGY_PER_GY).toFixed(2)} Gy, planning system ` +
        `${(t.planningSystemDoseCGy / CGY_PER_GY).toFixed(2)} Gy, ${signed(t.deviationPercent)} %${grid}${t.complete ? '' : ' (incomplete)'}`,
    );
    if (t.explanation) out.push(...wrapped(explanationLines(t.explanation).map((l) => `    ${l}`)));
  }
  const notes: string[] = [];
  for (const b of p.fractionGroups.flatMap((g) => g.beams)) {
    const who = `beam ${b.beamNumber}${b.beamName ? ` ${b.beamName}` : ''}`;
    if (b.status !== 'checked') {
      notes.push(`${who}: not checked: ${noteText(b.reason)}`);
      continue;
    }
    notes.push(
      `${who}: point ${mm(b.point.patientMm)}: ${pointText(b.point)}; ${b.calculation.setup} setup, ${noteText(b.calculation.setupBasis)}; ` +
        `category ${b.category} (tolerance ${b.tolerancePercent} %, action level ${b.actionPercent} %)`,
    );
    for (const r of reasonTexts(b)) notes.push(`${who}: ${r}`);
    if (b.doseGridCGy !== undefined)
      notes.push(`${who}: the planning system's per-beam dose grid gives ${b.doseGridCGy.toFixed(1)} cGy at the point`);
    if (b.fitness.suggestion) {
      const s = b.fitness.suggestion;
      const dose = b.suggestedPoint
        ? `: independent dose there ${b.suggestedPoint.independentDoseCGy.toFixed(1)} cGy (the planning system's dose there is not in the plan)`
        : '';
      notes.push(
        `${who}: a better point at the same depth: ${mm(s.patientMm)} ` +
          `(${s.edgeDistanceCm.toFixed(1)} cm inside the field, ${s.offAxisCm.toFixed(1)} cm off axis)${dose}`,
      );
    }
    for (const line of b.explanation ? explanationLines(b.explanation) : []) notes.push(`${who}: ${line}`);
    for (const c of b.calculation.clamps) notes.push(`${who}: ${clampText(c)}`);
    for (const c of b.suggestedPoint?.clamps ?? []) notes.push(`${who}: at the suggested point, ${clampText(c)}`);
  }
  if (notes.length) out.push('  notes:', ...notes.map((n) => `    - ${n}`));
  for (const w of p.warnings.map(noteText)) if (!o.saidOnce?.has(w)) out.push(`  warning: ${w}`);
  for (const i of p.importWarnings) out.push(`  import ${formatIssue(i)}`);
  for (const i of p.issues) out.push(`  ${formatIssue(i)}`);
  return wrapped(out);
}

/** The whole terminal report: each plan, the warnings every plan shares once, the summary naming the plans to look at, the caution. */
export function checkText(doc: CheckDocument, o: Pick<CheckTextOptions, 'factors'> = {}): string[] {
  const out: string[] = [
    ...wrap(`plumbline check — ${beamDataText(doc.beamData)}`, WIDTH, '  '),
    `deviation = ${doc.deviationDefinition}`,
    "TPS cGy: the planning system's Beam Dose; MU indep: the MU that give it by our dose per MU",
  ];
  if (o.factors) out.push(...wrap(FACTOR_LEGEND, WIDTH, '  '));
  out.push('');
  const shared = sharedWarnings(doc.plans);
  for (const p of doc.plans) out.push(...planCheckText(p, { ...o, saidOnce: new Set(shared.keys()) }), '');
  for (const [w, plans] of shared) out.push(...wrap(`warning for ${plans} plans: ${w}`, WIDTH, '  '));
  const s = doc.summary;
  out.push(
    ...wrap(
      `summary: ${s.plans} plan(s), ${s.beamsChecked} beam(s) checked, ${s.beamsNotChecked} not checked; ${s.verdicts['within tolerance']} within tolerance, ` +
        `${s.verdicts['needs review']} need review, ${s.verdicts['not verified']} not verified, ${s.verdicts['beyond action level']} beyond action level; ` +
        `${s.filesRefused} file(s) refused${doc.refused.length ? ' (each on stderr)' : ''}`,
      WIDTH,
      '  ',
    ),
  );
  const attention = doc.plans.filter(needsAttention);
  if (attention.length) {
    out.push('to look at:', ...attention.map((p) => `  "${p.planLabel}" (${p.file}): ${planHeadline(p)}`));
  }
  out.push('', ...wrap(doc.caution, WIDTH, ''));
  return out;
}

/** The warnings more than one plan of the run carries, worded, with how many plans carry each. */
function sharedWarnings(plans: readonly PlanCheck[]): Map<string, number> {
  const count = new Map<string, number>();
  for (const p of plans) for (const w of new Set(p.warnings.map(noteText))) count.set(w, (count.get(w) ?? 0) + 1);
  return new Map([...count].filter(([, n]) => n > 1));
}
