import { formatIssue } from '../model/index.js';
import { CAUTION } from '../report/caution.js';
import { validateMachine } from '../run/index.js';
import type { CommandOutcome } from './outcome.js';

/** `plumbline beams validate`: every problem with file:line:column; exit 0 clean, 1 warnings, 2 errors. */
export function runBeamsValidate(manifestArg: string): CommandOutcome {
  const { file, issues, loaded } = validateMachine(manifestArg);
  const errors = issues.filter((i) => i.severity === 'error').length;
  const warnings = issues.length - errors;
  const read = loaded ? `${loaded.photonBeams} photon and ${loaded.electronBeams} electron beam(s), ${loaded.tables} table(s), ` : '';
  const summary = `${file}: ${read}${errors} error(s), ${warnings} warning(s)`;
  return { stdout: [...issues.map(formatIssue), summary, CAUTION], stderr: [], exitCode: errors ? 2 : warnings ? 1 : 0 };
}
