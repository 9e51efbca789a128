import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import type { LoadedMachine } from '../beamdata/index.js';

/** What a result was computed from: the beam data's manifest, its hash, name and version. */
export interface BeamDataStamp {
  readonly manifest: string;
  readonly sha256: string;
  readonly machine: string;
  readonly dataVersion: string;
  readonly invented: boolean;
}

const stamps = new WeakMap<LoadedMachine, BeamDataStamp>();

/** The stamp of loaded beam data; its SHA-256 is taken over the manifest and every table it names, in a fixed order, once per load. */
export function beamDataStamp(m: LoadedMachine): BeamDataStamp {
  const known = stamps.get(m);
  if (known) return known;
  const h = createHash('sha256').update(readFileSync(m.manifestFile));
  for (const f of [...new Set(m.tables.map((t) => t.csv.file))].sort()) h.update(f.slice(f.lastIndexOf('/') + 1)).update(readFileSync(f));
  const stamp = {
    manifest: m.manifestFile,
    sha256: h.digest('hex'),
    machine: m.machine.name,
    dataVersion: m.machine.version,
    invented: m.machine.invented,
  };
  stamps.set(m, stamp);
  return stamp;
}
