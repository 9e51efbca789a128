/** Photon blocks through Clarkson rings: identities and sanity of the blocked-field dose. */
import { describe, expect, it } from 'vitest';
import { coordinatesDoseReference, staticBeam } from '../../scripts/fixtures/plan-parts.js';
import type { Plan } from '../../src/model/index.js';
import { beams, check, planFromSpec } from '../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const iso: [number, number, number] = [0, 0, 0];
type BlockSpec = { type: 'APERTURE' | 'SHIELDING'; outline: readonly (readonly [number, number])[]; trayId: string; transmission: number };
/** One AP beam, HFS; at SSD 90 cm the point is the isocenter, at SSD 100 cm it is 10 cm below the surface. */
const plan = (name: string, block?: BlockSpec, ssd = 900): Plan => {
  const point: [number, number, number] = ssd === 1000 ? [0, 100, 0] : iso;
  return planFromSpec({
    file: `${name}.dcm`,
    patientId: 'BLK-1',
    patientName: 'Block^Test',
    label: name,
    name,
    description: 'test',
    doseReferences: [coordinatesDoseReference(1, 'point', point, 2)],
    fractionGroups: [{ number: 1, fractions: 1, prescriptionGy: 2, beams: [{ number: 1, mu: 200, doseGy: 2, specPoint: point }] }],
    beams: [staticBeam(1, 'AP', 6, 0, ssd, iso, { ...(block ? { block } : {}), first: { jawsXMm: [-100, 100], jawsYMm: [-100, 100] } })],
  }).plan;
};
const dose = (p: Plan) => beams(check(p, demo))[0]!;
const square = (lo: number, hi: number) =>
  [
    [lo, lo],
    [hi, lo],
    [hi, hi],
    [lo, hi],
  ] as const;

describe('blocked photon fields', () => {
  const open = dose(plan('open'));
  it('an aperture block the size of the jaws gives the open field, with the tray factor (within the 0.5 % Clarkson vs equivalent-square agreement, BJR 52:398)', () => {
    const same = dose(plan('aperture-as-jaws', { type: 'APERTURE', outline: square(-100, 100), trayId: 'BLOCK_TRAY', transmission: 0.03 }));
    const tf = same.calculation!.factors.find((f) => f.key === 'TF')!.value;
    expect(tf).toBe(0.97);
    // Nothing is blocked, so its open area (from the rings around the point) is the jaws': not an irregular case.
    expect(same.category).toBe('on-axis-open');
    expect(Math.abs(same.calculation!.independentDoseCGy / tf / open.calculation!.independentDoseCGy - 1)).toBeLessThan(0.005);
  });
  it('a shielding block over a corner lowers the scatter: less dose than open, more than a jaw field of the open part', () => {
    const blocked = dose(plan('corner', { type: 'SHIELDING', outline: square(40, 100), trayId: 'BLOCK_TRAY', transmission: 0 }));
    const d = blocked.calculation!.independentDoseCGy / 0.97;
    expect(d).toBeLessThan(open.calculation!.independentDoseCGy);
    expect(d).toBeGreaterThan(0.97 * open.calculation!.independentDoseCGy);
    expect(blocked.calculation!.approximations).toContainEqual(
      expect.objectContaining({ code: 'clarkson-irregular', values: expect.objectContaining({ blocks: 1, sectors: 72 }) }),
    );
  });
  it('a blocked field at SSD 100 is calculated in the TPR form at the point, and says so', () => {
    const b = dose(plan('ssd', { type: 'SHIELDING', outline: square(40, 100), trayId: 'BLOCK_TRAY', transmission: 0 }, 1000));
    expect(b.calculation!.setup).toBe('SSD');
    expect(b.calculation!.factors.map((f) => f.key)).toContain('SpTPR');
    expect(b.calculation!.approximations.map((a) => a.code)).toContain('ssd-irregular-tpr-form');
  });
  it('a point 1 cm from a block edge is flagged, though far from the jaws, and a blocked field is irregular', () => {
    // Shielding block from x = 10 mm outwards, the point (the isocenter) 10 mm from its edge, 90 mm from the jaws.
    const b = dose(
      plan('near-block', {
        type: 'SHIELDING',
        outline: [
          [10, -100],
          [100, -100],
          [100, 100],
          [10, 100],
        ],
        trayId: 'BLOCK_TRAY',
        transmission: 0,
      }),
    );
    expect(b.fitness!.edgeDistanceCm).toBeCloseTo(1, 1);
    expect(b.fitness!.flags.map((f) => f.code)).toContain('near-field-edge');
    expect(b.category).toBe('irregular-or-small');
  });
  it('refuses a point under the block and a tray the beam data do not know', () => {
    expect(dose(plan('under', { type: 'SHIELDING', outline: square(-20, 20), trayId: 'BLOCK_TRAY', transmission: 0 })).reason).toEqual({
      code: 'point-blocked',
      values: {},
    });
    const r = check(plan('tray', { type: 'SHIELDING', outline: square(40, 100), trayId: 'TRAY-9', transmission: 0 }), demo);
    expect(r.issues[0]!.message).toMatch(/no tray "TRAY-9"/);
  });
});
