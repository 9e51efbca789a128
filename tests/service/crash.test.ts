/**
 * A receiver killed with SIGKILL in the middle of a burst from dcmtk's storescu, then restarted:
 * every object whose success response storescu received is checked after the restart (the built
 * command, dist/plumbline.mjs, run as its own process).
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { mkdirSync, mkdtempSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { freePort, writeServiceConfig } from '../../scripts/lib/service-files.js';
import { describe, expect, it } from 'vitest';
import { RT_PLAN_STORAGE, writeDataset } from '../../scripts/lib/dcmjs-writer.js';
import { coordinatesDoseReference, planDataset, staticBeam } from '../../scripts/fixtures/plan-parts.js';
import { SqliteHistoryStore } from '../../src/service/history/sqlite-store.js';
import { waitFor } from '../helpers/wait-for.js';

const BIN = fileURLToPath(new URL('../../dist/plumbline.mjs', import.meta.url));

describe('a receiver killed during a burst', () => {
  it('processes, after its restart, everything it acknowledged', async () => {
    const root = mkdtempSync(join(tmpdir(), 'plumbline-crash-'));
    const port = await freePort();
    const config = writeServiceConfig(join(root, 'service.json'), {
      receiver: { port, aeTitle: 'PLUMBLINE', allowedCallingAeTitles: ['NG_TPS'] },
      history: { database: 'history.sqlite' },
      settleSeconds: 0,
    });
    const dir = join(root, 'plans');
    mkdirSync(dir);
    const iso: [number, number, number] = [0, 0, 0];
    const labels = new Map<string, string>();
    const files = Array.from({ length: 300 }, (_, i) => {
      const file = join(dir, `burst-${i}.dcm`);
      writeDataset(
        file,
        planDataset({
          file: `burst-${i}.dcm`,
          patientId: `B-${i}`,
          patientName: 'Burst^Test',
          label: `BURST ${i}`,
          name: 'burst',
          description: 'test',
          doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 2)],
          fractionGroups: [{ number: 1, fractions: 1, prescriptionGy: 2, beams: [{ number: 1, mu: 200, doseGy: 2, specPoint: iso }] }],
          beams: [staticBeam(1, 'AP', 6, 0, 900, iso)],
        }),
        RT_PLAN_STORAGE,
      );
      labels.set(file, `BURST ${i}`);
      return file;
    });
    const start = () => {
      const c = spawn(process.execPath, [BIN, 'receive', '--config', config], { stdio: ['ignore', 'ignore', 'pipe'] });
      let err = '';
      c.stderr!.on('data', (d) => {
        err += d;
      });
      return { c, log: () => err };
    };
    const inbox = join(root, 'inbox');
    let receiver: { c: ChildProcess; log: () => string } = start();
    expect(await waitFor(() => receiver.log().includes('receiving as PLUMBLINE'), 20_000)).toBe(true);

    // storescu -v names each file before sending it and reports each response.
    const sender = spawn('storescu', ['-v', '-aet', 'NG_TPS', '-aec', 'PLUMBLINE', '127.0.0.1', String(port), ...files]);
    let out = '';
    sender.stdout.on('data', (d) => {
      out += d;
    });
    sender.stderr.on('data', (d) => {
      out += d;
    });
    const done = new Promise<void>((r) => sender.on('exit', () => r()));
    const acknowledgedSoFar = () => (out.match(/Received Store Response \(Success\)/g) ?? []).length;
    expect(await waitFor(() => acknowledgedSoFar() >= 60, 30_000)).toBe(true);
    receiver.c.kill('SIGKILL');
    await done;

    // Which files were acknowledged: each "Sending file" followed by a success response.
    const acknowledged: string[] = [];
    let current: string | undefined;
    for (const line of out.split('\n')) {
      const sending = /Sending file: (.*)$/.exec(line);
      if (sending) current = sending[1]!.trim();
      else if (/Received Store Response \(Success\)/.test(line) && current) acknowledged.push(current);
    }
    expect(acknowledged.length).toBeGreaterThanOrEqual(60);
    expect(acknowledged.length).toBeLessThan(files.length);

    receiver = start();
    const historyFile = join(root, 'history.sqlite');
    const checkedLabels = async () => {
      const h = new SqliteHistoryStore(historyFile);
      try {
        return new Set((await h.listChecks()).map((c) => c.planLabel));
      } finally {
        await h.close();
      }
    };
    expect(
      await waitFor(async () => {
        if (readdirSync(inbox).filter((f) => !f.startsWith('.')).length) return false;
        const labelsChecked = await checkedLabels();
        return acknowledged.every((f) => labelsChecked.has(labels.get(f)!));
      }, 60_000),
    ).toBe(true);
    const h = new SqliteHistoryStore(historyFile);
    const checks = await h.listChecks();
    await h.close();
    // None checked twice, though the kill may have fallen between a check and its archiving.
    expect(new Set(checks.map((c) => c.planSopInstanceUid)).size).toBe(checks.length);
    receiver.c.kill('SIGTERM');
  }, 120_000);
});
