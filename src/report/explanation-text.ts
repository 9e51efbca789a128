import type { DeviationCause, Explanation } from '../model/index.js';
import { escapeHtml as esc } from './html-escape.js';
import { signed } from './table.js';

type Evidence = DeviationCause['evidence'];
const num = (e: Evidence, k: string, digits: number) => (typeof e[k] === 'number' ? (e[k] as number).toFixed(digits) : '—');
const str = (e: Evidence, k: string) => (e[k] === undefined ? '' : String(e[k]));

/** Each cause in plain words, with its evidence. */
const CAUSE_TEXT: Readonly<Record<DeviationCause['code'], (e: Evidence) => string>> = {
  depth: (e) =>
    `depth: ours ${num(e, 'oursCm', 2)} cm, the planning system's ${num(e, 'planningSystemCm', 2)} cm ` +
    `(${signed(e.differenceCm as number, 2)} cm)`,
  heterogeneity: (e) =>
    e.planningSystemCorrection === undefined
      ? `heterogeneity: the planning system ${str(e, 'planningSystem')}; ours ` +
        (e.ourCorrection !== undefined ? `by ${num(e, 'ourCorrection', 4)} (the CT)` : str(e, 'ours'))
      : `heterogeneity: the planning system corrected by ${num(e, 'planningSystemCorrection', 4)} ` +
        `(equivalent depth ${num(e, 'planningSystemEquivalentDepthCm', 2)} cm at ${num(e, 'planningSystemDepthCm', 2)} cm), ` +
        `ours by ${num(e, 'ourCorrection', 4)} (${str(e, 'ours')})`,
  'ssd-ct-vs-plan': (e) =>
    `SSD: the CT's ${num(e, 'ctSsdCm', 1)} cm against the plan's ${num(e, 'planSsdCm', 1)} cm puts the point at ${num(e, 'depthCm', 2)} cm, ` +
    `not ${num(e, 'depthByPlanSsdCm', 2)} cm`,
  gradient: (e) =>
    `the point in a gradient: the planning system's ${str(e, 'grid')} dose changes ${num(e, 'changeFor2MmPercent', 1)} % for a 2 mm shift ` +
    `(${num(e, 'percentPerMm', 2)} %/mm)`,
  'leaf-transmission': (e) =>
    `the point under the leaves for ${num(e, 'coveredMuPercent', 0)} % of the MU: ${num(e, 'throughLeavesPercent', 1)} % of the dose comes through ` +
    `them, so a leaf transmission 20 % different moves the dose ${num(e, 'sensitivityPercent', 1)} %`,
  'field-edge': (e) =>
    `the point ${num(e, 'edgeDistanceCm', 1)} cm from the field edge: the dose there changes ${num(e, 'edgeChangeFor2MmPercent', 1)} % for a 2 mm ` +
    `shift (a ${num(e, 'penumbraMm', 0)} mm penumbra assumed)` +
    (e.profileChangeFor2MmPercent !== undefined ? `, the off-axis profile ${num(e, 'profileChangeFor2MmPercent', 1)} %` : ''),
  'leaf-end-offset': (e) =>
    `leaf ends: with the leaf-end offset ${num(e, 'spreadMm', 1)} mm wider than the beam data's ${num(e, 'gapMm', 1)} mm our dose moves ` +
    `${num(e, 'sensitivityPercent', 1)} %` +
    (e.narrowMuPercent !== undefined ? ` (${num(e, 'narrowMuPercent', 0)} % of the MU through openings under 2 cm at the point)` : ''),
  'extended-ssd': (e) =>
    `extended SSD ${num(e, 'ssdCm', 1)} cm (beyond ${num(e, 'largeSsdCm', 0)} cm)` +
    (e.mayneordAgainstTprPercent !== undefined
      ? `: the PDD carried there by the Mayneord F factor differs ${signed(e.mayneordAgainstTprPercent as number, 1)} % from ours by TPR`
      : ''),
  'machine-alias': (e) => `the plan's machine ${str(e, 'planMachine')} checked with the beam data of ${str(e, 'beamData')} (${str(e, 'via')})`,
  'table-edge': (e) =>
    `beam data: ${str(e, 'table')} looked up at ${str(e, 'axis')} ${num(e, 'requested', 2)} ${str(e, 'unit')}, ` +
    `used at the table's edge ${num(e, 'used', 2)}${(e.clamps as number) > 1 ? ` (and ${(e.clamps as number) - 1} more)` : ''}`,
  'zero-field': (e) =>
    `beam data: the primary rests on TPR and Sp extrapolated to zero field from the smallest measured field ` +
    `(${num(e, 'smallestFieldCm', 1)} cm; the field at the point ${num(e, 'irradiatedSquareCm', 1)} cm, under the leaves for ` +
    `${num(e, 'coveredMuPercent', 0)} % of the MU)`,
  'mu-as-typed': (e) =>
    `MU as typed? ${num(e, 'plannedMu', 1)} MU planned; ${num(e, 'muAtTheOtherBeamsAgreement', 1)} MU would agree as the plan's other beams do ` +
    `(${signed(e.othersMeanDeviationPercent as number, 1)} %)${e.slip ? `: ${str(e, 'slip')}` : ''}`,
};

/** One cause as a line: its words (a total's: the cause and its beams), its contribution with a sign, how sure. */
export function causeText(c: DeviationCause): string {
  const words = c.beams
    ? `${CAUSE_SHORT[c.code] ?? c.code} (beam${c.beams.length > 1 ? 's' : ''} ${c.beams.join(', ')})`
    : CAUSE_TEXT[c.code](c.evidence);
  const share = c.estimated === false ? 'share not estimated' : `${signed(c.contributionPercent, 1)} %`;
  return `${words}: ${share} (${c.confidence})`;
}

/** The explanation as lines for the terminal: the causes, largest first, and what is left. */
export function explanationLines(e: Explanation): string[] {
  const left = `left: ${signed(e.residualPercent, 1)} %${e.unexplained ? ', not explained by the causes plumbline knows' : ''}`;
  return [
    `why it may differ (${signed(e.deviationPercent, 1)} %): ${e.causes.length ? '' : 'no known cause found; '}${left}`,
    ...e.causes.map(causeText),
  ];
}

/** The explanation in the HTML report: a list and a small bar per cause and the residual. */
export function explanationHtml(e: Explanation): string {
  const rows = [
    ...e.causes.map((c) => ({ label: causeText(c), value: c.contributionPercent })),
    { label: 'left unexplained', value: e.residualPercent },
  ];
  const span = Math.max(1, ...rows.map((r) => Math.abs(r.value)));
  const bar = (v: number) => {
    const w = (Math.abs(v) / span) * 80;
    return (
      `<svg width="170" height="12" role="img" aria-label="${signed(v, 1)} %"><line x1="85" y1="0" x2="85" y2="12" stroke="#000"/>` +
      `<rect x="${v < 0 ? 85 - w : 85}" y="2" width="${w}" height="8" fill="#555"/></svg>`
    );
  };
  return (
    `<div class="why"><p><b>Why it may differ</b> (${signed(e.deviationPercent, 1)} %)` +
    `${e.unexplained ? ': mostly not explained by the causes plumbline knows' : ''}</p><table class="calc">` +
    `${rows.map((r) => `<tr><td>${bar(r.value)}</td><td class="num">${signed(r.value, 1)} %</td><td>${esc(r.label)}</td></tr>`).join('')}</table></div>`
  );
}

/** A cause in a few words, for a list of many checks. */
const CAUSE_SHORT: Readonly<Record<string, string>> = {
  depth: 'depth differs',
  heterogeneity: 'heterogeneity correction',
  'ssd-ct-vs-plan': 'SSD: CT against plan',
  gradient: 'point in a gradient',
  'field-edge': 'point near a field edge',
  'leaf-transmission': 'point under the leaves',
  'leaf-end-offset': 'leaf ends',
  'extended-ssd': 'extended SSD',
  'machine-alias': 'machine alias',
  'table-edge': "beam data at a table's edge",
  'zero-field': 'beam data extrapolated to zero field',
  'mu-as-typed': 'MU as typed?',
};

/** The largest cause of a check's beams, as "beam 2: MU as typed? +11.2 %" (codes a newer version wrote are shown as they are). */
export function topCauseText(beamNumber: number | undefined, code: string, contributionPercent: number): string {
  return `${beamNumber !== undefined ? `beam ${beamNumber}: ` : ''}${CAUSE_SHORT[code] ?? code} ${signed(contributionPercent, 1)} %`;
}
