import { describe, expect, it } from 'vitest';
import { apertureAt } from '../../src/geometry/index.js';
import { equivalentSquareCm } from '../../src/physics/index.js';
import type { Beam, ControlPoint } from '../../src/model/index.js';
import { modelBeam, modelControlPoint } from '../helpers/model-beam.js';

const beam = (mlc?: { pairs: number; width: number }) => modelBeam(mlc ? { pairs: mlc.pairs, widthMm: mlc.width } : undefined);
const cp = modelControlPoint;

describe('aperture of jaws and leaves', () => {
  it('jaws alone: a 100 x 120 mm rectangle, whose 4A/P is the rectangle equivalent square', () => {
    const a = apertureAt(beam(), cp([-50, 50], [-40, 80]))!;
    expect(a.areaMm2).toBe(12000);
    expect(a.perimeterMm).toBe(440);
    expect((4 * a.areaMm2) / a.perimeterMm / 10).toBeCloseTo(equivalentSquareCm(10, 12), 12);
    expect(a.centroidMm).toEqual([0, 20]);
    expect(a.edgeDistanceMm(0, 0)).toBe(40);
    expect(a.edgeDistanceMm(60, 0)).toBe(-10);
  });

  it('the dosimetric leaf gap widens each open pair by its width, half at each end, never beyond the jaws; closed pairs stay closed', () => {
    // Four 10 mm pairs across y −20…20: open 0…10 mm, open 40…48 (widened, its right end under the jaw at 48.5),
    // closed at 0 (touching), closed with crossed leaves. Gap 2 mm (by hand, the gap's definition).
    const leaves = [0, 40, 0, 5, 10, 48, 0, 4];
    const plain = apertureAt(beam({ pairs: 4, width: 10 }), cp([-49, 48.5], [-20, 20], leaves))!;
    const wide = apertureAt(beam({ pairs: 4, width: 10 }), cp([-49, 48.5], [-20, 20], leaves), 2)!;
    expect(plain.areaMm2).toBe(10 * 10 + 8 * 10);
    expect(wide.areaMm2).toBe(12 * 10 + 9.5 * 10);
    expect(wide.isOpen(-0.9, -15)).toBe(true);
    expect(wide.isOpen(0, -5)).toBe(false);
    expect(wide.isOpen(4.5, 15)).toBe(false);
  });

  it('leaves open wider than the jaws change nothing', () => {
    const n = 40;
    const leaves = [...Array(n).fill(-150), ...Array(n).fill(150)];
    const a = apertureAt(beam({ pairs: n, width: 10 }), cp([-50, 50], [-40, 80], leaves))!;
    expect(a.areaMm2).toBeCloseTo(12000, 9);
    expect(a.perimeterMm).toBeCloseTo(440, 9);
  });

  it('a step in the leaves: an L-shape has the area and perimeter of its outline', () => {
    // Two pairs of 10 mm: the lower open from -50 to 50, the upper from 0 to 50, jaws wide open.
    const a = apertureAt(beam({ pairs: 2, width: 10 }), cp([-100, 100], [-100, 100], [-50, 0, 50, 50]))!;
    expect(a.areaMm2).toBe(1000 + 500);
    expect(a.perimeterMm).toBe(100 + 10 + 50 + 10 + 50 + 20); // bottom, left low, step, left high, top, right
    expect(a.edgeDistanceMm(25, -5)).toBe(5);
    expect(a.edgeDistanceMm(-25, -2)).toBe(2); // the step above it
    expect(a.edgeDistanceMm(-25, 5)).toBe(-5); // above the step: outside
  });

  it('closed leaves add no area and no edges', () => {
    const a = apertureAt(beam({ pairs: 3, width: 10 }), cp([-100, 100], [-100, 100], [0, -20, 0, 0, 20, 0]))!;
    expect(a.areaMm2).toBe(400);
    expect(a.perimeterMm).toBe(100);
  });
});

describe('an MLC without X jaws', () => {
  it('takes the collimating extent along X from the leaves', () => {
    const b: Beam = {
      ...beam({ pairs: 4, width: 10 }),
      limitingDevices: beam({ pairs: 4, width: 10 }).limitingDevices.filter((d) => d.type !== 'ASYMX'),
    };
    const c: ControlPoint = { ...cp([-1, 1], [-20, 20], [-30, -40, -30, 0, 30, 10, 30, 0]) };
    const a = apertureAt(b, { ...c, devices: c.devices.filter((d) => d.type !== 'ASYMX') })!;
    expect(a.hasJaws).toEqual({ x: false, y: true });
    expect(a.openExtentMm).toEqual({ x1: -40, x2: 30, y1: -20, y2: 10 }); // the top pair is closed
  });
});

describe('sector crossings for Clarkson integration', () => {
  it('from the centre of a 100 x 100 mm jaw field: the distance to the edge in each sector', () => {
    const a = apertureAt(beam(), cp([-50, 50], [-50, 50]))!;
    const s = a.sectorCrossingsMm(0, 0, 8);
    // Mid-sector directions 22.5°, 67.5°, …: the edge at 50 / cos 22.5° (hand calculation).
    for (const xs of s) expect(xs).toEqual([expect.closeTo(50 / Math.cos(Math.PI / 8), 9)]);
  });
  it('a sector leaving a C-shaped opening and entering it again lists every crossing', () => {
    // Three 10 mm pairs: the lower and upper open from −50 to 50, the middle only from −50 to −20.
    const a = apertureAt(beam({ pairs: 3, width: 10 }), cp([-100, 100], [-100, 100], [-50, -50, -50, 50, -20, 50]))!;
    // From (30, −10) straight up (the first of two sectors points at 90°): out at y = −5, in at 5, out at 15.
    expect(a.sectorCrossingsMm(30, -10, 2)[0]).toEqual([expect.closeTo(5, 9), expect.closeTo(15, 9), expect.closeTo(25, 9)]);
  });
});

describe('the outline length of a jaw-and-leaf opening', () => {
  it('equals the count of cell edges between open and closed cells of a 0.5 mm raster (leaf and jaw positions on that grid)', () => {
    let seed = 99;
    const rand = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    const step = 0.5;
    for (let trial = 0; trial < 20; trial++) {
      const pairs = 10;
      const width = 10;
      const bank1 = Array.from({ length: pairs }, () => Math.round(rand() * 120 - 80) * step * 2);
      const bank2 = bank1.map((l) => (rand() < 0.2 ? l : l + Math.round(rand() * 80) * step * 2));
      const a = apertureAt(beam({ pairs, width }), cp([-60, 55], [-42.5, 37.5], [...bank1, ...bank2]))!;
      // Raster cell centres, inside = open (cells are never on an edge: edges lie on the grid).
      const n = Math.round(200 / step);
      const inside = (i: number, j: number) => i >= 0 && j >= 0 && i < n && j < n && a.isOpen(-100 + (i + 0.5) * step, -100 + (j + 0.5) * step);
      let edges = 0;
      for (let i = -1; i < n; i++)
        for (let j = -1; j < n; j++) {
          if (inside(i, j) !== inside(i + 1, j)) edges++;
          if (inside(i, j) !== inside(i, j + 1)) edges++;
        }
      expect(a.perimeterMm).toBeCloseTo(edges * step, 9);
    }
  });
});

describe('the distance from a point to the outline of a jaw-and-leaf opening', () => {
  it('equals the distance to the nearest 0.5 mm raster cell on the other side, within a cell (random leaf patterns)', () => {
    let seed = 2024;
    const rand = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    const step = 0.5;
    for (let trial = 0; trial < 12; trial++) {
      const pairs = 10;
      const bank1 = Array.from({ length: pairs }, () => Math.round(rand() * 120 - 80));
      const bank2 = bank1.map((l) => (rand() < 0.2 ? l : l + Math.round(rand() * 80)));
      const a = apertureAt(beam({ pairs, width: 10 }), cp([-60, 55], [-42.5, 37.5], [...bank1, ...bank2]))!;
      const n = Math.round(160 / step);
      const centres: [number, number, boolean][] = [];
      for (let i = 0; i < n; i++)
        for (let j = 0; j < n; j++) {
          const x = -80 + (i + 0.5) * step;
          const y = -80 + (j + 0.5) * step;
          centres.push([x, y, a.isOpen(x, y)]);
        }
      for (let k = 0; k < 5; k++) {
        const px = rand() * 120 - 60;
        const py = rand() * 80 - 40;
        const open = a.isOpen(px, py);
        let nearest = Infinity;
        for (const [x, y, o] of centres) if (o !== open) nearest = Math.min(nearest, Math.hypot(x - px, y - py));
        const d = a.edgeDistanceMm(px, py);
        expect(Math.sign(d) || 1, `trial ${trial} point ${k}`).toBe(open ? 1 : -1);
        expect(Math.abs(Math.abs(d) - nearest), `trial ${trial} point ${k}`).toBeLessThanOrEqual(step);
      }
    }
  });
});
