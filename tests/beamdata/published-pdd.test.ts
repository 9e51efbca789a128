/**
 * The clinic's 10 × 10 PDD beside published data of the same quality. Check values: BJR Supplement 25
 * (1996), Tables 5.2.1–5.5.1, read from a secondary copy (shared/reference/check-values.md, 3.1); the
 * TPR20,10 relation of IAEA TRS-398 (from the same page, 6.2).
 */
import { describe, expect, it } from 'vitest';
import { comparePublishedPdd, tpr2010FromPdd } from '../../src/beamdata/index.js';
import type { PhotonBeamModel } from '../../src/model/index.js';
import { DEMO_MANIFEST, beam, machine } from '../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const x6 = beam(demo, '6X') as PhotonBeamModel;

describe('comparing with published PDD', () => {
  it('TPR20,10 of the published 6 MV beam is 0.678 (derived in check-values.md)', () => {
    expect(tpr2010FromPdd(67.5, 39.3)).toBeCloseTo(0.678, 3);
  });
  it("the demo's 6 MV beam sits on the published 6 MV values", () => {
    const c = comparePublishedPdd(x6);
    expect(c.rows.map((r) => Math.abs(r.differencePercent) < 0.1)).toEqual([true, true]);
  });
  it('the 10 cm column shifted by 1 cm of depth is flagged beyond 2 %', () => {
    const pdd = x6.pdd!;
    const shifted: PhotonBeamModel = {
      ...x6,
      pdd: { ...pdd, at: (d: number, f: number, log) => (f === 10 ? pdd.at(d + 1, f, log) : pdd.at(d, f, log)) },
    };
    const c = comparePublishedPdd(shifted);
    expect(c.rows.some((r) => Math.abs(r.differencePercent) > 2)).toBe(true);
  });
  it('a beam measured at another SSD, and one of a quality beyond the published range, are not compared, with the reason', () => {
    expect(comparePublishedPdd({ ...x6, pdd: { ...x6.pdd!, ssdCm: 90 } }).notCompared).toMatch(/SSD 90 cm/);
    expect(comparePublishedPdd(beam(demo, '15X') as PhotonBeamModel).notCompared).toMatch(/outside the published range/);
  });
});
