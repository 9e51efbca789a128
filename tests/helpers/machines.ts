import { cpSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { type LoadedMachine, loadMachine } from '../../src/beamdata/index.js';
import type { MachineModel } from '../../src/model/index.js';

export const manifestPath = (rel: string) => fileURLToPath(new URL(`../../${rel}`, import.meta.url));
export const DEMO_MANIFEST = manifestPath('fixtures/demo/beam-data/manifest.json');
export const BJR25_MANIFEST = manifestPath('tests/reference/bjr25-machine/manifest.json');
export const KHAN_MANIFEST = manifestPath('tests/reference/khan-ssd-example/manifest.json');

export function machine(file: string): MachineModel {
  const r = loadMachine(file);
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return r.value.machine;
}

export function beam(m: MachineModel, id: string) {
  const b = m.beams.find((x) => x.id === id);
  if (!b) throw new Error(`no beam ${id}`);
  return b;
}

/** A machine's folder copied to a temporary one, its manifest (and, through `dir`, its tables) edited: the new manifest's path. */
export function machineVariant(manifestFile: string, edit: (dir: string, manifest: Record<string, any>) => void): string {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-machine-'));
  cpSync(dirname(manifestFile), dir, { recursive: true });
  const file = join(dir, basename(manifestFile));
  const m = JSON.parse(readFileSync(file, 'utf8'));
  edit(dir, m);
  writeFileSync(file, JSON.stringify(m));
  return file;
}

/** The demo beam data copied to a temporary folder, its manifest edited, loaded (not validated). */
export function demoBeamDataWith(edit: (manifest: Record<string, any>) => void): LoadedMachine {
  const r = loadMachine(machineVariant(DEMO_MANIFEST, (_, m) => edit(m)));
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return r.value;
}
