import { z } from 'zod';
import { IssueJson, Plan, PlanSource } from '../model/index.js';

/** The `inspect --json` document. Bump `schemaVersion` on any change a consumer could notice. */
export const InspectDocument = z.object({
  schemaVersion: z.literal(1),
  kind: z.literal('plumbline.inspect'),
  tool: z.object({ name: z.literal('plumbline'), version: z.string() }),
  plans: z.array(z.object({ source: PlanSource, plan: Plan, warnings: z.array(IssueJson) })),
  problems: z.array(IssueJson),
  caution: z.string(),
});
export type InspectDocument = z.infer<typeof InspectDocument>;
