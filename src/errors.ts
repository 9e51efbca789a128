/**
 * The one exception of the house. A problem with the user's input (files, beam data, options) is
 * never thrown: it is an `Issue` value, returned, and the command line turns it into exit code 2.
 * What is thrown is a state the code should never reach — a bug — and main.ts turns any throw into
 * exit code 3 ("this is a bug", the stack with --debug).
 */
export class InternalError extends Error {
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'InternalError';
  }
}
