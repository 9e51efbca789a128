import { z } from 'zod';
import { Plan, PlanSource } from '../model/index.js';

const IssueJson = z.object({
  severity: z.enum(['error', 'warning']),
  code: z.string(),
  file: z.string().optional(),
  path: z.string().optional(),
  tag: z.string().optional(),
  line: z.number().optional(),
  column: z.number().optional(),
  beamNumber: z.number().optional(),
  beamName: z.string().optional(),
  controlPointIndex: z.number().optional(),
  expected: z.string().optional(),
  found: z.string().optional(),
  message: z.string(),
});

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
