import { type BeamCheck, type Calculation, type CheckedBeam, formatIssue, type PlanCheck } from '../model/index.js';
import type { CheckDocument } from './check-json.js';
import { escapeHtml as esc } from './html-escape.js';
import { clampText, noteText, pointText, reasonTexts } from './note-text.js';
import { beamDataText } from './beam-data-text.js';
import { planHeadline } from './plan-headline.js';
import { explanationHtml } from './explanation-text.js';
import { personName } from './person-name.js';
import { segmentSection } from './segment-table.js';
import { deviationText, fixed as n, pointMm as mm, signed } from './table.js';

/** Deviation of each checked beam against its tolerance and action-level bands, as inline SVG. */
function deviationChart(beams: readonly CheckedBeam[]): string {
  const rows = beams.filter((b) => b.calculation.doseDeviationPercent !== undefined);
  if (!rows.length) return '';
  const span = Math.max(
    ...rows.map((b) => Math.max(b.actionPercent * 1.5, Math.abs(b.judgedDeviationPercent ?? b.calculation.doseDeviationPercent!) + 1)),
  );
  const width = 640;
  const left = 150;
  const plot = width - left - 20;
  const rowH = 26;
  const x = (v: number) => left + ((v + span) / (2 * span)) * plot;
  const height = rows.length * rowH + 34;
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" aria-label="deviation of ` +
      `each beam against its levels">`,
  ];
  rows.forEach((b, i) => {
    const y = 8 + i * rowH;
    const dev = b.judgedDeviationPercent ?? b.calculation.doseDeviationPercent!;
    parts.push(
      `<text x="4" y="${y + 15}" font-size="11">beam ${b.beamNumber} ${esc(b.beamName ?? '')}</text>`,
      `<rect x="${x(-b.actionPercent)}" y="${y}" width="${x(b.actionPercent) - x(-b.actionPercent)}" height="20" fill="#eee" stroke="#999"/>`,
      `<rect x="${x(-b.tolerancePercent)}" y="${y}" width="${x(b.tolerancePercent) - x(-b.tolerancePercent)}" height="20" fill="#ddd" stroke="#666"/>`,
      `<line x1="${x(dev)}" y1="${y - 2}" x2="${x(dev)}" y2="${y + 22}" stroke="#000" stroke-width="3"/>`,
      // The value beside its mark, on whichever side has room.
      x(dev) > width - 70
        ? `<text x="${x(dev) - 6}" y="${y + 15}" font-size="10" text-anchor="end">${signed(dev)} %</text>`
        : `<text x="${x(dev) + 6}" y="${y + 15}" font-size="10">${signed(dev)} %</text>`,
    );
  });
  const axisY = 8 + rows.length * rowH + 4;
  parts.push(`<line x1="${left}" y1="${axisY}" x2="${left + plot}" y2="${axisY}" stroke="#000"/>`);
  for (const t of [-span, -span / 2, 0, span / 2, span]) {
    parts.push(`<text x="${x(t)}" y="${axisY + 14}" font-size="10" text-anchor="middle">${signed(t)} %</text>`);
  }
  parts.push('</svg>');
  return (
    `<figure>${parts.join('')}<figcaption>Deviation of each beam (black mark) against its tolerance (inner band) and action level (outer ` +
    `band).</figcaption></figure>`
  );
}

/** The calculation of one beam written out the way a physicist writes a hand calculation. */
function handCalculation(b: BeamCheck): string {
  if (b.status !== 'checked') return `<p><b>Beam ${b.beamNumber} ${esc(b.beamName ?? '')}</b>: not checked — ${esc(noteText(b.reason))}</p>`;
  const c = b.calculation;
  const reasons = reasonTexts(b);
  const lines = c.factors.map((f) => `<tr><td>${esc(f.label)}</td><td class="num">${f.value.toFixed(4)}</td></tr>`).join('');
  return `<section class="beam"><h4>Beam ${b.beamNumber} ${esc(b.beamName ?? '')} — ${esc(c.machineBeam)}, ${c.setup} setup</h4>
<p>Point ${mm(b.point.patientMm)}: ${esc(pointText(b.point))}. ${c.setup} setup: ${esc(noteText(c.setupBasis))}. ${esc(depthText(c))},
${c.offAxisCm.toFixed(2)} cm off axis. ${c.modulated ? 'Mean collimator' : 'Collimator'} ${c.collimatorFieldCm.x.toFixed(1)} ×
${c.collimatorFieldCm.y.toFixed(1)} cm (Sc equivalent square ${c.collimatorSquareCm.toFixed(2)} cm),
irradiated equivalent square ${c.irradiatedSquareCm.toFixed(2)} cm at the isocenter plane.${c.wedgeId ? ` Wedge ${esc(c.wedgeId)}.` : ''}</p>
${
  c.ct
    ? `<p>From the CT: SSD ${n(c.ct.ssdAlongAxisMm, 1)} mm along the central axis (plan ${n(c.ct.planSsdMm, 1)} mm), ` +
      `${c.ct.ssdAlongRayMm.toFixed(1)} mm along the ray;
geometric depth ${c.ct.geometricDepthMm.toFixed(1)} mm, radiological depth ${c.ct.radiologicalDepthMm.toFixed(1)} mm along the central axis${
        c.ct.alongRay && c.ct.alongRay.cosine < 0.99995
          ? ` (the ray's distances × ${c.ct.alongRay.cosine.toFixed(4)}, the cosine of its angle to the axis)`
          : ''
      } (densities
${c.ct.densityRange[0].toFixed(2)}–${c.ct.densityRange[1].toFixed(2)}, body ${esc(c.ct.body)});
heterogeneity correction CF = TPR(d_eff)/TPR(d) = ${c.ct.correctionFactor.toFixed(4)}, applied in the dose per MU below (homogeneous dose
${c.ct.homogeneousDoseCGy.toFixed(1)} cGy).</p>`
    : ''
}
<table class="calc">${lines}${
    c.ct ? `<tr><td>heterogeneity correction CF</td><td ` + `class="num">${c.ct.correctionFactor.toFixed(4)}</td></tr>` : ''
  }<tr class="total"><td>dose per MU (cGy/MU)</td><td class="num">${c.dosePerMuCGy.toFixed(4)}</td></tr></table>
${segmentSection(c)}
<p>Dose for ${n(b.plannedMu, 1)} MU = ${n(b.plannedMu, 1)} × ${c.dosePerMuCGy.toFixed(4)} = <b>${c.independentDoseCGy.toFixed(1)} cGy</b>
(planning system ${n(b.planningSystemDoseCGy, 1)} cGy, ${signed(c.doseDeviationPercent)} %).
MU for the planning system's dose = ${n(c.independentMu, 1)} MU (planned ${n(b.plannedMu, 1)} MU, ${signed(c.muDeviationPercent)} %).
Category ${esc(b.category)}: tolerance ${b.tolerancePercent} %, action level ${b.actionPercent} %. Verdict: <b>${esc(b.verdict)}</b>.</p>
${reasons.length ? `<ul>${reasons.map((r) => `<li>${esc(r)}</li>`).join('')}</ul>` : ''}
${b.explanation ? explanationHtml(b.explanation) : ''}
${c.clamps.length ? `<p class="note">Clamped lookups: ${c.clamps.map((x) => esc(clampText(x))).join('; ')}</p>` : ''}</section>`;
}

/** One beam's line in the plan's table. */
function summaryRow(group: number, b: BeamCheck): string {
  const c = b.status === 'checked' ? b.calculation : undefined;
  return `<tr><td>${group}</td><td>${b.beamNumber}</td><td>${esc(b.beamName ?? '')}</td>
<td>${b.nominalEnergy ?? '—'} ${b.radiationType === 'PHOTON' ? 'MV' : 'MeV'}</td><td>${c?.setup ?? '—'}</td><td class="num">${n(c?.depthCm, 2)}</td>
<td class="num">${n(c?.collimatorSquareCm, 2)}</td><td class="num">${n(c?.irradiatedSquareCm, 2)}</td><td class="num">${n(b.plannedMu, 1)}</td>
<td class="num">${n(c?.independentMu, 1)}</td><td class="num">${n(b.planningSystemDoseCGy, 1)}</td><td class="num">${n(c?.independentDoseCGy, 1)}</td>
<td class="num">${deviationText(b)}</td><td>${b.status === 'checked' ? esc(b.verdict) : `not checked: ${esc(noteText(b.reason))}`}</td></tr>`;
}

function planSection(p: PlanCheck): string {
  const beams = p.fractionGroups.flatMap((g) => g.beams);
  const rows = p.fractionGroups.map((g) => g.beams.map((b) => summaryRow(g.number, b)).join('')).join('');
  const totals = p.fractionGroups
    .flatMap((g) =>
      g.totals.map(
        (t) => `<li>Fraction group ${g.number}, point ${mm(t.pointPatientMm)}: independent ${t.independentDoseCGy.toFixed(1)} cGy,
planning system ${t.planningSystemDoseCGy.toFixed(1)} cGy (${signed(t.deviationPercent)} %)${
          t.doseGridCGy !== undefined ? `; planning system's dose ` + `grid (${esc(t.doseGridSummation ?? '')}) ${t.doseGridCGy.toFixed(1)} cGy` : ''
        }${
          t.prescriptionPerFractionCGy !== undefined ? `; prescription ` + `${t.prescriptionPerFractionCGy.toFixed(1)} cGy per fraction` : ''
        }${t.complete ? '' : ' — incomplete'}${t.explanation ? explanationHtml(t.explanation) : ''}</li>`,
      ),
    )
    .join('');
  return (
    `<section class="plan"><h2>RT Plan “${esc(p.planLabel)}”${p.planName ? ` (${esc(p.planName)})` : ''} — ` +
    `${esc(planHeadline(p))}</h2>
<p>Patient ${esc(p.patientId ?? '—')}; SOP Instance UID ${esc(p.sopInstanceUid)}; file ${esc(p.file)}; SHA-256
<code>${p.fileSha256}</code>${p.machine ? `; machine ${esc(p.machine.planName)} → ${esc(p.machine.dataName)} (${esc(p.machine.via)})` : ''}.</p>
<table><thead><tr><th>FG</th><th>beam</th><th>name</th><th>energy</th><th>setup</th><th>depth cm</th><th>rc cm</th><th>irr cm</th><th>MU
plan</th><th>MU indep</th><th>TPS cGy</th><th>indep cGy</th><th>dev %</th><th>verdict</th></tr></thead><tbody>${rows}</tbody></table>
${totals ? `<ul>${totals}</ul>` : ''}
${deviationChart(beams.filter((b): b is CheckedBeam => b.status === 'checked'))}
${beams.map(handCalculation).join('\n')}
${p.warnings.length ? `<p class="note">${p.warnings.map((w) => esc(noteText(w))).join('<br>')}</p>` : ''}
${p.importWarnings.length ? `<p class="note">${p.importWarnings.map((i) => esc(`import ${formatIssue(i)}`)).join('<br>')}</p>` : ''}
${p.issues.length ? `<p class="note">${p.issues.map((i) => esc(i.message)).join('<br>')}</p>` : ''}</section>`
  );
}

/** One self-contained HTML file (no external assets), printable on A4 or Letter, for the chart-round binder. */
export function checkHtml(doc: CheckDocument): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>plumbline check ${esc(doc.createdAt)}</title>
<style>
${printedPage(doc)}
body { font: 10pt/1.35 system-ui, sans-serif; color: #000; max-width: 190mm; margin: auto; }
h1 { font-size: 15pt; } h2 { font-size: 12pt; border-top: 1px solid #000; padding-top: 6px; } h4 { margin: 8px 0 2px; }
table { border-collapse: collapse; margin: 4px 0; } td, th { border: 1px solid #999; padding: 1px 4px; font-size: 8.5pt; }
td.num { text-align: right; font-variant-numeric: tabular-nums; } table.calc td { border: none; border-bottom: 1px dotted #999; }
tr.total td { font-weight: bold; } .note { font-size: 8.5pt; } .caution { border: 2px solid #000; padding: 6px; font-weight: bold; }
section.plan, section.beam { break-inside: avoid-page; } code { font-size: 8pt; word-break: break-all; }
</style></head><body>
<h1>plumbline — independent MU check</h1>
<p class="caution">${esc(doc.caution)}</p>
<p>Created ${esc(doc.createdAt)} by plumbline ${esc(doc.tool.version)}. ${esc(beamDataText(doc.beamData))};
manifest ${esc(doc.beamData.manifest)}, SHA-256 of manifest and tables <code>${doc.beamData.sha256}</code>.
Deviation = ${esc(doc.deviationDefinition)}. Policy: ${esc(doc.policy.description ?? 'custom')}.</p>
<p>Summary: ${doc.summary.plans} plan(s), ${doc.summary.beamsChecked} beam(s) checked, ${doc.summary.beamsNotChecked} not checked;
${doc.summary.verdicts['within tolerance']} within tolerance, ${doc.summary.verdicts['needs review']} need review,
${doc.summary.verdicts['not verified']} not verified,
${doc.summary.verdicts['beyond action level']} beyond action level; ${doc.summary.filesRefused} file(s) refused.</p>
${doc.plans.map(planSection).join('\n')}
${doc.refused.length ? `<h2>Files refused</h2><ul>${doc.refused.map((i) => `<li>${esc(i.file ?? '')}: ${esc(i.message)}</li>`).join('')}</ul>` : ''}
<p class="caution">${esc(doc.caution)}</p>
</body></html>
`;
}

/** Text as a CSS string: quotes, backslashes and line breaks escaped, and nothing that could end the style element. */
const cssString = (t: string) => `"${t.replace(/[\\"<>\n]/g, (c) => `\\${c.charCodeAt(0).toString(16).toUpperCase()} `)}"`;

/** The patient of every plan in the document, as one line, when there is one patient. */
function patientLine(doc: CheckDocument): string {
  const patients = new Map(doc.plans.map((p) => [p.patientId ?? '', p.patientName]));
  if (patients.size !== 1) return doc.plans.length ? 'Several patients: each plan names its own' : '';
  const [id, name] = [...patients][0]!;
  return `Patient ${name ? personName(name) : '(no name)'}, ID ${id || '(none)'}`;
}

/**
 * Every printed page carries the patient (name and ID), the check it belongs to and its page number
 * of the whole; a report of several patients starts each plan on a page of its own.
 */
function printedPage(doc: CheckDocument): string {
  const several = new Set(doc.plans.map((p) => p.patientId ?? '')).size > 1;
  return `@page { size: A4; margin: 18mm 15mm;
  @top-left { content: ${cssString(patientLine(doc))}; font: 8pt system-ui, sans-serif; }
  @top-right { content: ${cssString(`plumbline check ${doc.createdAt.slice(0, 16).replace('T', ' ')} UTC`)}; font: 8pt system-ui, sans-serif; }
  @bottom-left { content: ${cssString("An aid to, never a replacement for, a qualified medical physicist's review")}; font: 7pt system-ui, sans-serif; }
  @bottom-right { content: "page " counter(page) " of " counter(pages); font: 8pt system-ui, sans-serif; } }
${several ? 'section.plan + section.plan { break-before: page; }' : ''}`;
}

/** Where the depth came from, in words: a flat surface, the CT, or the segments of a modulated beam (MU-weighted). */
function depthText(c: Calculation): string {
  const m = c.modulated;
  if (m) {
    const depths = c.approximations.find((x) => x.code === 'modulated-depths') ?? { code: 'modulated-depths', values: { source: m.depthSource } };
    return (
      `MU-weighted over ${m.segments} segments (gantry ${m.gantryStartDeg.toFixed(0)}° to ${m.gantryEndDeg.toFixed(0)}°): depth ` +
      `${c.depthCm.toFixed(2)} cm (${m.depthRangeCm[0].toFixed(2)} to ${m.depthRangeCm[1].toFixed(2)} cm), ` +
      `${noteText(depths).replace(/^depths /, '')}, SSD ${c.ssdCm.toFixed(1)} cm`
    );
  }
  if (c.ct) return `Depth ${c.depthCm.toFixed(2)} cm along the ray from the body surface in the CT (SSD along the ray ${c.ssdCm.toFixed(1)} cm)`;
  return `Depth ${c.depthCm.toFixed(2)} cm below a flat surface at SSD ${c.ssdCm.toFixed(1)} cm`;
}
