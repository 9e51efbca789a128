import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { checkPlan, DEFAULT_POLICY } from '../../src/check/index.js';
import { note, type PlanCheck } from '../../src/model/index.js';
import { beamDataStamp, checkDocument, loadBeamData } from '../../src/run/index.js';
import { importOrThrow } from './check-run.js';

const CLINIC = fileURLToPath(new URL('../../fixtures/demo/clinic/', import.meta.url));

/** The demo clinic checked in this process without CT, as `check` documents it (every plan but the pelvis told it has no CT). */
export function demoClinicDocument() {
  const loaded = loadBeamData('demo');
  if (!loaded.ok) throw new Error('demo machine');
  const machine = loaded.value;
  const plans: PlanCheck[] = readdirSync(CLINIC)
    .filter((f) => f.endsWith('.dcm'))
    .sort()
    .map((f) => {
      const p = checkPlan(
        importOrThrow(join(CLINIC, f)),
        { path: f, sha256: '0'.repeat(64) },
        { machine: machine.machine, policy: DEFAULT_POLICY, aliases: new Map(), suggestPoint: false },
      );
      return f === 'pelvis-box.dcm' ? p : { ...p, warnings: [...p.warnings, note('no-ct-in-frame')] };
    });
  return { plans, doc: checkDocument(plans, [], beamDataStamp(machine), DEFAULT_POLICY, new Date(0)) };
}
