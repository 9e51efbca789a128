import { validateBeamData } from '../check/index.js';
import type { Issue } from '../model/index.js';
import { resolveBeamDataPath } from './demo-files.js';
import { loadMachine } from '../beamdata/index.js';

/** A machine's beam data validated: every problem found, and what was read when the manifest could be loaded. */
export interface MachineValidation {
  readonly file: string;
  readonly issues: readonly Issue[];
  readonly loaded?: { readonly photonBeams: number; readonly electronBeams: number; readonly tables: number };
}

/** Loads a manifest (or `demo`) and runs every table and cross-table check on it. */
export function validateMachine(manifestArg: string): MachineValidation {
  const file = resolveBeamDataPath(manifestArg);
  const loaded = loadMachine(file);
  if (!loaded.ok) return { file, issues: loaded.issues };
  const lm = loaded.value;
  return {
    file,
    issues: [...(loaded.warnings ?? []), ...validateBeamData(lm)],
    loaded: { photonBeams: lm.machine.beams.length, electronBeams: lm.machine.electronBeams.length, tables: lm.tables.length },
  };
}
