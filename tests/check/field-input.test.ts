/**
 * What the physics is given for one aperture seen from one point: the collimator field, the
 * irradiated field's equivalent square (4A/P, BJR Supplement 25 formula), the primary fluence there,
 * and Clarkson sectors whenever the field is not a plain open rectangle around the point.
 */
import { describe, expect, it } from 'vitest';
import { CLARKSON_SECTORS, fieldInput } from '../../src/check/field-input.js';
import { apertureAt, type BlockOutline } from '../../src/geometry/index.js';
import { modelBeam, modelControlPoint } from '../helpers/model-beam.js';

const jaws = apertureAt(modelBeam(), modelControlPoint([-50, 50], [-40, 80]))!;
/** Ten 10 mm leaf pairs over y −50…50: every pair open −50…50 except the top two, closed at 0. */
const leaves = [...Array.from({ length: 10 }, (_, i) => (i >= 8 ? 0 : -50)), ...Array.from({ length: 10 }, (_, i) => (i >= 8 ? 0 : 50))];
const shaped = apertureAt(modelBeam({ pairs: 10, widthMm: 10 }), modelControlPoint([-50, 50], [-50, 50], leaves))!;

describe('fieldInput', () => {
  it('a plain rectangle with the point open: the equivalent square of 10 × 12 cm (2XY/(X + Y) = 10.91 cm), no sectors, full fluence', () => {
    const f = fieldInput(jaws, [], 0, 0, 1, 0.015);
    expect(f.collimatorFieldCm).toEqual({ x: 10, y: 12 });
    expect(f.irradiatedSquareCm).toBeCloseTo((2 * 10 * 12) / 22, 12);
    expect(f.clarksonSectors).toBeUndefined();
    expect(f).toMatchObject({ primaryWeight: 1, jawAreaMm2: 12000, openAreaMm2: 12000 });
  });
  it('leaves shaping the field inside the jaws: Clarkson sectors, radii carried to the depth by the depth scale', () => {
    const f = fieldInput(shaped, [], 0, 0, 1.1, 0.015);
    expect(f.clarksonSectors!.start).toHaveLength(CLARKSON_SECTORS + 1);
    const atIso = fieldInput(shaped, [], 0, 0, 1, 0.015).clarksonSectors!;
    expect(f.clarksonSectors!.outerCm[0]! / atIso.outerCm[0]!).toBeCloseTo(1.1, 12);
    expect(f.irradiatedSquareCm).toBeCloseTo((4 * 8000) / 360 / 10, 9); // 10 × 8 cm open: 4A/P
  });
  it('under a closed leaf pair inside the jaws the fluence is the leaf transmission; beyond the jaws it is 0', () => {
    expect(fieldInput(shaped, [], 0, 45, 1, 0.015).primaryWeight).toBe(0.015);
    expect(fieldInput(shaped, [], 60, 0, 1, 0.015).primaryWeight).toBe(0);
  });
  it('a shielding block over a 3 cm strip: sectors, and the open area about 10 × 7 cm (72 sectors approximate the outline)', () => {
    const block: BlockOutline = {
      kind: 'SHIELDING',
      transmission: 0,
      outlineMm: [
        [20, -50],
        [60, -50],
        [60, 50],
        [20, 50],
      ],
    };
    const open = apertureAt(modelBeam(), modelControlPoint([-50, 50], [-50, 50]))!;
    const f = fieldInput(open, [block], 0, 0, 1, 0);
    expect(f.clarksonSectors).toBeDefined();
    expect(f.openAreaMm2 / 7000).toBeCloseTo(1, 1);
  });
});
