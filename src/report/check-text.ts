import type { BeamCheck, PlanCheck } from '../model/index.js';
import { clampText, noteText, pointText, reasonTexts } from './note-text.js';
import { CGY_PER_GY, formatIssue } from '../model/index.js';
import type { CheckDocument } from './check-json.js';
import { fixed, pointMm as mm, signed, textTable } from './table.js';
import { planningDepthsText } from './planning-depths-text.js';

const HEADER = [
  'beam',
  'name',
  'energy',
  'setup',
  'depth cm',
  'off-axis cm',
  'rc cm',
  'irr cm',
  'Sc|Se',
  'Sp',
  'TPR/PDD',
  'OAR',
  'WF',
  'MU plan',
  'MU indep',
  'TPS cGy',
  'indep cGy',
  'dev %',
  'tol/action %',
  'verdict',
];

function row(b: BeamCheck): string[] {
  const energy = b.nominalEnergy !== undefined ? `${b.nominalEnergy} ${b.radiationType === 'PHOTON' ? 'MV' : 'MeV'}` : '—';
  if (b.status !== 'checked')
    return [
      String(b.beamNumber),
      b.beamName ?? '—',
      energy,
      '—',
      '—',
      '—',
      '—',
      '—',
      '—',
      '—',
      '—',
      '—',
      '—',
      fixed(b.plannedMu, 1),
      '—',
      fixed(b.planningSystemDoseCGy, 1),
      '—',
      '—',
      '—',
      'not checked',
    ];
  const c = b.calculation;
  const f = (k: string) => c.factors.find((x) => x.key === k)?.value;
  return [
    String(b.beamNumber),
    b.beamName ?? '—',
    energy,
    c.setup,
    c.depthCm.toFixed(2),
    c.offAxisCm.toFixed(2),
    c.collimatorSquareCm.toFixed(2),
    `${c.irradiatedSquareCm.toFixed(2)}${c.factors.some((x) => x.key === 'SpTPR') ? ' (Clarkson)' : c.approximations.some((a) => a.code === 'clarkson-irregular') ? '*' : ''}`,
    fixed(f('Sc') ?? f('Se'), 3),
    fixed(f('Sp'), 3),
    fixed(f('TPR') ?? f('PDD') ?? f('SpTPR'), 4),
    fixed(f('OAR'), 3),
    fixed(f('WF'), 3),
    fixed(b.plannedMu, 1),
    fixed(c.independentMu, 1),
    fixed(b.planningSystemDoseCGy, 1),
    c.independentDoseCGy.toFixed(1),
    signed(c.doseDeviationPercent),
    `${b.tolerancePercent}/${b.actionPercent}`,
    b.verdict,
  ];
}

/** One plan as a physicist reads it: a row per beam, the totals, the point used, the notes. */
export function planCheckText(p: PlanCheck): string[] {
  const out: string[] = [];
  out.push(
    `RT Plan "${p.planLabel}"${p.planName ? ` (${p.planName})` : ''}, patient ${p.patientId ?? '—'}: ${p.issues.length ? 'REFUSED (input error)' : p.verdict.toUpperCase()}${p.fullyVerified || p.issues.length ? '' : ', not fully verified'}`,
  );
  out.push(
    `  file ${p.file}, SHA-256 ${p.fileSha256.slice(0, 16)}…${p.machine ? `; machine ${p.machine.planName} → beam data ${p.machine.dataName} (${p.machine.via})` : ''}`,
  );
  for (const g of p.fractionGroups) {
    out.push(`  fraction group ${g.number}${g.fractionsPlanned !== undefined ? `, ${g.fractionsPlanned} fractions` : ''} (doses per fraction)`);
    out.push(...textTable(HEADER, g.beams.map(row)).map((l) => `    ${l}`));
    for (const t of g.totals) {
      const rx =
        t.prescriptionPerFractionCGy !== undefined
          ? `; prescription ${t.prescriptionPerFractionCGy.toFixed(1)} cGy (independent ${signed(t.independentVsPrescriptionPercent)} %, planning system ${signed(t.planningSystemVsPrescriptionPercent)} %)`
          : '';
      const grid = t.doseGridCGy !== undefined ? `; planning system's dose grid (${t.doseGridSummation}) ${t.doseGridCGy.toFixed(1)} cGy` : '';
      out.push(
        `    total at ${mm(t.pointPatientMm)}, beams ${t.beams.join(', ')}: independent ${t.independentDoseCGy.toFixed(1)} cGy, planning system ${t.planningSystemDoseCGy.toFixed(1)} cGy, ${signed(t.deviationPercent)} %${rx}${grid}${t.complete ? '' : ' (incomplete: some beams at this point not checked)'}`,
      );
    }
  }
  for (const t of p.courseTotals) {
    const grid =
      t.doseGridCGy !== undefined ? `; planning system's dose grid (${t.doseGridSummation}) ${(t.doseGridCGy / CGY_PER_GY).toFixed(2)} Gy` : '';
    out.push(
      `  course total at ${mm(t.pointPatientMm)}: independent ${(t.independentDoseCGy / CGY_PER_GY).toFixed(2)} Gy, planning system ${(t.planningSystemDoseCGy / CGY_PER_GY).toFixed(2)} Gy, ${signed(t.deviationPercent)} %${grid}${t.complete ? '' : ' (incomplete)'}`,
    );
  }
  const notes: string[] = [];
  for (const b of p.fractionGroups.flatMap((g) => g.beams)) {
    const who = `beam ${b.beamNumber}${b.beamName ? ` ${b.beamName}` : ''}`;
    if (b.status !== 'checked') {
      notes.push(`${who}: not checked: ${noteText(b.reason)}`);
      continue;
    }
    notes.push(
      `${who}: point ${mm(b.point.patientMm)}: ${pointText(b.point)}; ${b.calculation.setup} setup, ${noteText(b.calculation.setupBasis)}; category ${b.category}`,
    );
    for (const r of reasonTexts(b)) notes.push(`${who}: ${r}`);
    if (b.doseGridCGy !== undefined)
      notes.push(`${who}: the planning system's per-beam dose grid gives ${b.doseGridCGy.toFixed(1)} cGy at the point`);
    if (b.fitness.suggestion) {
      const s = b.fitness.suggestion;
      notes.push(
        `${who}: a better point at the same depth: ${mm(s.patientMm)} (${s.edgeDistanceCm.toFixed(1)} cm inside the field, ${s.offAxisCm.toFixed(1)} cm off axis)${b.suggestedPoint ? `: independent dose there ${b.suggestedPoint.independentDoseCGy.toFixed(1)} cGy (the planning system's dose there is not in the plan)` : ''}`,
      );
    }
    if (b.calculation.planningSystemDepths) notes.push(`${who}: ${planningDepthsText(b.calculation.planningSystemDepths)}`);
    for (const c of b.calculation.clamps) notes.push(`${who}: ${clampText(c)}`);
    for (const c of b.suggestedPoint?.clamps ?? []) notes.push(`${who}: at the suggested point, ${clampText(c)}`);
  }
  if (notes.length) out.push('  notes:', ...notes.map((n) => `    - ${n}`));
  for (const w of p.warnings) out.push(`  warning: ${noteText(w)}`);
  for (const i of p.issues) out.push(`  ${formatIssue(i)}`);
  return out;
}

/** The whole terminal report: each plan, the batch summary, refused files, the caution. */
export function checkText(doc: CheckDocument): string[] {
  const out: string[] = [
    `plumbline check — beam data ${doc.beamData.machine}, version ${doc.beamData.dataVersion}${doc.beamData.invented ? ' (INVENTED DEMO DATA, never for a patient)' : ''}; deviation = ${doc.deviationDefinition}`,
    '',
  ];
  for (const p of doc.plans) out.push(...planCheckText(p), '');
  const s = doc.summary;
  out.push(
    `summary: ${s.plans} plan(s), ${s.beamsChecked} beam(s) checked, ${s.beamsNotChecked} not checked; ${s.verdicts['within tolerance']} within tolerance, ${s.verdicts['needs review']} need review, ${s.verdicts['beyond action level']} beyond action level; ${s.filesRefused} file(s) refused`,
  );
  for (const i of doc.refused) out.push(`refused: ${formatIssue(i)}`);
  out.push('', doc.caution);
  return out;
}
