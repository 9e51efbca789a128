/**
 * Intake: 500 single-field plans sent by dcmtk's storescu over loopback (one association), received
 * by `plumbline receive` (the built command) and by dcmtk's own storescp in the same run (ratio of
 * receive times), and checked end to end (from the first byte sent to the last check recorded;
 * the pipeline looks at the inbox once a second). dcmtk runs with TCP_NODELAY=1. Best of 3. Run: npm run bench
 */
import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import net from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { freePort, writeServiceConfig } from '../lib/service-files.js';
import { writeSingleFieldPlan } from '../fixtures/single-field-plan.js';
import { SqliteHistoryStore } from '../../src/service/history/sqlite-store.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const N = 500;
/** dcmtk as packaged sets TCP_NODELAY only when asked: without it every object waits on delayed acknowledgements. */
const NODELAY = { ...process.env, TCP_NODELAY: '1' };
const root = mkdtempSync(join(tmpdir(), 'plumbline-bench-intake-'));
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const send = (port: number, files: string[]) => {
  const t0 = process.hrtime.bigint();
  const r = spawnSync('storescu', ['-aet', 'NG_TPS', '-aec', 'PLUMBLINE', '127.0.0.1', String(port), ...files], { encoding: 'utf8', env: NODELAY });
  if (r.status !== 0) throw new Error(`storescu failed: ${r.stderr}`);
  return Number(process.hrtime.bigint() - t0) / 1e9;
};
async function waitListening(port: number) {
  for (let i = 0; i < 200; i++) {
    const ok = await new Promise<boolean>((done) => {
      const s = net
        .connect(port, '127.0.0.1', () => {
          s.destroy();
          done(true);
        })
        .on('error', () => done(false));
    });
    if (ok) return;
    await sleep(50);
  }
  throw new Error('receiver did not start');
}

try {
  const dir = join(root, 'plans');
  mkdirSync(dir);
  const files = Array.from({ length: N }, (_, i) => {
    const file = join(dir, `p${i}.dcm`);
    writeSingleFieldPlan(file, { id: `P-${i}`, label: `BENCH ${i}`, patientName: 'Bench^Intake' });
    return file;
  });
  const results: { storescp: number; plumbline: number; endToEnd: number }[] = [];
  for (let run = 0; run < 3; run++) {
    // dcmtk's own receiver, the same files.
    const scpPort = await freePort();
    const scpDir = join(root, `scp${run}`);
    mkdirSync(scpDir);
    const scp = spawn('storescp', ['-aet', 'PLUMBLINE', '-od', scpDir, String(scpPort)], { stdio: 'ignore', env: NODELAY });
    await waitListening(scpPort);
    const storescp = send(scpPort, files);
    scp.kill();

    const port = await freePort();
    const work = join(root, `svc${run}`);
    mkdirSync(work);
    const config = writeServiceConfig(join(work, 'service.json'), {
      receiver: { port, aeTitle: 'PLUMBLINE', allowedCallingAeTitles: ['NG_TPS'] },
      history: { database: 'history.sqlite' },
      settleSeconds: 0,
    });
    const receiver: ChildProcess = spawn(process.execPath, [join(ROOT, 'dist/plumbline.mjs'), 'receive', '--config', config], { stdio: 'ignore' });
    await waitListening(port);
    const t0 = process.hrtime.bigint();
    const plumbline = send(port, files);
    const history = new SqliteHistoryStore(join(work, 'history.sqlite'));
    while ((await history.listChecks()).length < N) await sleep(20);
    const endToEnd = Number(process.hrtime.bigint() - t0) / 1e9;
    await history.close();
    receiver.kill('SIGTERM');
    results.push({ storescp, plumbline, endToEnd });
  }
  const best = results.sort((a, b) => a.endToEnd - b.endToEnd)[0]!;
  const receiveBest = Math.min(...results.map((r) => r.plumbline));
  const scpBest = Math.min(...results.map((r) => r.storescp));
  console.log(
    `intake of ${N} plans by storescu (one association): plumbline receive ${receiveBest.toFixed(2)} s (${(N / receiveBest).toFixed(0)} plans/s), storescp ${scpBest.toFixed(2)} s (${(N / scpBest).toFixed(0)} plans/s): ratio ${(receiveBest / scpBest).toFixed(2)}`,
  );
  console.log(`end to end (sent, received, checked, recorded): ${best.endToEnd.toFixed(2)} s, ${(N / best.endToEnd).toFixed(0)} plans/s`);
} finally {
  rmSync(root, { recursive: true, force: true });
}
