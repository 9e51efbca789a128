import { z } from 'zod';
import { DEFAULT_POLICY } from '../check/policy.js';
import { choosePoint } from '../check/choose-point.js';
import { importPlanFile } from '../dicom/index.js';
import { beamFrame, ctDepth, ctSsdAlongAxisMm } from '../geometry/index.js';
import type { Issue } from '../model/index.js';
import { formatIssue } from '../model/index.js';
import { CAUTION } from '../report/caution.js';
import { DepthDocument, type DepthRow, depthText } from '../report/depth-report.js';
import type { CommandOutcome } from './outcome.js';
import { loadPatientCts } from './patient-ct.js';
import { VERSION } from './version.js';

const Options = z.object({
  ct: z.array(z.string().min(1)).min(1),
  density: z.string().min(1).optional(),
  bodyThreshold: z.string().regex(/^-?\d+$/, '--body-threshold must be an integer HU').transform(Number).optional(),
  json: z.boolean().default(false),
  structures: z.string().min(1).optional(),
});

/** `plumbline depth`: per beam, the SSD from the plan and from the CT, geometric and radiological depth. */
export function runDepth(planFile: string, raw: Record<string, unknown>): CommandOutcome {
  const parsed = Options.safeParse(raw);
  if (!parsed.success) return refuse(parsed.error.issues.map((i) => ({ severity: 'error', code: 'invalid-option', message: i.message })));
  const o = parsed.data;
  const imported = importPlanFile(planFile);
  if (!imported.ok) return refuse(imported.issues);
  const plan = imported.value.plan;
  const threshold = o.bodyThreshold ?? DEFAULT_POLICY.ct.bodyThresholdHu;
  const cts = loadPatientCts(o.ct, o.density, threshold, o.structures);
  if (!cts.ok) return refuse(cts.issues);
  const ct = cts.value.find((c) => c.volume.frameOfReferenceUid === plan.frameOfReferenceUid);
  if (!ct) {
    return refuse([{ severity: 'error', code: 'inconsistent', file: planFile, path: 'FrameOfReferenceUID', message: 'no CT series in the plan\'s frame of reference',
      expected: `the plan's ${plan.frameOfReferenceUid ?? '(none)'}`, found: cts.value.map((c) => c.volume.frameOfReferenceUid).join(', ') }]);
  }
  const rows: DepthRow[] = [];
  for (const g of plan.fractionGroups) {
    for (const entry of g.beams) {
      const beam = plan.beams.find((b) => b.number === entry.beamNumber)!;
      const cp0 = beam.controlPoints[0]!;
      const position = plan.patientSetups.find((s) => s.number === beam.patientSetupNumber)?.position ?? plan.patientSetups[0]?.position;
      const point = choosePoint(plan, g, entry, beam);
      const base = { beamNumber: beam.number, ...(beam.name ? { beamName: beam.name } : {}), gantryAngleDeg: cp0.gantryAngleDeg,
        ...(cp0.ssdMm !== undefined ? { planSsdMm: cp0.ssdMm } : {}) };
      const frame = position ? beamFrame(cp0, position, beam.sourceAxisDistanceMm ?? 1000) : undefined;
      if (!point || !frame) {
        rows.push({ ...base, point: { source: 'none', reason: '', patientMm: [0, 0, 0] }, problem: !point ? 'no calculation point' : `patient position ${position ?? 'not given'} not supported` });
        continue;
      }
      const axis = ctSsdAlongAxisMm(ct.volume, frame.sourcePatientMm, frame.directionPatient, 2 * (beam.sourceAxisDistanceMm ?? 1000), threshold, ct.bodyMask);
      const d = ctDepth(ct.volume, frame.sourcePatientMm, point.patientMm, { bodyThresholdHu: threshold, density: ct.density, ...(ct.bodyMask ? { bodyMask: ct.bodyMask } : {}) });
      const v = beam.doseVerification.flatMap((x) => x.points).find((p) => p.pointDepthMm !== undefined || p.ssdMm !== undefined);
      const theirs = { ...(v?.pointDepthMm ?? entry.pointDepthMm) !== undefined ? { depthMm: (v?.pointDepthMm ?? entry.pointDepthMm)! } : {},
        ...(v?.equivalentDepthMm ?? entry.equivalentDepthMm) !== undefined ? { equivalentDepthMm: (v?.equivalentDepthMm ?? entry.equivalentDepthMm)! } : {},
        ...(v?.ssdMm ?? entry.pointSsdMm) !== undefined ? { ssdMm: (v?.ssdMm ?? entry.pointSsdMm)! } : {} };
      rows.push({
        ...base,
        point: { source: point.source, reason: point.reason, patientMm: point.patientMm },
        ...(axis !== undefined ? { ctSsdAlongAxisMm: axis, ...(cp0.ssdMm !== undefined ? { ssdDifferenceMm: axis - cp0.ssdMm } : {}) } : {}),
        ...(d.ok ? { entryPatientMm: [...d.value.entryPatientMm] as [number, number, number], geometricDepthMm: d.value.geometricDepthMm,
          radiologicalDepthMm: d.value.radiologicalDepthMm, densityRange: [...d.value.densityRange] as [number, number],
          ...(d.value.nearestInterfaceMm !== undefined ? { nearestInterfaceMm: d.value.nearestInterfaceMm } : {}) } : { problem: d.message }),
        ...(Object.keys(theirs).length ? { planningSystem: theirs } : {}),
      });
    }
  }
  const doc = DepthDocument.parse({
    schemaVersion: 1, kind: 'plumbline.depth', tool: { name: 'plumbline', version: VERSION }, plan: planFile,
    ct: { seriesInstanceUid: ct.volume.seriesInstanceUid, frameOfReferenceUid: ct.volume.frameOfReferenceUid, slices: ct.volume.slices, bodyThresholdHu: threshold, body: ct.bodySource, densityTable: ct.densityTable },
    beams: rows, caution: CAUTION,
  });
  return { stdout: o.json ? [JSON.stringify(doc, null, 2)] : depthText(doc), stderr: [], exitCode: rows.some((r) => r.problem) ? 2 : 0 };
}

function refuse(issues: readonly Issue[]): CommandOutcome {
  return { stdout: [], stderr: issues.map(formatIssue), exitCode: 2 };
}
