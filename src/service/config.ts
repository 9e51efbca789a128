import { dirname, isAbsolute, resolve } from 'node:path';
import { z } from 'zod';
import type { Result } from '../model/index.js';
import { readJsonFile } from '../run/index.js';

const AeTitle = z
  .string()
  .regex(/^[ -~]{1,16}$/, 'an AE title is 1 to 16 printable ASCII characters')
  .refine((s) => s.trim() === s && !s.includes('\\'), 'no leading or trailing spaces, no backslash');

/**
 * The service's configuration file: where objects arrive and go, who may send, which beam data
 * check which machine, the policy and the settle time. Paths are relative to the file.
 */
/** One object's largest size (bytes): 1 GiB by default, never beyond what one read can hold (2 GiB − 1). */
const MaxObjectBytes = z
  .number()
  .int()
  .positive()
  .max(2 ** 31 - 1)
  .default(1024 ** 3);

/**
 * Where the history lives: a SQLite file (the embedded default; `{ "database": file }` as before),
 * or a PostgreSQL database by URL, its password from an environment variable or a file, never in
 * the URL (the configuration is read by people who should not learn it).
 */
const Postgres = z
  .object({
    kind: z.literal('postgres'),
    url: z
      .string()
      .regex(/^postgres(ql)?:\/\//, 'a postgresql:// URL')
      .refine((u) => !/^postgres(ql)?:\/\/[^/@]*:[^/@]*@/.test(u), 'no password in the URL: give passwordEnv or passwordFile'),
    /** The environment variable holding the password. */
    passwordEnv: z.string().min(1).optional(),
    /** A file holding the password (its first line), readable by the service only. */
    passwordFile: z.string().min(1).optional(),
  })
  .strict();
export const HistoryConfig = z
  .union([
    z.object({ kind: z.literal('sqlite'), file: z.string().min(1) }).strict(),
    Postgres,
    z
      .object({ database: z.string().min(1) })
      .strict()
      .transform((h) => ({ kind: 'sqlite' as const, file: h.database })),
  ])
  .describe('history');
export type HistoryConfig = z.infer<typeof HistoryConfig>;

export const ServiceConfig = z
  .object({
    format: z.literal('plumbline.service'),
    formatVersion: z.literal(1),
    receiver: z
      .object({
        /** Loopback unless the clinic decides otherwise. */
        host: z.string().min(1).default('127.0.0.1'),
        /** 0: any free port (the tests use it). */
        port: z.number().int().min(0).max(65535).default(11112),
        aeTitle: AeTitle.default('PLUMBLINE'),
        /** Calling AE titles allowed to associate; any other is rejected at association. */
        allowedCallingAeTitles: z.array(AeTitle).min(1),
        /** Objects larger than this are refused (bytes). */
        maxObjectBytes: MaxObjectBytes,
        /** The longest PDU accepted (bytes): a longer one closes the association from its header. */
        maxPduBytes: z
          .number()
          .int()
          .min(16 * 1024)
          .default(4 * 1024 ** 2),
        /** Seconds of silence after which an association is closed. */
        idleSeconds: z.number().positive().default(60),
      })
      .strict()
      .optional(),
    folders: z
      .object({
        /** Received (or taken from the watched folder) and not yet checked. */
        inbox: z.string().min(1),
        /** Inputs after their check, named by content hash. */
        archive: z.string().min(1),
        /** Files that are not objects the check uses, or unreadable. */
        refused: z.string().min(1),
      })
      .strict(),
    history: HistoryConfig,
    /** Beam-data manifests, one per machine (the manifest names the machine and its aliases), or 'demo'. */
    beamData: z.array(z.string().min(1)).min(1),
    policy: z.string().min(1).optional(),
    ct: z
      .object({ density: z.string().min(1), bodyThresholdHu: z.number().int().optional() })
      .strict()
      .optional(),
    /** Files in the inbox larger than this are refused unread (bytes): none may stop intake by its size. */
    maxObjectBytes: MaxObjectBytes,
    /** Seconds a file in the watched folder must stay unchanged (size and time) before it is taken: the exporter has finished. */
    watchStableSeconds: z.number().nonnegative().default(10),
    /** Seconds without a new object in a frame of reference before its plans are checked. */
    settleSeconds: z.number().nonnegative().default(30),
    /** Hours a group without any plan (a CT, structures or dose alone) waits for its plan before it is archived unchecked. */
    orphanHours: z.number().positive().default(72),
    serve: z
      .object({
        host: z.string().min(1).default('127.0.0.1'),
        port: z.number().int().min(1).max(65535).default(8470),
        /** Other names the page is reached by (this machine's DNS name): any other Host header is refused. */
        hostNames: z.array(z.string().min(1)).default([]),
        /** The page over TLS: certificate and key files (PEM). Required to serve beyond loopback, unless behind a proxy. */
        tls: z
          .object({ cert: z.string().min(1), key: z.string().min(1) })
          .strict()
          .optional(),
        /** A reverse proxy in front does TLS: the page may listen beyond loopback without its own, and its cookies say Secure. */
        behindProxy: z.boolean().default(false),
        /** Hours a sign-in lasts. */
        sessionHours: z.number().positive().max(24).default(8),
      })
      .strict()
      .default({ host: '127.0.0.1', port: 8470, hostNames: [], behindProxy: false, sessionHours: 8 }),
  })
  .strict();
export type ServiceConfig = z.infer<typeof ServiceConfig>;

/** Reads and validates the configuration; relative paths become absolute from the file's folder. */
export function loadServiceConfig(file: string): Result<ServiceConfig> {
  const p = readJsonFile(file, ServiceConfig, 'service configuration', 'invalid-option');
  if (!p.ok) return p;
  const base = dirname(resolve(file));
  const at = (p: string) => (p === 'demo' || isAbsolute(p) ? p : resolve(base, p));
  const c = p.value;
  return {
    ok: true,
    value: {
      ...c,
      folders: { inbox: at(c.folders.inbox), archive: at(c.folders.archive), refused: at(c.folders.refused) },
      history:
        c.history.kind === 'sqlite'
          ? { kind: 'sqlite', file: at(c.history.file) }
          : { ...c.history, ...(c.history.passwordFile ? { passwordFile: at(c.history.passwordFile) } : {}) },
      beamData: c.beamData.map(at),
      ...(c.policy ? { policy: at(c.policy) } : {}),
      ...(c.ct ? { ct: { ...c.ct, density: at(c.ct.density) } } : {}),
      serve: { ...c.serve, ...(c.serve.tls ? { tls: { cert: at(c.serve.tls.cert), key: at(c.serve.tls.key) } } : {}) },
    },
  };
}
