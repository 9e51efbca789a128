import { Command, CommanderError } from 'commander';
import { BeamDataError, InputError } from '../errors.js';
import { formatIssue } from '../model/index.js';
import { runInspect } from './inspect.js';
import type { CommandOutcome } from './outcome.js';
import { VERSION } from './version.js';

/**
 * The one place that prints and picks exit codes: 0 done and within tolerance, 1 needs review,
 * 2 input or data error (one line per problem), 3 internal error (stack only with --debug).
 */
export async function main(argv: readonly string[]): Promise<number> {
  let outcome: CommandOutcome | undefined;
  const debug = argv.includes('--debug');
  const program = new Command()
    .name('plumbline')
    .description('Independent verification of radiotherapy monitor units from DICOM RT plans')
    .version(VERSION)
    .option('--debug', 'print stack traces for internal errors')
    .exitOverride()
    .configureOutput({ writeErr: (s) => process.stderr.write(s) });

  program
    .command('inspect')
    .description('read RT Plan files (or folders of them) and print what was found')
    .argument('<paths...>', 'RT Plan files or folders')
    .option('--json', 'print the full model as one versioned JSON document')
    .action((paths: string[], opts: { json?: boolean }) => {
      outcome = runInspect(paths, opts);
    });

  try {
    await program.parseAsync(argv as string[], { from: 'user' });
  } catch (e) {
    if (e instanceof CommanderError) return e.exitCode === 0 ? 0 : 2;
    if (e instanceof InputError || e instanceof BeamDataError) {
      for (const i of e.issues) process.stderr.write(`${formatIssue(i)}\n`);
      return 2;
    }
    process.stderr.write(`internal error (this is a bug in plumbline): ${(e as Error)?.message ?? String(e)}\n`);
    if (debug) process.stderr.write(`${(e as Error)?.stack ?? ''}\n`);
    else process.stderr.write('run again with --debug for the stack trace\n');
    return 3;
  }
  if (!outcome) return 0;
  if (outcome.stdout.length) process.stdout.write(`${outcome.stdout.join('\n')}\n`);
  if (outcome.stderr.length) process.stderr.write(`${outcome.stderr.join('\n')}\n`);
  return outcome.exitCode;
}
