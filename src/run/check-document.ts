import type { Policy } from '../check/index.js';
import type { Issue, PlanCheck } from '../model/index.js';
import { CAUTION } from '../report/caution.js';
import { CheckDocument } from '../report/check-json.js';
import { checkSummary } from '../report/check-summary.js';
import type { BeamDataStamp } from './beam-data-stamp.js';
import { VERSION } from './version.js';

/**
 * The versioned result document of some checked plans, with what they were computed from. Pure:
 * the beam data's hash and the time are passed in by the caller, which reads files and the clock.
 */
export function checkDocument(
  plans: readonly PlanCheck[],
  refused: readonly Issue[],
  beamData: BeamDataStamp,
  policy: Policy,
  createdAt: Date,
): CheckDocument {
  return CheckDocument.parse({
    schemaVersion: 5,
    kind: 'plumbline.check',
    tool: { name: 'plumbline', version: VERSION },
    createdAt: createdAt.toISOString(),
    deviationDefinition: '(independent − planning system) / planning system',
    beamData,
    policy: { ...(policy.description ? { description: policy.description } : {}), levels: policy.levels },
    plans,
    refused,
    summary: checkSummary(plans, refused),
    caution: CAUTION,
  });
}
