/**
 * Imported first by the command line: zod parses without building its compiled fast paths. A
 * command makes a handful of parses (beam data, policy, one plan, the result), for which compiling
 * cost more than it saved: about 10 % of `plumbline check` on one plan. Batch workers keep them.
 */
import { z } from 'zod';

z.config({ jitless: true });
