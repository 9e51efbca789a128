import { describe, expect, it } from 'vitest';
import { RING_EPS_MM, RingWriter, ringsOf } from '../../src/geometry/packed-rings.js';

describe('Clarkson rings packed flat', () => {
  it('keeps each sector outward from the point; a ring of the same weight extends the last, a ring too short is dropped', () => {
    const w = new RingWriter();
    w.begin(2);
    w.push(10, 1);
    w.push(20, 1); // same weight: the first ring now reaches 20 mm
    w.push(20 + RING_EPS_MM / 2, 0.02); // too short a ring: none
    w.push(35, 0.02); // under the leaves
    w.endSector();
    w.push(5, 0.02);
    w.push(50, 1);
    w.endSector();
    const p = w.finish();
    expect(p.start).toEqual([0, 2, 4]);
    expect(ringsOf(p)).toEqual([
      [
        { outerMm: 20, weight: 1 },
        { outerMm: 35, weight: 0.02 },
      ],
      [
        { outerMm: 5, weight: 0.02 },
        { outerMm: 50, weight: 1 },
      ],
    ]);
  });
  it('grows its buffers past their first size and starts afresh on the next use', () => {
    const w = new RingWriter();
    w.begin(1);
    for (let k = 1; k <= 3000; k++) w.push(k, k % 2);
    w.endSector();
    expect(w.finish().outerMm).toHaveLength(3000);
    w.begin(1);
    w.push(7, 1);
    w.endSector();
    expect(ringsOf(w.finish())).toEqual([[{ outerMm: 7, weight: 1 }]]);
  });
});
