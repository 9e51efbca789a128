import { describe, expect, it } from 'vitest';
import { loadMachine } from '../../src/beamdata/index.js';
import { InternalError } from '../../src/errors.js';
import { loadBeamData } from '../../src/run/index.js';
import { beamDataStamp } from '../../src/run/beam-data-stamp.js';
import { DEMO_MANIFEST } from '../helpers/machines.js';

describe('the stamp of the beam data a result was computed from', () => {
  it('names the manifest, machine, version, hash and how validation went, once per load', () => {
    const loaded = loadBeamData(DEMO_MANIFEST);
    if (!loaded.ok) throw new Error(loaded.issues.map((i) => i.message).join('; '));
    const s = beamDataStamp(loaded.value);
    expect(s).toMatchObject({ machine: 'NG_LINAC1', invented: true, validationWarnings: 0 });
    expect(s.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(beamDataStamp(loaded.value)).toBe(s);
  });
  it('is never made for beam data that did not pass validation: that is a bug, thrown', () => {
    const raw = loadMachine(DEMO_MANIFEST);
    if (!raw.ok) throw new Error('demo');
    expect(() => beamDataStamp(raw.value)).toThrow(InternalError);
  });
});
