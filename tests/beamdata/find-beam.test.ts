/** A beam of the machine by its nominal energy: never a neighbouring energy (project rule). */
import { describe, expect, it } from 'vitest';
import { findElectronBeam, findPhotonBeam } from '../../src/beamdata/index.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);

describe('finding a beam by its energy', () => {
  it('finds the photon and electron beams the data have', () => {
    const x = findPhotonBeam(demo, 6);
    expect(x.ok && x.value.id).toBe('6X');
    const e = findElectronBeam(demo, 9);
    expect(e.ok && e.value.nominalEnergyMeV).toBe(9);
  });
  it('refuses an energy the data lack, naming those they have, rather than take the nearest', () => {
    const x = findPhotonBeam(demo, 6.5);
    expect(x.ok).toBe(false);
    if (!x.ok) expect(x.issues[0]).toMatchObject({ code: 'missing-table', found: '6.5 MV', expected: '6 MV, 10 MV, 15 MV' });
    expect(findPhotonBeam(demo, 6, true).ok).toBe(false); // no FFF beam in the demo data
    const e = findElectronBeam(demo, 8);
    expect(!e.ok && e.issues[0]!.found).toBe('8 MeV');
  });
});
