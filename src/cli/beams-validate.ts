import { loadMachine } from '../beamdata/index.js';
import { validateBeamData } from '../check/index.js';
import type { Issue } from '../model/index.js';
import { formatIssue } from '../model/index.js';
import { CAUTION } from '../report/caution.js';
import { resolveBeamDataPath } from './beam-data-path.js';
import type { CommandOutcome } from './outcome.js';

/** `plumbline beams validate`: every problem with file:line:column; exit 0 clean, 1 warnings, 2 errors. */
export function runBeamsValidate(manifestArg: string): CommandOutcome {
  const file = resolveBeamDataPath(manifestArg);
  const loaded = loadMachine(file);
  if (!loaded.ok) return finish(file, loaded.issues);
  const lm = loaded.value;
  return finish(file, [...loaded.warnings, ...validateBeamData(lm)], `${lm.machine.beams.length} photon and ${lm.machine.electronBeams.length} electron beam(s)`, lm.tables.length);
}

function finish(file: string, issues: readonly Issue[], beams?: string, tables?: number): CommandOutcome {
  const errors = issues.filter((i) => i.severity === 'error').length;
  const warnings = issues.length - errors;
  const summary = `${file}: ${beams !== undefined ? `${beams}, ${tables} table(s), ` : ''}${errors} error(s), ${warnings} warning(s)`;
  return { stdout: [...issues.map(formatIssue), summary, CAUTION], stderr: [], exitCode: errors ? 2 : warnings ? 1 : 0 };
}
