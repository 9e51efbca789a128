/** An inbox, its folders, a history and a pipeline context with a clock the test moves. */
import { copyFileSync, mkdirSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { loadBeamData } from '../../src/run/index.js';
import { DEFAULT_POLICY } from '../../src/check/index.js';
import { ServiceConfig } from '../../src/service/config.js';
import { SqliteHistoryStore } from '../../src/service/history/sqlite-store.js';
import { DEMO_MANIFEST, manifestPath } from './machines.js';

const machine = (() => {
  const m = loadBeamData(DEMO_MANIFEST);
  if (!m.ok) throw new Error('demo');
  return m.value;
})();

export function setup() {
  const root = mkdtempSync(join(tmpdir(), 'plumbline-pipe-'));
  const config = ServiceConfig.parse({
    format: 'plumbline.service',
    formatVersion: 1,
    folders: { inbox: join(root, 'inbox'), archive: join(root, 'archive'), refused: join(root, 'refused') },
    history: { database: join(root, 'history.sqlite') },
    beamData: [DEMO_MANIFEST],
    ct: { density: manifestPath('fixtures/demo/ct/hu-to-density.csv') },
    settleSeconds: 30,
  });
  mkdirSync(config.folders.inbox, { recursive: true });
  const history = new SqliteHistoryStore(join(root, 'history.sqlite'));
  const lines: string[] = [];
  let now = Date.now();
  const ctx = { config, machines: [machine] as [typeof machine], policy: DEFAULT_POLICY, history, log: (l: string) => lines.push(l), now: () => now };
  return {
    root,
    config,
    history,
    lines,
    ctx,
    advance: (s: number) => {
      now += s * 1000;
    },
  };
}
export const put = (inbox: string, src: string, name = `${Math.random().toString(36).slice(2)}.dcm`) => copyFileSync(src, join(inbox, name));
export const clinic = (f: string) => manifestPath(`fixtures/demo/clinic/${f}`);
