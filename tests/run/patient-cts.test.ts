/** The patient CTs of a run: every series among the paths with the density table; the body from a threshold or an EXTERNAL structure. */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeRtStruct } from '../../scripts/fixtures/rt-struct.js';
import { loadPatientCts } from '../../src/run/patient-cts.js';
import { manifestPath } from '../helpers/machines.js';

const PELVIS = manifestPath('fixtures/demo/clinic-ct/pelvis-box');
const dir = mkdtempSync(join(tmpdir(), 'plumbline-cts-'));

describe('loadPatientCts', () => {
  it('the demo pelvis series with the demo density table: one volume, the body by threshold', () => {
    const r = loadPatientCts([PELVIS], 'demo', -400);
    if (!r.ok) throw new Error(r.issues[0]!.message);
    expect(r.value).toHaveLength(1);
    expect(r.value[0]!.volume.slices).toBe(68);
    expect(r.value[0]!.bodySource).toBe('HU >= -400');
    expect(r.value[0]!.density(0)).toBeCloseTo(1, 2);
  });
  it('--ct without --density is refused, naming what is needed', () => {
    const r = loadPatientCts([PELVIS], undefined, -400);
    expect(!r.ok && r.issues[0]!.message).toBe("--ct needs --density: the clinic's HU to relative electron density table (CSV)");
  });
  it('a folder with no CT series is refused', () => {
    const r = loadPatientCts([dir], 'demo', -400);
    expect(!r.ok && r.issues[0]!.message).toMatch(/^no CT series found in /);
  });
  it('with a structure set: its EXTERNAL structure is the body; without one, refused', () => {
    const frame = (() => {
      const r = loadPatientCts([PELVIS], 'demo', -400);
      if (!r.ok) throw new Error('no CT');
      return r.value[0]!.volume.frameOfReferenceUid;
    })();
    const withBody = join(dir, 'body.dcm');
    writeRtStruct(withBody, 'body', frame, [
      {
        number: 1,
        name: 'Skin',
        type: 'EXTERNAL',
        contours: [
          [
            [-150, -150, 0],
            [150, -150, 0],
            [150, 150, 0],
          ],
        ],
      },
    ]);
    const r = loadPatientCts([PELVIS], 'demo', -400, withBody);
    expect(r.ok && r.value[0]!.bodySource).toBe('EXTERNAL "Skin"');
    const noBody = join(dir, 'ptv.dcm');
    writeRtStruct(noBody, 'ptv', frame, [
      {
        number: 1,
        name: 'PTV',
        type: 'PTV',
        contours: [
          [
            [-10, -10, 0],
            [10, -10, 0],
            [10, 10, 0],
          ],
        ],
      },
    ]);
    const refused = loadPatientCts([PELVIS], 'demo', -400, noBody);
    expect(!refused.ok && refused.issues[0]).toMatchObject({ file: noBody, message: 'the structure set has no EXTERNAL structure (the body)' });
  });
});
