import type { Beam, Issue, Plan, PlanSource } from '../model/index.js';
import { formatIssue, jawOpeningMm } from '../model/index.js';
import { fixed, textTable } from './table.js';

const TRANSFER_SYNTAX_NAMES: Readonly<Record<string, string>> = {
  '1.2.840.10008.1.2': 'implicit VR little endian',
  '1.2.840.10008.1.2.1': 'explicit VR little endian',
  '1.2.840.10008.1.2.1.99': 'deflated explicit VR little endian',
  '1.2.840.10008.1.2.2': 'explicit VR big endian',
};

const point = (p: readonly number[] | undefined) => (p ? `(${p.map((v) => v.toFixed(1)).join(', ')}) mm` : '—');

/** A readable summary of one imported plan: header lines, then a row per beam of each fraction group. */
export function planSummary(plan: Plan, source: PlanSource, warnings: readonly Issue[]): string[] {
  const out: string[] = [];
  const date = plan.date ? ` ${plan.date.replace(/^(\d{4})(\d{2})(\d{2})$/, '$1-$2-$3')}` : '';
  out.push(
    `RT Plan "${plan.label}"${plan.name && plan.name !== plan.label ? ` (${plan.name})` : ''}${date}, ${plan.approvalStatus ?? 'approval status not given'}`,
  );
  out.push(
    `  file: ${source.file} (${TRANSFER_SYNTAX_NAMES[source.transferSyntaxUid] ?? source.transferSyntaxUid}` +
      `${source.hasPart10Header ? '' : ', no Part-10 header'})`,
  );
  out.push(`  patient: ${plan.patient.id ?? '—'}, ${plan.patient.name ?? '—'}`);
  const setup = (s: (typeof plan.patientSetups)[number]) =>
    `${s.number} ${s.position ?? s.additionalPosition ?? '—'}${s.setupTechnique ? ` ${s.setupTechnique}` : ''}`;
  out.push(`  setups: ${plan.patientSetups.map(setup).join('; ') || '—'}`);
  for (const d of plan.doseReferences) {
    const rx = d.targetPrescriptionDoseGy !== undefined ? `, prescription ${fixed(d.targetPrescriptionDoseGy, 3)} Gy` : '';
    out.push(
      `  dose reference ${d.number}${d.description ? ` "${d.description}"` : ''}: ${d.type ?? '—'} ` +
        `${d.structureType}${d.pointPatientMm ? ` at ${point(d.pointPatientMm)}` : ''}${rx}`,
    );
  }
  const beamsByNumber = new Map(plan.beams.map((b) => [b.number, b]));
  for (const g of plan.fractionGroups) {
    out.push(
      `  fraction group ${g.number}${g.description ? ` "${g.description}"` : ''}: ${g.fractionsPlanned ?? '—'} fractions, ${g.beams.length} ` +
        `beam(s)${g.beamDoseMeaning ? `, beam dose ${g.beamDoseMeaning}` : ''}`,
    );
    const rows = g.beams.map((rb) => {
      const b = beamsByNumber.get(rb.beamNumber);
      return b ? beamRow(b, rb.beamMeterset, rb.beamDoseGy) : [String(rb.beamNumber), '(not in plan)'];
    });
    out.push(...textTable(BEAM_HEADER, rows).map((l) => `    ${l}`));
  }
  const unreferenced = plan.beams.filter((b) => !plan.fractionGroups.some((g) => g.beams.some((rb) => rb.beamNumber === b.number)));
  if (unreferenced.length) {
    out.push('  beams in no fraction group:');
    out.push(
      ...textTable(
        BEAM_HEADER,
        unreferenced.map((b) => beamRow(b, undefined, undefined)),
      ).map((l) => `    ${l}`),
    );
  }
  for (const w of warnings) out.push(`  ${formatIssue(w)}`);
  return out;
}

const BEAM_HEADER = [
  'beam',
  'name',
  'type',
  'energy',
  'gantry',
  'coll',
  'couch',
  'X1 mm',
  'X2 mm',
  'Y1 mm',
  'Y2 mm',
  'MLC',
  'wedge',
  'applicator',
  'blocks',
  'CPs',
  'MU',
  'dose Gy',
  'SSD mm',
];

function beamRow(b: Beam, mu: number | undefined, doseGy: number | undefined): string[] {
  const cp0 = b.controlPoints[0]!;
  const last = b.controlPoints[b.controlPoints.length - 1]!;
  const jaws = jawOpeningMm(cp0);
  const mlc = b.limitingDevices
    .filter((d) => d.type === 'MLCX' || d.type === 'MLCY')
    .map((d) => `${d.type} ${d.numberOfPairs}`)
    .join(' ');
  const arc = last.gantryAngleDeg !== cp0.gantryAngleDeg ? `→${fixed(last.gantryAngleDeg, 1)} ${cp0.gantryRotation ?? ''}`.trimEnd() : '';
  // Photon beams are named by their nominal accelerating potential (MV), particles by energy (MeV).
  const energyUnit = b.radiationType === 'PHOTON' ? 'MV' : 'MeV';
  return [
    String(b.number),
    b.name ?? '—',
    `${b.radiationType.toLowerCase()} ${b.beamType.toLowerCase()}`,
    cp0.nominalEnergyMeV !== undefined ? `${cp0.nominalEnergyMeV} ${energyUnit}` : '—',
    `${fixed(cp0.gantryAngleDeg, 1)}${arc}`,
    fixed(cp0.collimatorAngleDeg, 1),
    fixed(cp0.couchAngleDeg, 1),
    fixed(jaws.x1, 1),
    fixed(jaws.x2, 1),
    fixed(jaws.y1, 1),
    fixed(jaws.y2, 1),
    mlc || '—',
    b.wedges
      .map((w) => `${w.id ?? w.number}${w.angleDeg !== undefined ? ` ${w.angleDeg}°` : ''}${w.type ? ` ${w.type.toLowerCase()}` : ''}`)
      .join(', ') || '—',
    b.applicators.map((a) => a.id).join(', ') || '—',
    b.blocks.map((k) => `${k.type.toLowerCase()}${k.name ? ` ${k.name}` : ''}`).join(', ') || '—',
    String(b.controlPoints.length),
    fixed(mu, 2),
    fixed(doseGy, 4),
    fixed(cp0.ssdMm, 1),
  ];
}
