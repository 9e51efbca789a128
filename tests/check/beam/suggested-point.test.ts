/**
 * A better point for a beam whose point is unfit for a point check (near a field edge): the open
 * field's centroid at the same depth, or, when that is blocked or itself near an edge, the open point
 * farthest from every edge; with --suggest-point the independent dose there. Positions by hand from
 * the jaws (geometry, common practice, no source); doses compared with a check made at that point.
 */
import { describe, expect, it } from 'vitest';
import { staticBeam } from '../../../scripts/fixtures/plan-parts.js';
import { beams, check, oneBeamPlan, type TestBeam, w30Beam } from '../../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const w30 = w30Beam;
const checked = (b: TestBeam) => {
  if (b.status !== 'checked') throw new Error('not checked');
  return b;
};
/** An AP field 10 × 10 cm with its X jaws at −2 and +8 cm (isocenter plane), isocenter 10 cm deep. */
const asymmetric = staticBeam(1, 'AP ASYM', 6, 0, 900, [0, 0, 0], { first: { jawsXMm: [-20, 80], jawsYMm: [-50, 50] } });

describe('the suggested point', () => {
  it('a point 1 cm inside an edge is unfit; the suggestion is the field centre, 3 cm off axis and 5 cm from every edge', () => {
    const b = checked(beams(check(oneBeamPlan('asym-edge', asymmetric, [70, 0, 0]), demo, { suggest: true }))[0]!);
    const s = b.fitness.suggestion!;
    expect(s.patientMm).toEqual([30, 0, 0]);
    expect(s.offAxisCm).toBeCloseTo(3, 9);
    expect(s.edgeDistanceCm).toBeCloseTo(5, 9);
    expect(s.depthCm).toBeCloseTo(10, 9);
    const there = checked(beams(check(oneBeamPlan('asym-centre', asymmetric, [30, 0, 0]), demo))[0]!);
    expect(b.suggestedPoint!.independentDoseCGy / there.calculation.independentDoseCGy - 1).toBeCloseTo(0, 9);
  });
  it('the centre under a block: the open point farthest from every edge, in a corner (12√2 mm on the 2 mm search grid, by hand)', () => {
    // A 10 × 10 field with a 4 × 4 cm shielding block in its centre. Along the diagonal, a point t mm out is
    // 50 − t from the jaws and √2·(t − 20) from the block's corner: the two equal at t ≈ 32.4 (17.6 mm);
    // the search grid's nearest, (32, 32), is 18 mm from the jaws and 12√2 = 16.97 mm from the corner.
    const ring = staticBeam(1, 'AP RING', 6, 0, 900, [0, 0, 0], {
      first: { jawsXMm: [-50, 50], jawsYMm: [-50, 50] },
      block: {
        type: 'SHIELDING',
        trayId: 'BLOCK_TRAY',
        transmission: 0,
        outline: [
          [-20, -20],
          [20, -20],
          [20, 20],
          [-20, 20],
        ],
      },
    });
    const s = checked(beams(check(oneBeamPlan('ring-edge', ring, [45, 0, 0]), demo))[0]!).fitness.suggestion!;
    expect(s.edgeDistanceCm).toBeCloseTo((12 * Math.SQRT2) / 10, 9);
    expect(s.patientMm.map(Math.abs)).toEqual([32, 0, 32]);
  });
  it('without --suggest-point the place is given but no dose', () => {
    const b = checked(beams(check(oneBeamPlan('asym-edge-nodose', asymmetric, [70, 0, 0]), demo))[0]!);
    expect(b.fitness.suggestion).toBeDefined();
    expect(b.suggestedPoint).toBeUndefined();
  });
  it('a point well inside the field gets no suggestion', () => {
    expect(checked(beams(check(oneBeamPlan('asym-fit', asymmetric, [30, 0, 0]), demo, { suggest: true }))[0]!).fitness.suggestion).toBeUndefined();
  });
});

describe('the suggested point of a wedged beam', () => {
  it('takes the wedge profile at its own place: its dose equals a check made at that point (the same calculation, by definition)', () => {
    // Point 1 cm inside the +Y edge of a 15 × 15 W30 field: near the edge, so a better point is suggested elsewhere along Y.
    const edge: [number, number, number] = [0, 0, 65];
    const b = beams(check(oneBeamPlan('w-suggest', w30(0), edge), demo, { suggest: true }))[0]!;
    if (b.status !== 'checked') throw new Error('not checked');
    const s = b.suggestedPoint!;
    expect(Math.abs(s.patientMm[2] - edge[2])).toBeGreaterThan(5); // moved along the wedge's gradient
    const there = beams(check(oneBeamPlan('w-suggest-there', w30(0), s.patientMm), demo))[0]!;
    if (there.status !== 'checked') throw new Error('not checked');
    expect(s.independentDoseCGy / there.calculation.independentDoseCGy - 1).toBeCloseTo(0, 9);
  });
});
