import { createHash } from 'node:crypto';
import type { LoadedMachine } from '../beamdata/index.js';
import { InternalError } from '../errors.js';

/** What a result was computed from: the beam data's manifest, its hash, name and version. */
export interface BeamDataStamp {
  readonly manifest: string;
  readonly sha256: string;
  readonly machine: string;
  readonly dataVersion: string;
  readonly invented: boolean;
  /** Every use of beam data follows their validation: how many warnings it left. */
  readonly validationWarnings: number;
  readonly approvedOn?: string;
  readonly approvedBy?: string;
  readonly commissionedOn?: string;
}

const stamps = new WeakMap<LoadedMachine, BeamDataStamp>();
const validated = new WeakMap<LoadedMachine, number>();

/** Marks loaded beam data as validated, with the number of warnings left (see loadBeamData). */
export function markValidated(m: LoadedMachine, warnings: number): void {
  validated.set(m, warnings);
}

function validationWarningsOf(m: LoadedMachine): number {
  const n = validated.get(m);
  // A stamp is only ever made for beam data loaded through the gate: anything else is a bug.
  if (n === undefined) throw new InternalError('beam data used without validation');
  return n;
}

const hashes = new WeakMap<LoadedMachine, string>();

/**
 * The SHA-256 of loaded beam data: over the manifest and every table it names, in a fixed order,
 * once per load, from the very bytes that were parsed (a file changed since cannot slip in).
 */
export function beamDataSha256(m: LoadedMachine): string {
  const known = hashes.get(m);
  if (known) return known;
  const h = createHash('sha256').update(m.manifestBytes);
  const byFile = new Map(m.tables.map((t) => [t.csv.file, t.bytes]));
  for (const f of [...byFile.keys()].sort()) h.update(f.slice(f.lastIndexOf('/') + 1)).update(byFile.get(f)!);
  const sha = h.digest('hex');
  hashes.set(m, sha);
  return sha;
}

/** The stamp of loaded beam data (see beamDataSha256). */
export function beamDataStamp(m: LoadedMachine): BeamDataStamp {
  const known = stamps.get(m);
  if (known) return known;
  const stamp = {
    manifest: m.manifestFile,
    sha256: beamDataSha256(m),
    machine: m.machine.name,
    dataVersion: m.machine.version,
    invented: m.machine.invented,
    validationWarnings: validationWarningsOf(m),
    ...(m.manifest.approval ? { approvedOn: m.manifest.approval.approvedOn, approvedBy: m.manifest.approval.approvedBy } : {}),
    ...(m.manifest.approval?.commissionedOn ? { commissionedOn: m.manifest.approval.commissionedOn } : {}),
  };
  stamps.set(m, stamp);
  return stamp;
}
