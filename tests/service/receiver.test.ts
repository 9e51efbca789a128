/**
 * The receiver against real senders: dcmtk's echoscu and storescu (Debian). Association policy,
 * SOP classes, size limit, an association killed mid-transfer, and 20 concurrent associations of 50
 * plans each — all received, all checked once, none lost.
 */
import { spawn } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { connect } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeCtPhantom } from '../../scripts/fixtures/ct-phantom.js';
import { runPython } from '../../scripts/lib/find-python.js';
import { ServiceConfig } from '../../src/service/config.js';
import { openService, type RunningService, runService } from '../../src/service/run-service.js';
import { burstPlans } from '../helpers/burst-plans.js';
import { waitFor } from '../helpers/wait-for.js';
import { DEMO_MANIFEST } from '../helpers/machines.js';

const root = mkdtempSync(join(tmpdir(), 'plumbline-rx-'));
const config = ServiceConfig.parse({
  format: 'plumbline.service',
  formatVersion: 1,
  receiver: { host: '127.0.0.1', port: 0, aeTitle: 'PLUMBLINE', allowedCallingAeTitles: ['NG_TPS'], maxObjectBytes: 64 * 1024 * 1024 },
  folders: { inbox: join(root, 'inbox'), archive: join(root, 'archive'), refused: join(root, 'refused') },
  history: { kind: 'sqlite', file: join(root, 'history.sqlite') },
  beamData: [DEMO_MANIFEST],
  settleSeconds: 0,
});
let service: RunningService;
let port = 0;
const lines: string[] = [];
const incoming = () => readdirSync(join(config.folders.inbox, '.incoming'));

beforeAll(async () => {
  const opened = await openService(config);
  if (!opened.ok) throw new Error(opened.issues.map((i) => i.message).join('; '));
  service = await runService(opened.value, { receive: true, log: (l) => lines.push(l) });
  port = service.receiverPort!;
});
afterAll(async () => {
  await service.stop();
});

// The receiver runs in this process: the clients must run without blocking its event loop.
const run = (cmd: string, args: string[]) =>
  new Promise<{ status: number | null; stdout: string; stderr: string }>((done) => {
    const c = spawn(cmd, args);
    let stdout = '';
    let stderr = '';
    c.stdout.on('data', (d) => {
      stdout += d;
    });
    c.stderr.on('data', (d) => {
      stderr += d;
    });
    c.on('exit', (status) => done({ status, stdout, stderr }));
  });
const store = (files: string[], aet = 'NG_TPS') => run('storescu', ['-aet', aet, '-aec', 'PLUMBLINE', '127.0.0.1', String(port), ...files]);

describe('the DICOM receiver', () => {
  it('answers C-ECHO for an allowed calling AE title; rejects an unknown calling or called AE title at association', async () => {
    expect((await run('echoscu', ['-aet', 'NG_TPS', '-aec', 'PLUMBLINE', '127.0.0.1', String(port)])).status).toBe(0);
    const other = await run('echoscu', ['-aet', 'INTRUDER', '-aec', 'PLUMBLINE', '127.0.0.1', String(port)]);
    expect(other.status).not.toBe(0);
    expect(other.stderr + other.stdout).toMatch(/Calling AE Title Not Recognized/);
    expect((await run('echoscu', ['-aet', 'NG_TPS', '-aec', 'SOMEONE', '127.0.0.1', String(port)])).stderr).toMatch(/Called AE Title Not Recognized/);
  });

  it("refuses an SOP class the check does not use (pydicom's MR sample): nothing reaches the inbox", async () => {
    const mr = runPython('import pydicom, os; print(os.path.join(os.path.dirname(pydicom.__file__), "data", "test_files", "MR_small.dcm"))').trim();
    const before = readdirSync(config.folders.inbox).length;
    const r = await store([mr]);
    expect(r.status).not.toBe(0);
    expect(r.stderr + r.stdout).toMatch(/no presentation context|Presentation Context/i);
    expect(readdirSync(config.folders.inbox).length).toBe(before);
  });

  it('20 concurrent associations of 50 plans each: every plan received and checked exactly once, none lost', async () => {
    const batches = Array.from({ length: 20 }, (_, a) => burstPlans(join(root, 'load', String(a)), `L${a}`, 50));
    const results = await Promise.all(batches.map((b) => store(b)));
    expect(results.every((r) => r.status === 0)).toBe(true);
    const o = await openService(config);
    if (!o.ok) throw new Error('open');
    const history = o.value.history;
    expect(await waitFor(async () => (await history.listChecks()).length >= 1000, 60_000, 50)).toBe(true);
    const checks = await history.listChecks();
    expect(checks).toHaveLength(1000);
    expect(new Set(checks.map((c) => c.planSopInstanceUid)).size).toBe(1000);
    expect(checks.every((c) => c.verdict !== undefined)).toBe(true);
    await history.close();
    expect(readdirSync(config.folders.inbox).filter((f) => !f.startsWith('.'))).toEqual([]);
    // Files stay in the configured folders, named by content hash: nothing in an object decides a path.
    const archived = readdirSync(config.folders.archive).flatMap((d) => readdirSync(join(config.folders.archive, d)));
    expect(archived.length).toBeGreaterThanOrEqual(1000);
    expect(archived.every((f) => /^[0-9a-f]{64}\.dcm$/.test(f))).toBe(true);
    expect(readdirSync(root).sort()).toEqual(['archive', 'history.sqlite', 'history.sqlite-shm', 'history.sqlite-wal', 'inbox', 'load']);
  }, 120_000);

  it('a second send of the same plans is recognised: not checked twice', async () => {
    const again = burstPlans(join(root, 'load', '0'), 'L0', 50);
    expect((await store(again)).status).toBe(0);
    await waitFor(() => readdirSync(config.folders.inbox).filter((f) => !f.startsWith('.')).length === 0, 20_000);
    expect(lines.join('\n')).toMatch(/duplicate: plan/);
    const o = await openService(config);
    if (!o.ok) throw new Error('open');
    expect(await o.value.history.listChecks()).toHaveLength(1000);
    await o.value.history.close();
  }, 30_000);

  it('an association killed in the middle of a large object leaves no partial file; an object over the size limit is refused', async () => {
    const dir = join(root, 'big');
    mkdirSync(dir);
    // One CT slice of 5 000 × 5 000 voxels (50 MB): long enough on the wire to be interrupted.
    const [big] = writeCtPhantom(dir, {
      name: 'big',
      columns: 5000,
      rows: 5000,
      slices: 1,
      spacingMm: [0.1, 0.1, 1],
      originMm: [0, 0, 0],
      frameOfReferenceUid: '1.2.826.0.1.3680043.2.1125.9',
      hu: () => 0,
    });
    const sender = spawn('storescu', ['-aet', 'NG_TPS', '-aec', 'PLUMBLINE', '--max-pdu', '4096', '127.0.0.1', String(port), big!], {
      stdio: 'ignore',
    });
    expect(await waitFor(() => incoming().length > 0, 10_000)).toBe(true);
    sender.kill('SIGKILL');
    expect(await waitFor(() => incoming().length === 0, 10_000)).toBe(true);
    expect(readdirSync(config.folders.inbox).filter((f) => !f.startsWith('.'))).toEqual([]);
    // Over the limit (64 MiB here): a 70 MB slice is answered with a failure and not kept.
    const [huge] = writeCtPhantom(dir, {
      name: 'huge',
      columns: 6000,
      rows: 6000,
      slices: 1,
      spacingMm: [0.1, 0.1, 1],
      originMm: [0, 0, 0],
      frameOfReferenceUid: '1.2.826.0.1.3680043.2.1125.9',
      hu: () => 0,
    });
    const r = await store([huge!]);
    // storescu exits with the status's high byte (0xA7: refused, out of resources).
    expect(r.status).toBe(0xa7);
    expect(lines.join('\n')).toMatch(/refused an object of \d+ bytes/);
    expect(readdirSync(config.folders.inbox).filter((f) => !f.startsWith('.'))).toEqual([]);
  }, 60_000);

  it('an association request declaring a 48 MB PDU is closed from its 6-byte header, the body never awaited', async () => {
    const header = Buffer.alloc(6);
    header[0] = 0x01; // A-ASSOCIATE-RQ
    header.writeUInt32BE(48 * 1024 ** 2, 2);
    const closed = await new Promise<boolean>((done) => {
      const s = connect(port, '127.0.0.1', () => s.write(Buffer.concat([header, Buffer.alloc(1024)])));
      s.on('close', () => done(true));
      s.on('error', () => {});
      setTimeout(() => done(false), 3000);
    });
    expect(closed).toBe(true);
    expect(lines.some((l) => /a PDU declares 50331648 bytes/.test(l))).toBe(true);
  });
});
