import { readFileSync } from 'node:fs';
import { z } from 'zod';
import { formatIssue, PlanVerdict, printable } from '../model/index.js';
import { CAUTION } from '../report/caution.js';
import { fixed, textTable } from '../report/table.js';
import { loadServiceConfig } from '../service/config.js';
import { chartRoundEntry } from '../service/history/chart-round.js';
import { chartRoundCsv } from '../service/history/export-csv.js';
import { openHistoryStore } from '../service/history/open-store.js';
import { CheckRecord } from '../service/history/store.js';
import { openService, runService } from '../service/run-service.js';
import { isLoopback, startWebServer } from '../service/web/server.js';
import type { CommandOutcome } from './outcome.js';
import { VERSION } from '../run/index.js';
import { writeFileAtomic } from './atomic-write.js';

// Calling AE titles, file names and plan labels come from outside: shown, never interpreted by the terminal.
const stamp = (line: string) => process.stderr.write(`${new Date().toISOString()} ${printable(line)}\n`);

/** `--port` and `--host` of `receive` and `serve`, over the configuration's. */
const ListenOverrides = z.object({
  port: z.coerce
    .number({ message: '--port must be a port number' })
    .int('--port must be a whole number')
    .min(0, '--port must be 0 to 65535')
    .max(65535, '--port must be 0 to 65535')
    .optional(),
  host: z.string().trim().min(1, '--host must name an address').optional(),
});
type ListenOptions = { port?: string | undefined; host?: string | undefined };

/** `plumbline receive` / `plumbline watch <folder>`: intake until SIGINT or SIGTERM. */
export async function runIntake(configFile: string, o: { receive: boolean; watch?: string } & ListenOptions): Promise<CommandOutcome> {
  const over = ListenOverrides.safeParse({ port: o.port, host: o.host });
  if (!over.success) return refuse(over.error.issues.map((i) => i.message));
  const loaded = loadServiceConfig(configFile);
  if (!loaded.ok) return refuse(loaded.issues.map(formatIssue));
  const rx = loaded.value.receiver;
  const config = {
    ok: true as const,
    value: { ...loaded.value, ...(rx ? { receiver: { ...rx, ...definedOf(over.data) } } : {}) },
  };
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
  const opened = await openService(config.value);
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
    await opened.value.history.close();
    return service;
  }
  if (o.watch) stamp(`watching ${o.watch}`);
  await untilStopped();
  await service.stop();
  return { stdout: [], stderr: ['stopped'], exitCode: 0 };
}

/** `plumbline serve`: the chart-round page, until SIGINT or SIGTERM. */
export async function runServe(configFile: string, o: ListenOptions & { behindProxy?: boolean } = {}): Promise<CommandOutcome> {
  const over = ListenOverrides.safeParse({ port: o.port, host: o.host });
  if (!over.success) return refuse(over.error.issues.map((i) => i.message));
  if (over.data.port === 0) return refuse(['--port of serve must be 1 to 65535']);
  const loaded = loadServiceConfig(configFile);
  if (!loaded.ok) return refuse(loaded.issues.map(formatIssue));
  const serve = { ...loaded.value.serve, ...definedOf(over.data), ...(o.behindProxy ? { behindProxy: true } : {}) };
  // Beyond this machine, sign-in cookies and passwords travel the network: only over TLS, ours or a proxy's.
  if (!isLoopback(serve.host) && !serve.tls && !serve.behindProxy)
    return refuse([
      formatIssue({
        severity: 'error',
        code: 'invalid-option',
        file: configFile,
        path: 'serve',
        message: `the page would listen on ${serve.host}, beyond this machine, without TLS: give serve.tls (certificate and key) or --behind-proxy`,
      }),
    ]);
  const tls = serve.tls ? readTls(serve.tls, configFile) : undefined;
  if (tls && 'exitCode' in tls) return tls;
  const opened = await openHistoryStore(loaded.value.history);
  if (!opened.ok) return refuse(opened.issues.map(formatIssue));
  const history = opened.value;
  stamp(CAUTION);
  const { host, port, hostNames } = serve;
  const web = await listening(
    () =>
      startWebServer({
        host,
        port,
        hostNames,
        history,
        log: stamp,
        behindProxy: serve.behindProxy,
        sessionHours: serve.sessionHours,
        ...(tls ? { tls } : {}),
      }),
    configFile,
    'serve',
    `${host}:${port}`,
  );
  if ('exitCode' in web) {
    await history.close();
    return web;
  }
  await untilStopped();
  await web.close();
  await history.close();
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
  config: z.string({ message: '--config is required' }).min(1),
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
export async function runHistory(raw: Record<string, unknown>): Promise<CommandOutcome> {
  const p = HistoryOptions.safeParse(raw);
  if (!p.success) return refuse(p.error.issues.map((i) => i.message));
  const o = p.data;
  const config = loadServiceConfig(o.config);
  if (!config.ok) return refuse(config.issues.map(formatIssue));
  const opened = await openHistoryStore(config.value.history);
  if (!opened.ok) return refuse(opened.issues.map(formatIssue));
  const store = opened.value;
  try {
    const listed = await store.listChecks({
      ...(o.since ? { since: o.since } : {}),
      ...(o.verdict ? { verdicts: o.verdict } : {}),
      ...(o.machine ? { machine: o.machine } : {}),
    });
    const checks = [];
    for (const c of listed) checks.push({ ...c, reviews: (await store.reviews(c.id)).length });
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
        `${checks.length} check(s) in ${store.where}`,
        ...textTable(['check', 'recorded (UTC)', 'plan', 'patient', 'machine', 'verdict', 'fully verified', 'reviews'], rows).map((l) => `  ${l}`),
        '',
        CAUTION,
      ],
      stderr: [],
      exitCode: 0,
    };
  } finally {
    await store.close();
  }
}

export const HistoryExportOptions = z.object({
  config: z.string().min(1),
  since: HistoryOptions.shape.since.unwrap(),
  out: z.string().min(1).optional(),
});

/**
 * `plumbline history export --since D`: the chart-round list as CSV, oldest first — each check with
 * its patient, plan, machine, verdict, worst beam and deviation, likely cause and last review.
 * Written atomically to `--out`, or to standard output.
 */
export async function runHistoryExport(raw: Record<string, unknown>): Promise<CommandOutcome> {
  const p = HistoryExportOptions.safeParse(raw);
  if (!p.success) return refuse(p.error.issues.map((i) => (i.path[0] === 'since' && i.code === 'invalid_type' ? '--since is required' : i.message)));
  const config = loadServiceConfig(p.data.config);
  if (!config.ok) return refuse(config.issues.map(formatIssue));
  const opened = await openHistoryStore(config.value.history);
  if (!opened.ok) return refuse(opened.issues.map(formatIssue));
  const store = opened.value;
  try {
    const entries = [];
    for (const c of (await store.listChecks({ since: p.data.since })).reverse())
      entries.push(chartRoundEntry(c, await store.result(c.id), await store.reviews(c.id)));
    const csv = chartRoundCsv(entries);
    // On the terminal one row a line (control characters shown, never obeyed, as for all output); --out keeps RFC 4180 exactly.
    if (!p.data.out) return { stdout: csv.split('\r\n').slice(0, -1), stderr: [], exitCode: 0 };
    writeFileAtomic(p.data.out, csv);
    return { stdout: [], stderr: [`${entries.length} check(s) since ${p.data.since} written to ${p.data.out}`], exitCode: 0 };
  } finally {
    await store.close();
  }
}

/** The page's certificate and key, read once at start; a file that cannot be read is the configuration's problem. */
function readTls(t: { cert: string; key: string }, configFile: string): { cert: Buffer; key: Buffer } | CommandOutcome {
  try {
    return { cert: readFileSync(t.cert), key: readFileSync(t.key) };
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code ?? String(e);
    return refuse([
      formatIssue({
        severity: 'error',
        code: 'invalid-option',
        file: configFile,
        path: 'serve.tls',
        message: `the certificate or key cannot be read (${code})`,
      }),
    ]);
  }
}

/** The options given, without those left out. */
function definedOf<T extends object>(o: T): Partial<T> {
  return Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)) as Partial<T>;
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
