import type { ElectronBeamModel } from '../model/index.js';
import { electronIsodoseDepthCm } from '../physics/index.js';

/**
 * The electron beam's energy as its depth dose tells it: the mean energy at the surface
 * E0 ≈ 2.33 MeV/cm × R50 (the usual broad-beam relation, from memory; for fields of 10 × 10 cm and
 * more at SSD 100) beside the nominal energy. A PDD table typed from another energy, or with a
 * depth column in the wrong unit, stands far off.
 */
export const E0_PER_R50_MEV_PER_CM = 2.33;
/** Nominal and mean surface energies differ by some percent on real machines: beyond this, a look (common practice, no source). */
export const ELECTRON_ENERGY_TOLERANCE_PERCENT = 15;

export interface ElectronEnergyComparison {
  readonly beamId: string;
  readonly notCompared?: string;
  readonly r50Cm?: number;
  readonly e0MeV?: number;
  readonly differencePercent?: number;
}

export function compareElectronEnergy(beam: ElectronBeamModel): ElectronEnergyComparison {
  const side = Math.max(...beam.pdd.columns!.values);
  if (side < 10) return { beamId: beam.id, notCompared: `its PDD table has no field of 10 cm or more (the relation holds for broad beams)` };
  const r50Cm = electronIsodoseDepthCm(beam, { kind: 'equivalent-square', sideCm: 10, method: 'a 10 cm square' }, 50);
  if (r50Cm === undefined) return { beamId: beam.id, notCompared: 'its PDD table does not fall to 50 % for a 10 cm field' };
  const e0MeV = E0_PER_R50_MEV_PER_CM * r50Cm;
  return { beamId: beam.id, r50Cm, e0MeV, differencePercent: (100 * (e0MeV - beam.nominalEnergyMeV)) / beam.nominalEnergyMeV };
}
