/**
 * Depths through analytic phantoms built in memory (HU sampled at each voxel centre, as a scanner
 * stores it), compared with depths computed by hand from the phantom's geometry (exact: the phantom's faces lie
 * on voxel boundaries). HU to density for these tests (test data, not a calibration):
 * −1000 → 0, 0 → 1, 1000 → 1.5, 3000 → 2.5.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ctNoiseHu } from '../helpers/noise.js';
import { loadDensityTable } from '../../src/beamdata/index.js';
import { beamFrame, bodySurface, ctDepth, ctSsdAlongAxisMm, traceRay, type Vec3 } from '../../src/geometry/index.js';
import type { ControlPoint, CtVolume, PatientPosition } from '../../src/model/index.js';
import { sampledVolume } from '../helpers/model-ct.js';
import { anglesControlPoint } from '../helpers/model-beam.js';

const work = mkdtempSync(join(tmpdir(), 'plumbline-ct-'));
const tableFile = join(work, 'hu-density.csv');
writeFileSync(tableFile, '# test data\nhu,rho\n-1000,0\n0,1\n1000,1.5\n3000,2.5\n');
const table = (() => {
  const t = loadDensityTable(tableFile);
  if (!t.ok) throw new Error('table');
  return t.value;
})();
const opts = { bodyThresholdHu: -500, density: table.density };

/** 64³ voxels of 4 mm centred on the origin: faces at multiples of 4 mm, so ±100 mm lies on a boundary. */
function phantom(_name: string, hu: (x: number, y: number, z: number) => number): CtVolume {
  return sampledVolume({ columns: 64, rows: 64, slices: 64, spacingMm: [4, 4, 4], originMm: [-126, -126, -126], hu });
}
const inBox = (x: number, y: number, z: number) => Math.abs(x) < 100 && Math.abs(y) < 100 && Math.abs(z) < 100;
const water = phantom('water', (x, y, z) => (inBox(x, y, z) ? 0 : -1000));
const lung = phantom('lung', (x, y, z) => (!inBox(x, y, z) ? -1000 : y > -40 && y < 0 ? -750 : 0));
const bone = phantom('bone', (x, y, z) => (!inBox(x, y, z) ? -1000 : y > 20 && y < 40 ? 1000 : 0));
/** A water cylinder of radius 100 mm along z: on the axes its surface lies on voxel faces, elsewhere it is a staircase. */
const cylinder = phantom('cylinder', (x, y, z) => (x * x + y * y < 100 * 100 && Math.abs(z) < 100 ? 0 : -1000));

const cp = anglesControlPoint;
const depth = (v: CtVolume, pos: PatientPosition, c: ControlPoint, point: Vec3) => {
  const f = beamFrame(c, pos, 1000)!;
  const r = ctDepth(v, f.sourcePatientMm, point, opts);
  if (!r.ok) throw new Error(r.refusal.reason);
  return r.value;
};

describe('the ray tracer', () => {
  it('the pieces of a ray through the volume add up to its length inside, each in the voxel it crosses', () => {
    let sum = 0;
    traceRay(water, [-300, 1, 2], [300, 1, 2], (voxel, _start, length) => {
      sum += length;
      expect(voxel).toBeGreaterThanOrEqual(0);
    });
    expect(sum).toBeCloseTo(256, 9); // 64 voxels of 4 mm
    let diagonal = 0;
    traceRay(water, [-128, -128, -128], [128, 128, 128], (_v, _s, l) => {
      diagonal += l;
    });
    expect(diagonal).toBeCloseTo(256 * Math.sqrt(3), 9);
  });
});

describe('depths through the water box (faces at ±100 mm)', () => {
  it('HFS gantry 0, point 50 mm posterior: SSD 900, depth 150 mm, radiological 150 mm', () => {
    const d = depth(water, 'HFS', cp(0), [0, 50, 0]);
    expect(d.ssdMm).toBeCloseTo(900, 1);
    expect(d.geometricDepthMm).toBeCloseTo(150, 1);
    expect(d.radiologicalDepthMm).toBeCloseTo(150, 1);
  });
  it("HFS gantry 90 (source at the patient's left), point 30 mm to the right: SSD 900, depth 130 mm", () => {
    const d = depth(water, 'HFS', cp(90, 30), [-30, 0, 0]);
    expect([d.ssdMm, d.geometricDepthMm]).toEqual([expect.closeTo(900, 1), expect.closeTo(130, 1)]);
  });
  it('FFS gantry 90 (the source at the right), point 30 mm to the left: depth 130 mm', () => {
    expect(depth(water, 'FFS', cp(90), [30, 0, 0]).geometricDepthMm).toBeCloseTo(130, 1);
  });
  it('HFS gantry 90, couch 90 (the source inferior), point 20 mm superior: SSD 900, depth 120 mm', () => {
    const d = depth(water, 'HFS', cp(90, 0, 90), [0, 0, 20]);
    expect([d.ssdMm, d.geometricDepthMm]).toEqual([expect.closeTo(900, 1), expect.closeTo(120, 1)]);
  });
  it('HFP gantry 0 (the source posterior), point 40 mm anterior: depth 140 mm', () => {
    expect(depth(water, 'HFP', cp(0), [0, -40, 0]).geometricDepthMm).toBeCloseTo(140, 1);
  });
  it('an off-axis point, HFS gantry 0, (30, 20, 0): the slant path to the surface y = −100', () => {
    // Source (0, −1000, 0); the ray meets y = −100 at 900/1020 of its length (hand calculation).
    const total = Math.hypot(30, 1020);
    const d = depth(water, 'HFS', cp(0), [30, 20, 0]);
    expect(d.ssdMm).toBeCloseTo((total * 900) / 1020, 1);
    expect(d.geometricDepthMm).toBeCloseTo((total * 120) / 1020, 1);
  });
  it('the SSD along the central axis matches a plan written for the phantom (isocenter 100 mm deep: SSD 900 mm)', () => {
    const f = beamFrame(cp(0), 'HFS', 1000)!;
    expect(ctSsdAlongAxisMm(water, f.sourcePatientMm, f.directionPatient, 2000, -500)).toBeCloseTo(900, 1);
  });
});

describe('heterogeneous phantoms', () => {
  it('a lung slab (ρ 0.25) from y = −40 to 0: radiological depth 60 + 40·0.25 + 50 = 120 mm, interface 50 mm upstream', () => {
    const d = depth(lung, 'HFS', cp(0), [0, 50, 0]);
    expect(d.geometricDepthMm).toBeCloseTo(150, 1);
    expect(d.radiologicalDepthMm).toBeCloseTo(120, 1);
    expect(d.nearestInterfaceMm).toBeCloseTo(50, 1);
    expect(d.densityRange).toEqual([0.25, 1]);
  });
  it('a bone slab (ρ 1.5) from y = 20 to 40: radiological depth 120 + 20·1.5 + 10 = 160 mm', () => {
    expect(depth(bone, 'HFS', cp(0), [0, 50, 0]).radiologicalDepthMm).toBeCloseTo(160, 1);
  });
  it('lists the media met with the distance from each upper face to the point: water 150, lung 90, water 50 mm', () => {
    const d = depth(lung, 'HFS', cp(0), [0, 50, 0]);
    expect(d.layers.map((l) => [Number(l.distanceToPointMm.toFixed(1)), l.density])).toEqual([
      [150, 1],
      [90, 0.25],
      [50, 1],
    ]);
  });
  it('Batho: the generalized product gives the two-layer form TPR(5)^(1−ρ2) / TPR(9)^(1−ρ2) below the lung slab, and 1 in water', async () => {
    // The two-layer form (point in water below a slab of density ρ2): Khan, from memory; variables read in a secondary source.
    const { bathoCorrection, tprAt } = await import('../../src/physics/index.js');
    const { machine, beam, DEMO_MANIFEST } = await import('../helpers/machines.js');
    const b6 = beam(machine(DEMO_MANIFEST), '6X');
    const d = depth(lung, 'HFS', cp(0), [0, 50, 0]);
    const layers = d.layers.map((l) => ({ distanceToPointCm: l.distanceToPointMm / 10, density: l.density }));
    const expected = (tprAt(b6, 5, 10, []) / tprAt(b6, 9, 10, [])) ** 0.75;
    expect(bathoCorrection(b6, layers, 10).value).toBeCloseTo(expected, 9);
    const w = depth(water, 'HFS', cp(0), [0, 50, 0]);
    expect(
      bathoCorrection(
        b6,
        w.layers.map((l) => ({ distanceToPointCm: l.distanceToPointMm / 10, density: l.density })),
        10,
      ).value,
    ).toBe(1);
  });
  it('refuses HU outside the density table rather than extrapolating', () => {
    const narrow = join(work, 'narrow.csv');
    writeFileSync(narrow, 'hu,rho\n-1000,0\n500,1.3\n');
    const t = loadDensityTable(narrow);
    if (!t.ok) throw new Error('table');
    const f = beamFrame(cp(0), 'HFS', 1000)!;
    const r = ctDepth(bone, f.sourcePatientMm, [0, 50, 0], { bodyThresholdHu: -500, density: t.value.density });
    expect(!r.ok && r.refusal).toEqual({ reason: 'hu-outside-table', hu: 1000 });
  });
});

const noisyWater = phantom('noisy-water', (x, y, z) => (inBox(x, y, z) ? ctNoiseHu(x, y, z) : -1000));

describe('layers are media, not voxels', () => {
  it('CT noise of ±15 HU in water is one layer (its mean density within 0.01 of 1), not a layer per voxel', () => {
    for (const gantry of [0, 30, 60, 90, 135, 200]) {
      const d = depth(noisyWater, 'HFS', cp(gantry), [0, 0, 0]);
      expect(d.layers).toHaveLength(1);
      expect(Math.abs(d.layers[0]!.density - 1)).toBeLessThan(0.01);
    }
  });
  it('a point 0.2 mm past the end of the lung slab makes no sliver of water: the point is in the lung layer, none nearer than 0.5 mm', () => {
    const d = depth(lung, 'HFS', cp(0), [0, 0.2, 0]);
    expect(d.layers.map((l) => Number(l.distanceToPointMm.toFixed(1)))).toEqual([100.2, 40.2]);
    expect(d.layers[1]!.density).toBeCloseTo((40 * 0.25 + 0.2 * 1) / 40.2, 9);
  });
});

describe("a body the CT's field of view cuts", () => {
  // Water across the whole width of the CT (x from −128 to 128 mm) between y = ±100.
  const truncated = phantom('truncated', (_x, y, z) => (Math.abs(y) < 100 && Math.abs(z) < 100 ? 0 : -1000));
  it('from the side, where the body leaves the CT: refused, the surface is unknown', () => {
    const f = beamFrame(cp(90), 'HFS', 1000)!;
    const r = ctDepth(truncated, f.sourcePatientMm, [0, 0, 0], opts);
    expect(!r.ok && r.refusal.reason).toBe('field-of-view-cuts-body');
    expect(ctSsdAlongAxisMm(truncated, f.sourcePatientMm, f.directionPatient, 2000, -500)).toBeUndefined();
  });
  it('a point beyond the end of the CT is refused: the ray would leave the densities behind', () => {
    // Water between y = ±100 along the whole CT; the CT ends at z = 128 mm, the point lies at z = 140 mm:
    // the ray from the source enters the water at z = 126 mm and leaves the CT at 128.
    const long = phantom('long', (_x, y) => (Math.abs(y) < 100 ? 0 : -1000));
    const f = beamFrame(cp(0), 'HFS', 1000)!;
    const r = ctDepth(long, f.sourcePatientMm, [0, 0, 140], opts);
    expect(!r.ok && r.refusal.reason).toBe('point-outside-ct');
  });
  it('from the front, where the body lies in the CT: SSD 900 mm', () => {
    expect(depth(truncated, 'HFS', cp(0), [0, 0, 0]).ssdMm).toBeCloseTo(900, 6);
  });
});

describe('a water cylinder (radius 100 mm)', () => {
  it('gantry 0, 90, 180 and 270 to its centre: depth 100 mm within 0.1 mm (the surface on voxel faces)', () => {
    for (const g of [0, 90, 180, 270]) expect(depth(cylinder, 'HFS', cp(g), [0, 0, 0]).geometricDepthMm).toBeCloseTo(100, 1);
  });
  // The surface is a 4 mm staircase there; drawn as an EXTERNAL contour it is exact (below).
  it('oblique gantry angles, body by the HU threshold: depth 100 mm within half a voxel diagonal', () => {
    for (const g of [30, 45, 135, 300])
      expect(Math.abs(depth(cylinder, 'HFS', cp(g), [0, 0, 0]).geometricDepthMm - 100)).toBeLessThan(2 * Math.SQRT2);
  });
  it("an off-centre point 50 mm left (x = +50) from gantry 90 (entering from the patient's left): depth 50 mm", () => {
    expect(depth(cylinder, 'HFS', cp(90), [50, 0, 0]).geometricDepthMm).toBeCloseTo(50, 1);
  });
});

describe('the body from an EXTERNAL contour', () => {
  /** An EXTERNAL structure (one contour per slice centre from z = −98 to 98) as the model holds it, and its surface. */
  async function external(name: string, volume: CtVolume, outline: (z: number) => (readonly [number, number, number])[]) {
    const contours = Array.from({ length: 50 }, (_, k) => -98 + 4 * k).map((z) => ({ geometricType: 'CLOSED_PLANAR', pointsMm: outline(z) }));
    return bodySurface(volume, { number: 1, name, type: 'EXTERNAL', contours });
  }
  const withBody = (v: CtVolume, body: Awaited<ReturnType<typeof external>>, c: ControlPoint, point: Vec3) => {
    const f = beamFrame(c, 'HFS', 1000)!;
    const r = ctDepth(v, f.sourcePatientMm, point, { ...opts, body });
    if (!r.ok) throw new Error(r.refusal.reason);
    return r.value;
  };

  it('overrides the HU threshold: a body drawn 20 mm inside the anterior face gives SSD 920 mm', async () => {
    const body = await external('box-body', water, (z) => [
      [-100, -80, z],
      [100, -80, z],
      [100, 100, z],
      [-100, 100, z],
    ]);
    const d = withBody(water, body, cp(0), [0, 50, 0]);
    expect(d.ssdMm).toBeCloseTo(920, 6);
    expect(d.geometricDepthMm).toBeCloseTo(130, 6);
    // The densities count from the drawn surface on: 130 mm of water.
    expect(d.radiologicalDepthMm).toBeCloseTo(130, 6);
    const f = beamFrame(cp(0), 'HFS', 1000)!;
    expect(ctSsdAlongAxisMm(water, f.sourcePatientMm, f.directionPatient, 2000, -500, body)).toBeCloseTo(920, 6);
  });

  // The cylinder of radius 100 mm drawn as a 720-gon: its sides lie within 100·(1 − cos 0.25°) = 0.001 mm of the circle.
  const circle = (z: number) =>
    Array.from({ length: 720 }, (_, i) => [100 * Math.cos((i * Math.PI) / 360), 100 * Math.sin((i * Math.PI) / 360), z] as const);

  it('a water cylinder drawn by its contour: depth 100 mm to its centre within 0.1 mm from every gantry angle, the voxels notwithstanding', async () => {
    const body = await external('cylinder-body', cylinder, circle);
    for (const g of [0, 30, 45, 90, 135, 200, 300, 337.5]) {
      const d = withBody(cylinder, body, cp(g), [0, 0, 0]);
      expect(Math.abs(d.ssdMm - 900), `gantry ${g}`).toBeLessThan(0.1);
      expect(Math.abs(d.geometricDepthMm - 100), `gantry ${g}`).toBeLessThan(0.1);
      // The voxels the surface cuts are air or water by their centres (4 mm voxels): the water path is within a voxel diagonal.
      expect(Math.abs(d.radiologicalDepthMm - 100), `gantry ${g}`).toBeLessThan(4 * Math.SQRT2);
    }
  });

  it('a cylinder seen with the couch turned: a point 50 mm off its axis, and rays that cross the slices', async () => {
    const body = await external('cylinder-body-2', cylinder, circle);
    // Gantry 90 (source at the patient's left, +x), point at x = −50: depth = the chord from x = 100 to −50... along the beam.
    expect(withBody(cylinder, body, cp(90), [-50, 0, 0]).geometricDepthMm).toBeCloseTo(150, 1);
    // Gantry 90 with the couch at 30° and 330°: the beam turns in the horizontal plane (x–z for HFS) and meets the
    // cylinder's side at x = 100, a path of 100 / cos 30° = 115.47 mm to the centre (entering at |z| = 57.7 mm).
    for (const couch of [30, 330]) {
      const d = withBody(cylinder, body, cp(90, 0, couch), [0, 0, 0]);
      expect(Math.abs(d.geometricDepthMm - 100 / Math.cos(Math.PI / 6)), `couch ${couch}`).toBeLessThan(0.1);
      expect(Math.abs(Math.abs(d.entryPatientMm[2]) - 100 * Math.tan(Math.PI / 6)), `couch ${couch}`).toBeLessThan(0.1);
    }
    // Couch 90, gantry 90: the beam runs along the cylinder's axis and enters through its end, z = ±100.
    const end = withBody(cylinder, body, cp(90, 0, 90), [0, 0, 0]);
    expect(end.geometricDepthMm).toBeCloseTo(100, 6);
  });

  it('a body drawn beyond the CT along the ray is refused: there are no densities there', async () => {
    // The CT spans y from −128 to 128 mm; this body starts at y = −140.
    const body = await external('wide-body', water, (z) => [
      [-100, -140, z],
      [100, -140, z],
      [100, 100, z],
      [-100, 100, z],
    ]);
    const f = beamFrame(cp(0), 'HFS', 1000)!;
    const r = ctDepth(water, f.sourcePatientMm, [0, 50, 0], { ...opts, body });
    expect(!r.ok && r.refusal.reason).toBe('external-outside-ct');
    expect(!r.ok && r.refusal.reason === 'external-outside-ct' && r.refusal.gapMm).toBeCloseTo(12, 1);
  });

  it('a point outside the drawn body is refused, naming why', async () => {
    const body = await external('box-body-2', water, (z) => [
      [-100, -80, z],
      [100, -80, z],
      [100, 100, z],
      [-100, 100, z],
    ]);
    const f = beamFrame(cp(0), 'HFS', 1000)!;
    const r = ctDepth(water, f.sourcePatientMm, [0, -90, 0], { ...opts, body });
    expect(!r.ok && r.refusal.reason).toBe('misses-external');
  });
});
