/**
 * Clarkson rings of a jaw-and-leaf aperture: the leaf-band walk used for every MLC field against
 * hand calculations, and against the general edge-crossing form on random apertures (two
 * independent ways to the same rings). Geometry only: each expected value follows from the
 * rectangles drawn in the test (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { apertureAt, crossingRings, type Ring, ringsOf } from '../../src/geometry/index.js';
import { modelBeam, modelControlPoint } from '../helpers/model-beam.js';

const beam = (mlc?: { type: 'MLCX' | 'MLCY'; pairs: number; width: number }, jaws = { x: true, y: true }) =>
  modelBeam(mlc ? { type: mlc.type, pairs: mlc.pairs, widthMm: mlc.width } : undefined, jaws);
const cp = modelControlPoint;
const T = 0.015;
const close = (rings: readonly Ring[], expected: [number, number][]) => {
  expect(rings.map((r) => r.weight)).toEqual(expected.map((e) => e[1]));
  rings.forEach((r, k) => expect(r.outerMm).toBeCloseTo(expected[k]![0], 9));
};

describe('Clarkson rings by the leaf-band walk', () => {
  it('a sector leaving a C-shaped opening and entering it again, then under no leaves to the jaw', () => {
    // Three 10 mm pairs: the lower and upper open from −50 to 50, the middle only from −50 to −20.
    const a = apertureAt(
      beam({ type: 'MLCX', pairs: 3, width: 10 }),
      cp([-100, 100], [-100, 100], { type: 'MLCX', positionsMm: [-50, -50, -50, 50, -20, 50] }),
    )!;
    // From (30, −10) straight up: open to y = −5, under the middle pair's leaf to 5, open to 15, then
    // within the jaws but past the leaf bank (counted as under the leaves) to the jaw at y = 100.
    close(ringsOf(a.sectorRingsMm(30, -10, 2, T))[0]!, [
      [5, 1],
      [15, T],
      [25, 1],
      [110, T],
    ]);
  });

  it('a point outside the jaws: nothing until the ray enters the opening', () => {
    const a = apertureAt(beam(), cp([-50, 50], [-50, 50]))!;
    // One sector, pointing at 180°: from x = 80 the jaw edge at x = 50 is 30 mm away, the far one 130 mm.
    close(ringsOf(a.sectorRingsMm(80, 0, 1, T))[0]!, [
      [30, 0],
      [130, 1],
    ]);
    close(ringsOf(crossingRings(a, [], 80, 0, 1, T))[0]!, [
      [30, 0],
      [130, 1],
    ]);
  });

  it('leaves along X (MLCX) and along Y (MLCY) give the rings of the general form', () => {
    const leaves = [-50, -50, -50, 50, -20, 50];
    const x = apertureAt(beam({ type: 'MLCX', pairs: 3, width: 10 }), cp([-100, 100], [-100, 100], { type: 'MLCX', positionsMm: leaves }))!;
    const y = apertureAt(beam({ type: 'MLCY', pairs: 3, width: 10 }), cp([-100, 100], [-100, 100], { type: 'MLCY', positionsMm: leaves }))!;
    for (const a of [x, y]) {
      const fast = ringsOf(a.sectorRingsMm(12, -7, 36, T));
      const slow = ringsOf(crossingRings(a, [], 12, -7, 36, T));
      fast.forEach((rings, i) =>
        close(
          rings,
          slow[i]!.map((r) => [r.outerMm, r.weight]),
        ),
      );
    }
  });

  it('agrees with the general edge-crossing form on random leaf patterns, points inside and outside the field', () => {
    let seed = 12345;
    const rand = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    let checked = 0;
    for (let trial = 0; trial < 200; trial++) {
      const type = trial % 2 ? 'MLCY' : 'MLCX';
      const pairs = 4 + Math.floor(rand() * 20);
      const width = 5 + Math.floor(rand() * 3) * 2.5;
      const positions: number[] = [];
      const bank1 = Array.from({ length: pairs }, () => Math.round((rand() * 160 - 100) * 10) / 10);
      const bank2 = bank1.map((l) => (rand() < 0.15 ? l : Math.round((l + rand() * 120 - 10) * 10) / 10)); // some closed, some crossing
      positions.push(...bank1, ...bank2);
      const withJaws = { x: trial % 5 !== 0, y: trial % 7 !== 0 };
      const a = apertureAt(
        beam({ type, pairs, width }, withJaws),
        cp(withJaws.x ? [-60, 70] : undefined, withJaws.y ? [-45, 55] : undefined, { type, positionsMm: positions }),
      );
      if (!a || a.areaMm2 === 0) continue;
      checked++;
      const px = rand() * 200 - 100;
      const py = rand() * 200 - 100;
      const fast = ringsOf(a.sectorRingsMm(px, py, 72, T));
      const slow = ringsOf(crossingRings(a, [], px, py, 72, T));
      fast.forEach((rings, i) => {
        expect(
          rings.map((r) => r.weight),
          `trial ${trial} sector ${i}`,
        ).toEqual(slow[i]!.map((r) => r.weight));
        rings.forEach((r, k) => expect(Math.abs(r.outerMm - slow[i]![k]!.outerMm), `trial ${trial} sector ${i} ring ${k}`).toBeLessThan(1e-7));
      });
    }
    expect(checked).toBeGreaterThan(150);
  });
});
