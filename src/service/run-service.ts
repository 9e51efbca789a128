import { InternalError } from '../errors.js';
import type { Result } from '../model/index.js';
import { type LoadedMachine, loadBeamData, loadPolicy } from '../run/index.js';
import type { ServiceConfig } from './config.js';
import { openHistoryStore } from './history/open-store.js';
import { type PipelineContext, processInbox } from './pipeline.js';
import { startReceiver } from './receiver.js';
import { takeStableFiles, type WatchState } from './watch-folder.js';

export interface RunningService {
  readonly receiverPort?: number;
  /** Runs one pipeline pass now (also run every second); resolves when it is done. */
  readonly pass: () => Promise<void>;
  readonly stop: () => Promise<void>;
}

const TICK_MS = 1000;
/** After an object arrives, the pipeline looks this soon (ms): objects of one send gather, none waits for the tick. */
const ARRIVAL_DELAY_MS = 25;

/** The service's pieces from its configuration: beam data of every machine, the policy, the history. */
export async function openService(config: ServiceConfig): Promise<Result<Omit<PipelineContext, 'log' | 'now'>>> {
  const machines: LoadedMachine[] = [];
  for (const m of config.beamData) {
    const loaded = loadBeamData(m);
    if (!loaded.ok) return { ok: false, issues: [...loaded.issues] };
    machines.push(loaded.value);
  }
  const [first, ...others] = machines;
  if (!first)
    return {
      ok: false,
      issues: [{ severity: 'error', code: 'invalid-manifest', path: 'beamData', message: 'the configuration names no beam data' }],
    };
  const policy = loadPolicy(config.policy);
  if (!policy.ok) return policy;
  const history = await openHistoryStore(config.history);
  if (!history.ok) return history;
  return { ok: true, value: { config, machines: [first, ...others], policy: policy.value, history: history.value } };
}

/**
 * Runs intake: the DICOM receiver (when `receive`), the watched folder (when given), and the
 * pipeline every second over the inbox, one pass at a time.
 */
export async function runService(
  base: Omit<PipelineContext, 'log' | 'now'>,
  o: { receive: boolean; watch?: string; log: (line: string) => void },
): Promise<RunningService> {
  const ctx: PipelineContext = { ...base, log: o.log, now: () => Date.now(), seen: new Map() };
  let busy: Promise<void> | undefined;
  const once = async () => {
    try {
      const r = await processInbox(ctx);
      if (r.checked || r.duplicates || r.refused)
        o.log(`pass: ${r.checked} checked, ${r.duplicates} duplicate(s), ${r.refused} refused, ${r.waiting} waiting`);
    } catch (e) {
      o.log(`pipeline error (will retry): ${(e as Error).message}`);
    }
  };
  // One pass at a time: a pass asked for while one runs waits for it and runs after.
  const pass = async (): Promise<void> => {
    while (busy) await busy;
    busy = once().finally(() => {
      busy = undefined;
    });
    return busy;
  };
  // An arrival asks for a pass soon; arrivals close together share one.
  let asked: NodeJS.Timeout | undefined;
  const arrived = () => {
    asked ??= setTimeout(() => {
      asked = undefined;
      void pass();
    }, ARRIVAL_DELAY_MS);
  };
  const rc = base.config.receiver;
  // runIntake refuses a `receive` without a receiver section before starting: reaching here is a bug.
  if (o.receive && !rc) throw new InternalError('the configuration has no receiver section');
  const receiver =
    o.receive && rc
      ? await startReceiver({
          host: rc.host,
          port: rc.port,
          aeTitle: rc.aeTitle,
          allowedCallingAeTitles: rc.allowedCallingAeTitles,
          maxObjectBytes: rc.maxObjectBytes,
          maxPduBytes: rc.maxPduBytes,
          idleSeconds: rc.idleSeconds,
          inbox: base.config.folders.inbox,
          log: o.log,
          onStored: arrived,
        })
      : undefined;
  const watchState: WatchState = { seen: new Map(), told: new Set() };
  const timer = setInterval(() => {
    if (o.watch) {
      try {
        const n = takeStableFiles(o.watch, base.config.folders.inbox, watchState, Date.now(), base.config.watchStableSeconds * 1000, o.log);
        if (n) o.log(`took ${n} file(s) from ${o.watch}`);
      } catch (e) {
        o.log(`watch error (will retry): ${(e as Error).message}`);
      }
    }
    if (!busy) void pass();
  }, TICK_MS);
  return {
    ...(receiver ? { receiverPort: receiver.port } : {}),
    pass,
    stop: async () => {
      clearInterval(timer);
      if (asked) clearTimeout(asked);
      await receiver?.close();
      while (busy) await busy;
      await base.history.close();
    },
  };
}
