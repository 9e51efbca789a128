import type { ElectronBeamModel } from '../model/index.js';
import { electronIsodoseDepthCm, electronPddPercent } from '../physics/index.js';

/**
 * The electron beam's energy as its depth dose tells it: the mean energy at the surface
 * E0 ≈ 2.33 MeV/cm × R50 (the usual broad-beam relation, from memory; for fields of 10 × 10 cm and
 * more at SSD 100) beside the nominal energy. A PDD table typed from another energy, or with a
 * depth column in the wrong unit, stands far off.
 */
export const E0_PER_R50_MEV_PER_CM = 2.33;
/** Nominal and mean surface energies differ by some percent on real machines: beyond this, a look (common practice, no source). */
export const ELECTRON_ENERGY_TOLERANCE_PERCENT = 15;

/** The practical range in cm is about half the energy in MeV (the usual rule of thumb, from memory): beyond this, a look. */
export const RP_PER_MEV_CM = 0.5;
export const PRACTICAL_RANGE_TOLERANCE_PERCENT = 20;

export interface ElectronEnergyComparison {
  readonly beamId: string;
  readonly notCompared?: string;
  readonly r50Cm?: number;
  readonly e0MeV?: number;
  readonly differencePercent?: number;
  /** The practical range: where the tangent through R50 (slope from R80 to R20) meets the PDD's tail. */
  readonly rpCm?: number;
  /** 100 · (Rp − E/2)/(E/2), E the nominal energy. */
  readonly rpDifferencePercent?: number;
}

export function compareElectronEnergy(beam: ElectronBeamModel): ElectronEnergyComparison {
  const side = Math.max(...beam.pdd.columns!.values);
  if (side < 10) return { beamId: beam.id, notCompared: `its PDD table has no field of 10 cm or more (the relation holds for broad beams)` };
  const r50Cm = electronIsodoseDepthCm(beam, { kind: 'equivalent-square', sideCm: 10, method: 'a 10 cm square' }, 50);
  if (r50Cm === undefined) return { beamId: beam.id, notCompared: 'its PDD table does not fall to 50 % for a 10 cm field' };
  const e0MeV = E0_PER_R50_MEV_PER_CM * r50Cm;
  const rpCm = practicalRangeCm(beam, r50Cm);
  const expectedRp = RP_PER_MEV_CM * beam.nominalEnergyMeV;
  return {
    beamId: beam.id,
    r50Cm,
    e0MeV,
    differencePercent: (100 * (e0MeV - beam.nominalEnergyMeV)) / beam.nominalEnergyMeV,
    ...(rpCm !== undefined ? { rpCm, rpDifferencePercent: (100 * (rpCm - expectedRp)) / expectedRp } : {}),
  };
}

/**
 * The practical range of the 10 cm field: the tangent to the fall-off through R50 (its slope from
 * R80 to R20) extended to the bremsstrahlung tail (the PDD at the table's deepest row).
 */
function practicalRangeCm(beam: ElectronBeamModel, r50Cm: number): number | undefined {
  const field = { kind: 'equivalent-square' as const, sideCm: 10, method: 'a 10 cm square' };
  const r80 = electronIsodoseDepthCm(beam, field, 80);
  const r20 = electronIsodoseDepthCm(beam, field, 20);
  if (r80 === undefined || r20 === undefined || !(r20 > r80)) return undefined;
  const slopePercentPerCm = 60 / (r20 - r80);
  const deepest = beam.pdd.rows.values[beam.pdd.rows.values.length - 1]!;
  const tail = electronPddPercent(beam, field, deepest, []);
  if (!(tail < 20)) return undefined;
  return r50Cm + (50 - tail) / slopePercentPerCm;
}
