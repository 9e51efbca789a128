import { type LoadedMachine, loadMachine } from '../beamdata/index.js';
import type { Result } from '../model/index.js';
import { resolveBeamDataPath } from './demo-files.js';

/** A machine's beam data from `--beam-data` (a manifest path, or `demo` for the invented demo machine). */
export function loadBeamData(arg: string): Result<LoadedMachine> {
  return loadMachine(resolveBeamDataPath(arg));
}
