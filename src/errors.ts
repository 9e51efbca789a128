/**
 * The closed set of exceptions. Input problems are normally returned as `Issue` values; these
 * classes exist for the few places where an exception must cross a boundary (the CLI maps them to
 * exit codes in one place).
 */
import type { Issue } from './model/issue.js';

/** The user's input cannot be used: exit code 2, one line per issue. */
export class InputError extends Error {
  constructor(readonly issues: readonly Issue[]) {
    super(issues.map((i) => i.message).join('; '));
    this.name = 'InputError';
  }
}

/** The commissioning data cannot be used: exit code 2. */
export class BeamDataError extends Error {
  constructor(readonly issues: readonly Issue[]) {
    super(issues.map((i) => i.message).join('; '));
    this.name = 'BeamDataError';
  }
}

/** A bug in plumbline: exit code 3. */
export class InternalError extends Error {
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'InternalError';
  }
}
