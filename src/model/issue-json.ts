import { z } from 'zod';

/** An `Issue` as result documents carry it (the one schema for every document). */
export const IssueJson = z.object({
  severity: z.enum(['error', 'warning']),
  code: z.string(),
  message: z.string(),
  file: z.string().optional(),
  path: z.string().optional(),
  tag: z.string().optional(),
  beamNumber: z.number().optional(),
  beamName: z.string().optional(),
  controlPointIndex: z.number().optional(),
  line: z.number().optional(),
  column: z.number().optional(),
  expected: z.string().optional(),
  found: z.string().optional(),
});
