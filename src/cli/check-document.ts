import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import type { LoadedMachine } from '../beamdata/index.js';
import { DEFAULT_POLICY, Policy } from '../check/index.js';
import type { Issue, PlanCheck } from '../model/index.js';
import { CAUTION } from '../report/caution.js';
import { CheckDocument } from '../report/check-json.js';
import { checkSummary } from '../report/check-summary.js';
import { VERSION } from './version.js';

/** The versioned result document of some checked plans, with what they were computed from. */
export function checkDocument(plans: readonly PlanCheck[], refused: readonly Issue[], machine: LoadedMachine, policy: Policy): CheckDocument {
  return CheckDocument.parse({
    schemaVersion: 1,
    kind: 'plumbline.check',
    tool: { name: 'plumbline', version: VERSION },
    createdAt: new Date().toISOString(),
    deviationDefinition: '(independent − planning system) / planning system',
    beamData: { manifest: machine.manifestFile, sha256: beamDataSha256(machine), machine: machine.machine.name, dataVersion: machine.machine.version, invented: machine.machine.invented },
    policy: { ...(policy.description ? { description: policy.description } : {}), levels: policy.levels },
    plans,
    refused,
    summary: checkSummary(plans, refused),
    caution: CAUTION,
  });
}

/** The clinic's policy file, or the shipped defaults. */
export function loadPolicy(file: string | undefined): { ok: true; value: Policy } | { ok: false; issues: Issue[] } {
  if (!file) return { ok: true, value: DEFAULT_POLICY };
  let json: unknown;
  try {
    json = JSON.parse(readFileSync(file, 'utf8'));
  } catch (e) {
    return { ok: false, issues: [{ severity: 'error', code: 'invalid-manifest', file, message: `cannot read the policy (${(e as Error).message})` }] };
  }
  const p = Policy.safeParse(json);
  if (!p.success) return { ok: false, issues: p.error.issues.map((i) => ({ severity: 'error' as const, code: 'invalid-manifest' as const, file, path: i.path.join('.'), message: i.message })) };
  return { ok: true, value: p.data };
}

const hashes = new WeakMap<LoadedMachine, string>();

/** SHA-256 over the manifest and every table it names, in a fixed order: what the result was computed from. */
export function beamDataSha256(m: LoadedMachine): string {
  const known = hashes.get(m);
  if (known) return known;
  const h = createHash('sha256').update(readFileSync(m.manifestFile));
  for (const f of [...new Set(m.tables.map((t) => t.csv.file))].sort()) h.update(f.slice(f.lastIndexOf('/') + 1)).update(readFileSync(f));
  const hex = h.digest('hex');
  hashes.set(m, hex);
  return hex;
}
