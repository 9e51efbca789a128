import { type LoadedMachine, loadMachine } from '../beamdata/index.js';
import { validateBeamData } from '../check/index.js';
import type { Issue, Result } from '../model/index.js';
import { beamDataSha256, markValidated } from './beam-data-stamp.js';
import { rememberedPass, rememberPass, validationCacheDir, validationKey } from './validation-cache.js';
import { resolveBeamDataPath } from './demo-files.js';

/** How many of the validation's errors a refusal lists before pointing to `beams validate`. */
const FIRST_ERRORS = 5;

/**
 * A machine's beam data from `--beam-data` (a manifest path, or `demo`), validated before anything
 * uses them: data with any validation error are refused (a transcription error in them would bias
 * every plan of the machine alike); warnings travel with the data into every result.
 */
export function loadBeamData(arg: string, cacheDir: string | undefined = validationCacheDir()): Result<LoadedMachine> {
  const loaded = loadMachine(resolveBeamDataPath(arg));
  if (!loaded.ok) return loaded;
  // Validated once per version of the data: a pass is remembered by the SHA-256 of every byte.
  const key = validationKey(loaded.value.manifestFile, beamDataSha256(loaded.value));
  const remembered = rememberedPass(cacheDir, key);
  const validation = remembered ?? validateBeamData(loaded.value);
  const found = [...(loaded.warnings ?? []), ...validation];
  const errors = found.filter((i) => i.severity === 'error');
  const warnings = found.filter((i) => i.severity !== 'error');
  if (errors.length) return { ok: false, issues: refusal(arg, loaded.value.manifestFile, errors) };
  if (!remembered) rememberPass(cacheDir, key, validation);
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
