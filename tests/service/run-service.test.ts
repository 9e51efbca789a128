/**
 * The service's pieces opened from its configuration (each refusal said), and intake running: a
 * plan dropped in the watched folder is taken, checked and recorded once, passes run one at a time.
 * The DICOM receiver's part runs with dcmtk's storescu in tests/service/receiver.test.ts.
 */
import { copyFileSync, mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ServiceConfig } from '../../src/service/config.js';
import { openService, runService } from '../../src/service/run-service.js';
import { demoPlan } from '../helpers/fixtures.js';
import { DEMO_MANIFEST, manifestPath } from '../helpers/machines.js';
import { waitFor } from '../helpers/wait-for.js';

const configIn = (root: string, extra: Record<string, unknown> = {}) =>
  ServiceConfig.parse({
    format: 'plumbline.service',
    formatVersion: 1,
    folders: { inbox: join(root, 'inbox'), archive: join(root, 'archive'), refused: join(root, 'refused') },
    history: { kind: 'sqlite', file: join(root, 'history.sqlite') },
    beamData: [DEMO_MANIFEST],
    settleSeconds: 0,
    watchStableSeconds: 0,
    ...extra,
  });

describe('openService', () => {
  it('beam data, policy and history from the configuration', async () => {
    const o = await openService(configIn(mkdtempSync(join(tmpdir(), 'plumbline-svc-'))));
    if (!o.ok) throw new Error(o.issues[0]!.message);
    expect(o.value.machines.map((m) => m.machine.name)).toEqual(['NG_LINAC1']);
    await o.value.history.close();
  });
  it('refuses beam data it cannot load, and a policy it cannot read', async () => {
    const root = mkdtempSync(join(tmpdir(), 'plumbline-svc-'));
    expect((await openService(configIn(root, { beamData: [join(root, 'none.json')] }))).ok).toBe(false);
    const policy = join(root, 'policy.json');
    writeFileSync(policy, 'not json');
    expect((await openService(configIn(root, { policy }))).ok).toBe(false);
  });
});

describe('runService', () => {
  it('a plan dropped in the watched folder is checked and recorded once; passes asked for together run one after the other', async () => {
    const root = mkdtempSync(join(tmpdir(), 'plumbline-svc-'));
    const watch = join(root, 'watch');
    mkdirSync(watch);
    const o = await openService(configIn(root));
    if (!o.ok) throw new Error(o.issues[0]!.message);
    const lines: string[] = [];
    const service = await runService(o.value, { receive: false, watch, log: (l) => lines.push(l) });
    try {
      copyFileSync(manifestPath('fixtures/demo/clinic/brain-laterals.dcm'), join(watch, 'plan.dcm'));
      const done = await waitFor(async () => (await o.value.history.listChecks()).length === 1, 15_000, 100);
      console.log(lines.join('\n'));
      expect(done).toBe(true);
      await Promise.all([service.pass(), service.pass(), service.pass()]);
      expect(await o.value.history.listChecks()).toHaveLength(1);
      expect(lines.some((l) => /took 1 file\(s\) from/.test(l))).toBe(true);
      expect(lines.some((l) => /pass: 1 checked/.test(l))).toBe(true);
    } finally {
      await service.stop();
    }
  }, 30_000);
  it('a plan for a beam the data lack is refused, the reason said once for its four beams', async () => {
    const root = mkdtempSync(join(tmpdir(), 'plumbline-svc-'));
    const o = await openService(configIn(root));
    if (!o.ok) throw new Error(o.issues[0]!.message);
    const lines: string[] = [];
    const service = await runService(o.value, { receive: false, log: (l) => lines.push(l) });
    try {
      // The four-field demo plan asks for 18 MV, which the demo clinic's machine does not have.
      mkdirSync(o.value.config.folders.inbox, { recursive: true });
      copyFileSync(demoPlan('four-field-box.dcm'), join(o.value.config.folders.inbox, 'box.dcm'));
      await service.pass();
      const refused = lines.find((l) => l.startsWith('refused box.dcm'))!;
      expect(refused.match(/has no 18 MV photon beam/g)).toHaveLength(1);
    } finally {
      await service.stop();
    }
  });
});
