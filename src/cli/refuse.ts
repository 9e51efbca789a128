import { formatIssue } from '../model/index.js';
import type { CommandOutcome } from './outcome.js';

/** Options that cannot be used: one line per problem on stderr, exit 2. */
export function refuseOptions(messages: readonly string[]): CommandOutcome {
  return { stdout: [], stderr: messages.map((message) => formatIssue({ severity: 'error', code: 'invalid-option', message })), exitCode: 2 };
}
