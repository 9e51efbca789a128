/**
 * The chosen heterogeneity correction of a traced point, on a beam built from numbers
 * (TPR = e^(−μ(d − 1.5)), field independent): the TPR ratio gives e^(−μ(d_eff − d)); Batho's
 * two-layer form for water below one slab of density ρ2, CF = TMR(d3)^(1 − ρ2) / TMR(d2)^(1 − ρ2)
 * with d3, d2 the distances from the slab's upper and lower faces to the point (Batho's power law
 * as its definitions were read; equation from memory), gives e^(−μ(1 − ρ2)(d3 − d2)).
 */
import { describe, expect, it } from 'vitest';
import { bathoNotes, heterogeneityCorrection, interfaceWithinBuildUpMm } from '../../src/check/heterogeneity-correction.js';
import type { CtDepth } from '../../src/geometry/index.js';
import { photonBeam } from '../helpers/model-beam.js';

const muPerCm = 0.05;
const beam = photonBeam({ tpr: (d) => Math.exp(-muPerCm * (d - 1.5)) });
/** A point 100 mm deep in water, below a lung slab (ρ 0.25) from 30 to 70 mm deep: layers from the surface (depths at the table's nodes). */
const traced = (pointDensity = 1) =>
  ({
    geometricDepthMm: 100,
    radiologicalDepthMm: 70,
    layers: [
      { distanceToPointMm: 100, density: 1 },
      { distanceToPointMm: 70, density: 0.25 },
      { distanceToPointMm: 30, density: pointDensity },
    ],
  }) as unknown as CtDepth;

describe('heterogeneityCorrection', () => {
  it('TPR ratio: e^(−μ(7 − 10)) for 10 cm geometric, 7 cm radiological', () => {
    expect(heterogeneityCorrection('tpr-ratio', beam, traced(), 10).value).toBeCloseTo(Math.exp(muPerCm * 3), 10);
  });
  it("Batho: the slab's faces 7 and 3 cm from the point, ρ2 = 0.25: (TMR(7)/TMR(3))^(ρ2 − 1) = e^(0.15)", () => {
    const expected = (Math.exp(-muPerCm * (7 - 1.5)) / Math.exp(-muPerCm * (3 - 1.5))) ** (0.25 - 1);
    expect(heterogeneityCorrection('batho', beam, traced(), 10).value).toBeCloseTo(expected, 10);
    expect(expected).toBeCloseTo(Math.exp(0.15), 10);
  });
  it('for a single slab the two methods agree when the TPR is exponential (both reduce to e^(μ(1 − ρ)t))', () => {
    const ratio = heterogeneityCorrection('tpr-ratio', beam, traced(), 10).value;
    expect(heterogeneityCorrection('batho', beam, traced(), 10).value).toBeCloseTo(ratio, 10);
  });
});

describe("Batho's limits", () => {
  it('an interface within the build-up distance (dmax 1.5 cm) of the point is named with its distance', () => {
    const near = { ...traced(), layers: [...traced().layers.slice(0, 2), { distanceToPointMm: 12, density: 1 }] } as unknown as CtDepth;
    expect(interfaceWithinBuildUpMm(near, 1.5)).toBe(12);
    expect(bathoNotes(near, 1.5, 0.1)).toEqual([{ code: 'batho-interface-in-build-up', values: { distanceCm: 1.2 } }]);
    expect(interfaceWithinBuildUpMm(traced(), 1.5)).toBeUndefined();
  });
  it('a point not in a water-like medium is named with its density', () => {
    expect(bathoNotes(traced(0.3), 1.5, 0.1)).toEqual([{ code: 'batho-point-medium', values: { density: 0.3 } }]);
    expect(bathoNotes(traced(1.05), 1.5, 0.1)).toEqual([]);
  });
});
