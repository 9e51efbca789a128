/** A machine's beam data validated as `beams validate` reports it: what was read, and every problem. */
import { describe, expect, it } from 'vitest';
import { validateMachine } from '../../src/run/validate-machine.js';
import { loadMachine } from '../../src/beamdata/load-machine.js';
import { KHAN_MANIFEST } from '../helpers/machines.js';

describe('validateMachine', () => {
  it('the demo machine: its beams and tables counted, no error', () => {
    const v = validateMachine('demo');
    const loaded = loadMachine(v.file);
    if (!loaded.ok) throw new Error('the demo machine did not load');
    const m = loaded.value.machine;
    expect(v.loaded).toEqual({ photonBeams: m.beams.length, electronBeams: m.electronBeams.length, tables: loaded.value.tables.length });
    expect(v.loaded!.tables).toBeGreaterThan(10);
    expect(v.issues.filter((i) => i.severity === 'error')).toEqual([]);
  });
  it("Khan's example machine: one photon beam of three tables", () => {
    expect(validateMachine(KHAN_MANIFEST).loaded).toEqual({ photonBeams: 1, electronBeams: 0, tables: 3 });
  });
  it('a manifest that is not there: the issue, and nothing said loaded', () => {
    const v = validateMachine('no/such/manifest.json');
    expect(v.loaded).toBeUndefined();
    expect(v.issues[0]!.code).toBe('unreadable');
  });
});
