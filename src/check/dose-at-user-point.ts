import { doseAtPointGy } from '../geometry/index.js';
import { type CalculatedBeam, cGyFromGy, type DoseGrid, type NotCheckedBeam } from '../model/index.js';
import { compareDose } from './beam/dose-comparison.js';

/**
 * At a point of the user's where the planning system's Beam Dose does not apply, the Beam Dose is no
 * reference: the beam is compared with the planning system's own per-beam dose grid there, when one
 * was given, and otherwise with nothing (our dose stands alone, with no deviation and no verdict).
 */
export function atUserPoint(b: CalculatedBeam | NotCheckedBeam, grids: readonly DoseGrid[]): CalculatedBeam | NotCheckedBeam {
  if (b.status !== 'checked' || b.point.source !== 'user' || b.point.planningSystemDoseHere) return b;
  const { planningSystemDoseCGy: _beamDose, ...rest } = b;
  const { independentMu: _mu, muDeviationPercent: _dm, doseDeviationPercent: _dd, ...calculation } = b.calculation;
  const grid = grids.find((g) => g.summationType === 'BEAM' && g.referencedBeamNumber === b.beamNumber);
  const gy = grid ? doseAtPointGy(grid, b.point.patientMm) : undefined;
  if (gy === undefined || b.plannedMu === undefined || !(b.plannedMu > 0)) return { ...rest, calculation };
  const dosePerMuCGy = b.calculation.independentDoseCGy / b.plannedMu;
  return {
    ...rest,
    planningSystemDoseCGy: cGyFromGy(gy),
    planningSystemDoseFrom: 'dose grid',
    calculation: { ...calculation, ...compareDose(b.plannedMu, dosePerMuCGy, cGyFromGy(gy)) },
  };
}
