import { type LoadedMachine, loadMachine } from '../beamdata/index.js';
import { validateBeamData } from '../check/index.js';
import type { Issue, Result } from '../model/index.js';
import { markValidated } from './beam-data-stamp.js';
import { resolveBeamDataPath } from './demo-files.js';

/** How many of the validation's errors a refusal lists before pointing to `beams validate`. */
const FIRST_ERRORS = 5;

/**
 * A machine's beam data from `--beam-data` (a manifest path, or `demo`), validated before anything
 * uses them: data with any validation error are refused (a transcription error in them would bias
 * every plan of the machine alike); warnings travel with the data into every result.
 */
export function loadBeamData(arg: string): Result<LoadedMachine> {
  const loaded = loadMachine(resolveBeamDataPath(arg));
  if (!loaded.ok) return loaded;
  const found = [...(loaded.warnings ?? []), ...validateBeamData(loaded.value)];
  const errors = found.filter((i) => i.severity === 'error');
  const warnings = found.filter((i) => i.severity !== 'error');
  if (errors.length) return { ok: false, issues: refusal(arg, loaded.value.manifestFile, errors) };
  markValidated(loaded.value, warnings.length);
  return { ok: true, value: loaded.value, ...(warnings.length ? { warnings } : {}) };
}

function refusal(arg: string, manifestFile: string, errors: readonly Issue[]): Issue[] {
  return [
    ...errors.slice(0, FIRST_ERRORS),
    {
      severity: 'error',
      code: 'invalid-manifest',
      file: manifestFile,
      message:
        `these beam data fail their validation (${errors.length} problem(s)${errors.length > FIRST_ERRORS ? `, the first ${FIRST_ERRORS} above` : ''}) ` +
        `and are not used: run \`plumbline beams validate ${arg}\` for the full list`,
    },
  ];
}
