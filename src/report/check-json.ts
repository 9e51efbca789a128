import { z } from 'zod';
import { IssueJson, PlanCheck } from '../model/index.js';

/** The `check --json` document. Bump schemaVersion on any change a consumer could notice. */
export const CheckDocument = z.object({
  schemaVersion: z.literal(5),
  kind: z.literal('plumbline.check'),
  tool: z.object({ name: z.literal('plumbline'), version: z.string() }),
  createdAt: z.string(),
  deviationDefinition: z.literal('(independent − planning system) / planning system'),
  beamData: z.object({
    manifest: z.string(),
    sha256: z.string(),
    machine: z.string(),
    dataVersion: z.string(),
    invented: z.boolean(),
    /** Beam data are only ever used after their validation passed; the warnings it left. */
    validationWarnings: z.number(),
    approvedOn: z.string().optional(),
    approvedBy: z.string().optional(),
    commissionedOn: z.string().optional(),
  }),
  policy: z.object({
    description: z.string().optional(),
    levels: z.record(z.string(), z.object({ tolerancePercent: z.number(), actionPercent: z.number() })),
  }),
  plans: z.array(PlanCheck),
  refused: z.array(IssueJson),
  summary: z.object({
    plans: z.number(),
    beamsChecked: z.number(),
    beamsNotChecked: z.number(),
    filesRefused: z.number(),
    verdicts: z.object({
      'within tolerance': z.number(),
      'needs review': z.number(),
      'not verified': z.number(),
      'beyond action level': z.number(),
    }),
  }),
  caution: z.string(),
});
export type CheckDocument = z.infer<typeof CheckDocument>;
