import { doseAtPointGy } from '../geometry/index.js';
import { cGyFromGy, type DoseGrid, type FractionGroupCheck } from '../model/index.js';

/** The grid's dose at a total's point, when the grid is of the matching summation. */
export function withGrid<T extends { pointPatientMm: readonly number[] }>(t: T, grid: DoseGrid | undefined): T {
  const gy = grid ? doseAtPointGy(grid, t.pointPatientMm as [number, number, number]) : undefined;
  return gy === undefined ? t : { ...t, doseGridCGy: cGyFromGy(gy), doseGridSummation: grid!.summationType };
}

/** Per-beam grids (BEAM) to their beams, per-fraction grids (FRACTION) to the group totals. */
export function attachDoseGrids(groups: readonly FractionGroupCheck[], grids: readonly DoseGrid[]): FractionGroupCheck[] {
  if (!grids.length) return [...groups];
  return groups.map((g) => ({
    ...g,
    beams: g.beams.map((b) => {
      const grid = grids.find((x) => x.summationType === 'BEAM' && x.referencedBeamNumber === b.beamNumber);
      const gy = grid && b.point ? doseAtPointGy(grid, b.point.patientMm) : undefined;
      return gy === undefined ? b : { ...b, doseGridCGy: cGyFromGy(gy) };
    }),
    totals: g.totals.map((t) =>
      withGrid(
        t,
        grids.find((x) => x.summationType === 'FRACTION'),
      ),
    ),
  }));
}
