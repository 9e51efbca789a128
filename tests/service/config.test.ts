import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeServiceConfig } from '../../scripts/lib/service-files.js';
import { loadServiceConfig } from '../../src/service/config.js';

describe('the service configuration', () => {
  it('makes its relative paths absolute from its own folder, the page on loopback by default', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-config-'));
    const file = join(dir, 'service.json');
    writeServiceConfig(file, {
      folders: { inbox: 'in', archive: 'arch', refused: 'ref' },
      history: { kind: 'sqlite', file: 'h.sqlite' },
      beamData: ['demo', 'machines/linac2.json'],
      serve: { tls: { cert: 'c.pem', key: 'k.pem' } },
    });
    const c = loadServiceConfig(file);
    if (!c.ok) throw new Error(c.issues.map((i) => i.message).join('; '));
    expect(c.value.folders.inbox).toBe(join(dir, 'in'));
    expect(c.value.history).toEqual({ kind: 'sqlite', file: join(dir, 'h.sqlite') });
    expect(c.value.beamData).toEqual(['demo', join(dir, 'machines/linac2.json')]);
    expect(c.value.serve).toMatchObject({
      host: '127.0.0.1',
      port: 8470,
      behindProxy: false,
      sessionHours: 8,
      tls: { cert: join(dir, 'c.pem'), key: join(dir, 'k.pem') },
    });
    expect(c.value.settleSeconds).toBe(30);
  });
  it('refuses an unknown attribute, naming it', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-config-'));
    const file = join(dir, 'service.json');
    writeServiceConfig(file, {
      folders: { inbox: 'i', archive: 'a', refused: 'r' },
      history: { database: 'h' },
      colour: 'blue',
    });
    const c = loadServiceConfig(file);
    expect(c.ok ? '' : c.issues.map((i) => i.message).join('; ')).toMatch(/colour/);
  });
});
