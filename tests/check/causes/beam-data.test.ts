import { describe, expect, it } from 'vitest';
import { photonDataOf, tableEdgeCause, zeroFieldCause } from '../../../src/check/causes/beam-data.js';
import type { CheckedBeam } from '../../../src/model/index.js';
import { DEMO_MANIFEST, machine } from '../../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);

describe('the beam data behind a result', () => {
  it('finds the photon beam named in the result, and none for electrons or another machine', () => {
    const named = (machineBeam: string, radiationType = 'PHOTON') => ({ radiationType, calculation: { machineBeam } }) as unknown as CheckedBeam;
    expect(photonDataOf(named(`${demo.name} 6X`), demo)?.id).toBe('6X');
    expect(photonDataOf(named(`OTHER 6X`), demo)).toBeUndefined();
    expect(photonDataOf(named(`${demo.name} 6X`, 'ELECTRON'), demo)).toBeUndefined();
  });
  it("names a lookup clamped at a table's edge, the first and how many, without a share", () => {
    const clamps = [
      { table: 'TMR', axis: 'depth', requested: 38, used: 35, unit: 'cm' },
      { table: 'Sc', axis: 'side', requested: 1.5, used: 2, unit: 'cm' },
    ];
    const c = tableEdgeCause({ calculation: { clamps } } as unknown as CheckedBeam)!;
    expect(c).toMatchObject({ code: 'table-edge', estimated: false, contributionPercent: 0 });
    expect(c.evidence).toMatchObject({ table: 'TMR', requested: 38, used: 35, clamps: 2 });
    expect(tableEdgeCause({ calculation: { clamps: [] } } as unknown as CheckedBeam)).toBeUndefined();
  });
});

describe('the zero-field extrapolation', () => {
  const demo6x = demo.beams.find((x) => x.id === '6X')!;
  const smallest = demo6x.tpr!.columns!.values[0]!;
  const result = (irradiatedSquareCm: number, covered: number, clarkson = true) =>
    ({
      calculation: {
        irradiatedSquareCm,
        factors: clarkson ? [{ key: 'SpTPR', value: 1, args: [] }] : [],
        modulated: { pointCoveredMuPercent: covered, clarksonMuPercent: clarkson ? 100 : 0 },
      },
    }) as unknown as CheckedBeam;
  it('is named for a Clarkson sum over a field smaller than the smallest measured, or a point under the leaves', () => {
    expect(zeroFieldCause(result(smallest / 2, 0), demo6x)).toMatchObject({ code: 'zero-field', estimated: false });
    expect(zeroFieldCause(result(10, 30), demo6x)?.evidence).toMatchObject({ smallestFieldCm: smallest, coveredMuPercent: 30 });
  });
  it('is not named for a field within the tables and open, or without a Clarkson sum', () => {
    expect(zeroFieldCause(result(10, 0), demo6x)).toBeUndefined();
    expect(zeroFieldCause(result(smallest / 2, 30, false), demo6x)).toBeUndefined();
  });
});
