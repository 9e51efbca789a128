import { planDepths } from '../check/index.js';
import { importPlanFile } from '../dicom/index.js';
import type { Result } from '../model/index.js';
import { CAUTION } from '../report/caution.js';
import { DepthDocument } from '../report/depth-report.js';
import { loadPatientCts } from './patient-cts.js';
import { VERSION } from './version.js';

/** Where `depth` finds the patient: CT series, the density table, the body (threshold or EXTERNAL structure). */
export interface DepthRequest {
  readonly ct: readonly string[];
  readonly density?: string | undefined;
  readonly bodyThresholdHu: number;
  readonly structures?: string | undefined;
}

/** Per beam of a plan: the SSD from the plan and from its CT, geometric and radiological depth, as a versioned document. */
export function planDepthsFromCt(planFile: string, o: DepthRequest): Result<DepthDocument> {
  const imported = importPlanFile(planFile);
  if (!imported.ok) return imported;
  const plan = imported.value.plan;
  const cts = loadPatientCts(o.ct, o.density, o.bodyThresholdHu, o.structures);
  if (!cts.ok) return cts;
  const ct = cts.value.find((c) => c.volume.frameOfReferenceUid === plan.frameOfReferenceUid);
  if (!ct) {
    return {
      ok: false,
      issues: [
        {
          severity: 'error',
          code: 'inconsistent',
          file: planFile,
          path: 'FrameOfReferenceUID',
          message: "no CT series in the plan's frame of reference",
          expected: `the plan's ${plan.frameOfReferenceUid ?? '(none)'}`,
          found: cts.value.map((c) => c.volume.frameOfReferenceUid).join(', '),
        },
      ],
    };
  }
  const v = ct.volume;
  return {
    ok: true,
    value: DepthDocument.parse({
      schemaVersion: 2,
      kind: 'plumbline.depth',
      tool: { name: 'plumbline', version: VERSION },
      plan: planFile,
      ct: {
        seriesInstanceUid: v.seriesInstanceUid,
        frameOfReferenceUid: v.frameOfReferenceUid,
        slices: v.slices,
        bodyThresholdHu: o.bodyThresholdHu,
        body: ct.bodySource,
        densityTable: ct.densityTable,
      },
      beams: planDepths(plan, ct),
      caution: CAUTION,
    }),
  };
}
