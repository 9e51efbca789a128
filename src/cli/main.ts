import { Command, CommanderError } from 'commander';
import { runBeamsComparePublished } from './beams-compare.js';
import { runImportScans } from './beams-import.js';
import { runBeamsNew } from './beams-new.js';
import { runBeamsValidate } from './beams-validate.js';
import { runCalc } from './calc.js';
import { runCheck } from './check.js';
import { runDepth } from './depth.js';
import { runInspect } from './inspect.js';
import { printableLines } from '../model/index.js';
import type { CommandOutcome } from './outcome.js';
import { DEFAULT_POLICY, resolveServiceConfig, VERSION } from '../run/index.js';

/** The service commands load the DICOM network and SQLite modules: only when one of them runs. */
const service = () => import('./service-commands.js');
const accounts = () => import('./users.js');

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

  program
    .command('check')
    .description('check RT Plans against the beam data: independent dose per beam, deviation, verdict')
    .argument('<paths...>', 'RT Plan files or folders (searched recursively)')
    .requiredOption('--beam-data <manifest>', "the machine's beam-data manifest, or 'demo' for the invented demo machine")
    .option('--policy <file>', 'action-level policy (JSON); the shipped defaults otherwise')
    .option('--point <x,y,z>', 'calculation point in patient coordinates, mm (overrides the plan)')
    .option('--machine-alias <PLAN=DATA>', 'map a plan machine name to a beam-data machine name (repeatable)', (v: string, all: string[] = []) => [
      ...all,
      v,
    ])
    .option('--suggest-point', 'also calculate at the suggested point when a point is unfit')
    .option('--explain', "explain every beam's deviation (by default only beams not within tolerance)")
    .option('--heterogeneity <method>', "with --ct: 'tpr-ratio' (default, effective path length) or 'batho' (Batho's power law)")
    .option('--json', 'print one versioned JSON document')
    .option('--html <file>', 'write a self-contained HTML report')
    .option('--factors', "also print a table of every beam's factors (Sc, Sp, TPR or PDD, inverse square, OAR, wedge, tray, heterogeneity)")
    .option('--ct <path...>', "the patient's CT series (a folder or files): depths and SSD traced through it, heterogeneity corrected")
    .option('--density <csv>', "HU to relative electron density table (CSV), or 'demo' for the invented demo table")
    .option('--body-threshold <HU>', 'HU at or above which a voxel is the body (default from the policy)')
    .option('--structures <rs.dcm>', 'RT Structure Set: its EXTERNAL structure is the body surface (else the HU threshold)')
    .option('--dose <file...>', "the planning system's RT Dose (any summation type): its dose at the point, shown beside")
    .option('--threads <n>', 'worker threads for a batch of 200 files or more (default: one per core, up to 4; 1 checks in this thread)')
    .action(async (paths: string[], opts: Record<string, unknown>) => {
      outcome = await runCheck(paths, opts);
    });

  program
    .command('calc')
    .description('manual point calculation for one photon or electron beam, every factor on its own line (AAPM TG-71)')
    .requiredOption('--beam-data <manifest>', "the machine's beam-data manifest, or 'demo' for the invented demo machine")
    .requiredOption('--energy <MV|MeV>', 'nominal energy: MV for photons, MeV for electrons (with --applicator)')
    .option('--fff', 'the flattening-filter-free beam of that energy')
    .option('--setup <SAD|SSD>', 'photons: SAD (TPR-based, point distance) or SSD (PDD-based, SSD factor)')
    .option('--field <XxY>', 'photons: collimator (jaw) field at the isocenter plane, cm, e.g. 10x12')
    .option('--irradiated <side>', 'equivalent square of the irradiated field (MLC, blocks) at the isocenter plane, cm')
    .option('--depth <cm>', 'depth of the point')
    .option('--applicator <ID>', 'electrons: the applicator as the beam data name it')
    .option(
      '--cutout <XxY|side>',
      'electrons: the cutout at the nominal SSD, cm: a rectangle or one equivalent square side (default: the open applicator)',
    )
    .option('--isodose <percent>', 'electrons: prescribe to this isodose (the depth where the PDD falls to it) instead of --depth')
    .option('--mu <MU>', 'monitor units: compute the dose')
    .option('--dose <cGy>', 'dose at the point: compute the MU')
    .option('--ssd <cm>', 'source-to-surface distance (default: the SAD for SSD setups, SAD − depth for SAD setups, the nominal SSD for electrons)')
    .option('--off-axis <cm>', 'distance of the point from the central axis, at its depth')
    .option('--wedge <ID>', 'wedge ID as the beam data names it')
    .option('--tray [ID]', 'a blocking tray (its ID when the beam has several)')
    .option('--json', 'print one versioned JSON document')
    .action((opts: Record<string, unknown>) => {
      outcome = runCalc(opts);
    });

  program
    .command('depth')
    .description('per beam: the SSD from the plan and from the CT, geometric and radiological depth, entry point and densities met')
    .argument('<plan>', 'RT Plan file')
    .requiredOption('--ct <path...>', "the patient's CT series (a folder or files)")
    .option('--density <csv>', "HU to relative electron density table (CSV), or 'demo'")
    .option('--body-threshold <HU>', 'HU at or above which a voxel is the body')
    .option('--structures <rs.dcm>', 'RT Structure Set: its EXTERNAL structure is the body surface')
    .option('--json', 'print one versioned JSON document')
    .action((plan: string, opts: Record<string, unknown>) => {
      outcome = runDepth(plan, opts);
    });

  program
    .command('policy')
    .description('print the shipped action-level policy as JSON, to start a clinic policy file from')
    .action(() => {
      outcome = { stdout: [JSON.stringify(DEFAULT_POLICY, null, 2)], stderr: [], exitCode: 0 };
    });

  const configOption = "the service configuration (JSON); 'demo' for the demo scenario's";
  program
    .command('receive')
    .description('DICOM storage receiver (C-STORE, C-ECHO): every plan received is checked and recorded')
    .requiredOption('--config <file>', configOption)
    .option('--port <port>', "listen on this port instead of the configuration's (0: any free port)")
    .option('--host <address>', "listen on this address instead of the configuration's")
    .action(async (opts: { config: string; port?: string; host?: string }) => {
      outcome = await (await service()).runIntake(resolveServiceConfig(opts.config), { receive: true, port: opts.port, host: opts.host });
    });

  program
    .command('watch')
    .description('take complete files from an export folder: every plan is checked and recorded')
    .argument('<folder>', "the planning system's export folder")
    .requiredOption('--config <file>', configOption)
    .action(async (folder: string, opts: { config: string }) => {
      outcome = await (await service()).runIntake(resolveServiceConfig(opts.config), { receive: false, watch: folder });
    });

  program
    .command('serve')
    .description("the chart-round web page on loopback: the week's checks, trends with control limits, reviews")
    .requiredOption('--config <file>', configOption)
    .option('--port <port>', "serve on this port instead of the configuration's")
    .option('--host <address>', "serve on this address instead of the configuration's")
    .option('--behind-proxy', 'a reverse proxy in front does TLS: the page may listen beyond loopback without its own')
    .action(async (opts: { config: string; port?: string; host?: string; behindProxy?: boolean }) => {
      outcome = await (await service()).runServe(resolveServiceConfig(opts.config), {
        port: opts.port,
        host: opts.host,
        ...(opts.behindProxy ? { behindProxy: true } : {}),
      });
    });

  const users = program.command('users').description('accounts of the chart-round page: a physicist reviews, a viewer reads');
  users
    .command('add')
    .description('add an account; its password is read from standard input (asked twice at a terminal), never from the command line')
    .argument('<name>', "the person's name, as reviews will carry it")
    .requiredOption('--role <role>', 'physicist or viewer')
    .requiredOption('--config <file>', configOption)
    .option('--reset', 'set a new password for an existing account instead')
    .action(async (name: string, opts: Record<string, unknown>) => {
      const { readPassword } = await import('./password-prompt.js');
      outcome = await (await accounts()).runUsersAdd({ ...opts, name, config: resolveServiceConfig(String(opts.config)) }, readPassword);
    });
  users
    .command('list')
    .description('the accounts and their roles')
    .requiredOption('--config <file>', configOption)
    .action(async (opts: Record<string, unknown>) => {
      outcome = await (await accounts()).runUsersList({ config: resolveServiceConfig(String(opts.config)) });
    });

  const history = program.command('history').description('the recorded checks: listed (the default), or exported for chart rounds');
  history
    .command('list', { isDefault: true })
    .description('the recorded checks, newest first (`plumbline history --config C` is the same)')
    .requiredOption('--config <file>', configOption)
    .option('--since <date>', 'only checks recorded at or after this date (YYYY-MM-DD)')
    .option('--verdict <verdict...>', "only these verdicts: 'within tolerance', 'needs review', 'not verified', 'beyond action level'")
    .option('--machine <name>', 'only this machine')
    .option('--json', 'print one versioned JSON document')
    .action(async (opts: Record<string, unknown>) => {
      outcome = await (await service()).runHistory({ ...opts, config: resolveServiceConfig(String(opts.config)) });
    });
  history
    .command('export')
    .description('the chart-round list as CSV, oldest first: verdict, worst beam, likely cause and last review of each check')
    .requiredOption('--config <file>', configOption)
    .requiredOption('--since <date>', 'checks recorded at or after this date (YYYY-MM-DD)')
    .option('--out <file>', 'write the CSV here (atomically) instead of to standard output')
    .action(async (opts: Record<string, unknown>) => {
      outcome = await (await service()).runHistoryExport({ ...opts, config: resolveServiceConfig(String(opts.config)) });
    });

  const beams = program.command('beams').description('commissioning beam data');
  beams
    .command('validate')
    .description("check a machine's beam data: ranges, normalization, smoothness, PDD/TPR agreement")
    .argument('<manifest>', "the machine's manifest, or 'demo'")
    .action((manifest: string) => {
      outcome = runBeamsValidate(manifest);
    });
  beams
    .command('compare-published')
    .description("compare each photon beam's 10 x 10 PDD at SSD 100 with published data of the same beam quality")
    .argument('<manifest>', "the machine's manifest, or 'demo'")
    .action((manifest: string) => {
      outcome = runBeamsComparePublished(manifest);
    });
  beams
    .command('import-scans')
    .description(
      'build a PDD, TMR or OAR table from plain two-column scans (position, reading): one depth scan per field side, one profile per depth',
    )
    .argument('<KEY=FILE...>', 'field side (PDD, TMR) or depth (OAR) in cm and its scan file, e.g. 10=pdd-10x10.txt')
    .requiredOption('--quantity <pdd|tmr|oar>', 'what the scans are')
    .option('--depths <cm,...>', "PDD, TMR: the table's depths (its rows)")
    .option('--positions <cm,...>', "OAR: the table's off-axis distances (its columns)")
    .requiredOption('--out <file>', 'the CSV table to write')
    .option('--normalize <max|cm>', 'normalise each scan to its maximum (default) or to its reading at this depth')
    .option('--columns <i,j>', '1-based columns of position and reading (default 1,2)')
    .option('--position-unit <cm|mm>', 'unit of the positions in the files (default cm)')
    .action((pairs: string[], opts: Record<string, unknown>) => {
      outcome = runImportScans(pairs, opts);
    });
  beams
    .command('new')
    .description("write a new machine's manifest and CSV templates (headers, units and axes; the values left to fill)")
    .requiredOption('--machine <name>', 'the Treatment Machine Name the plans use')
    .option('--photons <MV,...>', 'photon energies, e.g. 6,10')
    .option('--electrons <MeV,...>', 'electron energies, e.g. 6,9')
    .option('--applicators <ID,...>', 'electron applicators, e.g. A10,A15 (or ID=side in cm)')
    .option('--out <folder>', 'a new or empty folder (default: <machine>-beam-data)')
    .action((opts: Record<string, unknown>) => {
      outcome = runBeamsNew(opts);
    });

  try {
    await program.parseAsync(argv as string[], { from: 'user' });
  } catch (e) {
    if (e instanceof CommanderError) return e.exitCode === 0 ? 0 : 2;
    process.stderr.write(`internal error (this is a bug in plumbline): ${(e as Error)?.message ?? String(e)}\n`);
    if (debug) process.stderr.write(`${(e as Error)?.stack ?? ''}\n`);
    else process.stderr.write('run again with --debug for the stack trace\n');
    return 3;
  }
  if (!outcome) return 0;
  // File names and anything else from outside: no control character reaches the terminal.
  if (outcome.stdout.length) process.stdout.write(`${printableLines(outcome.stdout.join('\n'))}\n`);
  if (outcome.stderr.length) process.stderr.write(`${printableLines(outcome.stderr.join('\n'))}\n`);
  return outcome.exitCode;
}
