/** What a command produced: lines for stdout and stderr, and the exit code (see DEVELOPERS.md). */
export interface CommandOutcome {
  readonly stdout: readonly string[];
  readonly stderr: readonly string[];
  readonly exitCode: 0 | 1 | 2 | 3;
}
