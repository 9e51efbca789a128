import { z } from 'zod';
import { formatIssue, PlanVerdict, printable } from '../model/index.js';
import { CAUTION } from '../report/caution.js';
import { fixed, textTable } from '../report/table.js';
import { loadServiceConfig } from '../service/config.js';
import { CheckRecord, HistoryStore } from '../service/history/store.js';
import { openService, runService } from '../service/run-service.js';
import { startWebServer } from '../service/web/server.js';
import type { CommandOutcome } from './outcome.js';
import { VERSION } from '../run/index.js';

// Calling AE titles, file names and plan labels come from outside: shown, never interpreted by the terminal.
const stamp = (line: string) => process.stderr.write(`${new Date().toISOString()} ${printable(line)}\n`);

/** `plumbline receive` / `plumbline watch <folder>`: intake until SIGINT or SIGTERM. */
export async function runIntake(configFile: string, o: { receive: boolean; watch?: string }): Promise<CommandOutcome> {
  const config = loadServiceConfig(configFile);
  if (!config.ok) return refuse(config.issues.map(formatIssue));
  if (o.receive && !config.value.receiver) {
    return refuse([
      formatIssue({
        severity: 'error',
        code: 'missing-attribute',
        file: configFile,
        path: 'receiver',
        message: 'receive needs a receiver section in the configuration (host, port, AE title)',
      }),
    ]);
  }
  const opened = openService(config.value);
  if (!opened.ok) return refuse(opened.issues.map(formatIssue));
  if (opened.value.machines.some((m) => m.machine.invented)) stamp('beam data of an INVENTED demo machine: never for a patient');
  stamp(CAUTION);
  const rc = config.value.receiver;
  const service = await listening(
    () => runService(opened.value, { receive: o.receive, ...(o.watch ? { watch: o.watch } : {}), log: stamp }),
    configFile,
    'receiver',
    rc ? `${rc.host}:${rc.port}` : '',
  );
  if ('exitCode' in service) {
    opened.value.history.close();
    return service;
  }
  if (o.watch) stamp(`watching ${o.watch}`);
  await untilStopped();
  await service.stop();
  return { stdout: [], stderr: ['stopped'], exitCode: 0 };
}

/** `plumbline serve`: the chart-round page, until SIGINT or SIGTERM. */
export async function runServe(configFile: string): Promise<CommandOutcome> {
  const config = loadServiceConfig(configFile);
  if (!config.ok) return refuse(config.issues.map(formatIssue));
  const history = new HistoryStore(config.value.history.database);
  stamp(CAUTION);
  const { host, port, hostNames } = config.value.serve;
  const web = await listening(() => startWebServer({ host, port, hostNames, history, log: stamp }), configFile, 'serve', `${host}:${port}`);
  if ('exitCode' in web) {
    history.close();
    return web;
  }
  await untilStopped();
  await web.close();
  history.close();
  return { stdout: [], stderr: ['stopped'], exitCode: 0 };
}

/**
 * Starts a listener; an address already in use or not available here is the configuration's
 * problem, said as such (exit 2), never an internal error.
 */
async function listening<T extends object>(
  start: () => Promise<T>,
  configFile: string,
  section: string,
  address: string,
): Promise<T | CommandOutcome> {
  try {
    return await start();
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why =
      code === 'EADDRINUSE'
        ? `${address} is already in use (another plumbline, or another program, listens there)`
        : code === 'EADDRNOTAVAIL' || code === 'EACCES'
          ? `cannot listen on ${address} (${code === 'EACCES' ? 'no permission for this port' : 'no such address on this machine'})`
          : undefined;
    if (!why) throw e;
    return refuse([
      formatIssue({ severity: 'error', code: 'invalid-option', file: configFile, path: section, message: `${why}: choose another host or port` }),
    ]);
  }
}

export const HistoryOptions = z.object({
  config: z.string().min(1),
  since: z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}(T[\d:.]+Z?)?$/, '--since must be a date (YYYY-MM-DD) or an ISO date-time')
    .optional(),
  verdict: z
    .array(z.enum(PlanVerdict.options, { message: `--verdict must be one of ${PlanVerdict.options.map((v) => `'${v}'`).join(', ')}` }))
    .optional(),
  machine: z.string().min(1).optional(),
  json: z.boolean().default(false),
});

export const HistoryDocument = z.object({
  schemaVersion: z.literal(1),
  kind: z.literal('plumbline.history'),
  tool: z.object({ name: z.literal('plumbline'), version: z.string() }),
  checks: z.array(CheckRecord.extend({ reviews: z.number() })),
  caution: z.string(),
});

/** `plumbline history`: the recorded checks, newest first. */
export function runHistory(raw: Record<string, unknown>): CommandOutcome {
  const p = HistoryOptions.safeParse(raw);
  if (!p.success) return refuse(p.error.issues.map((i) => i.message));
  const o = p.data;
  const config = loadServiceConfig(o.config);
  if (!config.ok) return refuse(config.issues.map(formatIssue));
  const store = new HistoryStore(config.value.history.database);
  try {
    const checks = store
      .listChecks({
        ...(o.since ? { since: o.since } : {}),
        ...(o.verdict ? { verdicts: o.verdict } : {}),
        ...(o.machine ? { machine: o.machine } : {}),
      })
      .map((c) => ({ ...c, reviews: store.reviews(c.id).length }));
    if (o.json)
      return {
        stdout: [
          JSON.stringify(
            HistoryDocument.parse({
              schemaVersion: 1,
              kind: 'plumbline.history',
              tool: { name: 'plumbline', version: VERSION },
              checks,
              caution: CAUTION,
            }),
            null,
            2,
          ),
        ],
        stderr: [],
        exitCode: 0,
      };
    const rows = checks.map((c) => [
      String(c.id),
      c.recordedAt.replace('T', ' ').slice(0, 19),
      c.planLabel,
      c.patientId ?? '—',
      c.machine ?? '—',
      c.verdict,
      c.fullyVerified ? 'yes' : 'no',
      fixed(c.reviews, 0),
    ]);
    return {
      stdout: [
        `${checks.length} check(s) in ${config.value.history.database}`,
        ...textTable(['check', 'recorded (UTC)', 'plan', 'patient', 'machine', 'verdict', 'fully verified', 'reviews'], rows).map((l) => `  ${l}`),
        '',
        CAUTION,
      ],
      stderr: [],
      exitCode: 0,
    };
  } finally {
    store.close();
  }
}

/** Long-running commands run until SIGINT or SIGTERM. */
function untilStopped(): Promise<void> {
  return new Promise((done) => {
    process.once('SIGINT', () => done());
    process.once('SIGTERM', () => done());
  });
}

function refuse(lines: readonly string[]): CommandOutcome {
  return { stdout: [], stderr: [...lines], exitCode: 2 };
}
