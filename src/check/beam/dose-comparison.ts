import { type Clamp, type Factor, factorLabel, type LookupNote } from '../../model/index.js';
import { percentDeviation } from '../deviation.js';

/**
 * Our dose for the planned MU and the MU for the planning system's dose, and the deviation of each:
 * (independent − planning system) / planning system.
 */
export function compareDose(
  plannedMu: number,
  dosePerMuCGy: number,
  planningSystemDoseCGy: number | undefined,
): {
  independentDoseCGy: number;
  independentMu?: number;
  doseDeviationPercent?: number;
  muDeviationPercent?: number;
} {
  const independentDoseCGy = plannedMu * dosePerMuCGy;
  const tps = planningSystemDoseCGy;
  if (tps === undefined || !(dosePerMuCGy > 0)) return { independentDoseCGy };
  const independentMu = tps / dosePerMuCGy;
  const muDeviationPercent = percentDeviation(independentMu, plannedMu);
  const doseDeviationPercent = percentDeviation(independentDoseCGy, tps);
  return {
    independentDoseCGy,
    independentMu,
    ...(muDeviationPercent !== undefined ? { muDeviationPercent } : {}),
    ...(doseDeviationPercent !== undefined ? { doseDeviationPercent } : {}),
  };
}

/** A beam's factors as the result lists them: each with its label and its own copy of the arguments. */
export function factorRows(factors: readonly Factor[]): { key: string; value: number; args: number[]; label: string; name?: string }[] {
  return factors.map((f) => ({ ...f, args: [...f.args], label: factorLabel(f) }));
}

/** The clamped lookups of a calculation, each told once (the same table, axis and value to 0.01). */
export function clampRows(notes: readonly LookupNote[]): Clamp[] {
  const seen = new Set<string>();
  const out: Clamp[] = [];
  for (const n of notes) {
    const key = `${n.table}|${n.axis}|${n.requested.toFixed(2)}|${n.used}|${n.unit}`;
    if (n.kind !== 'clamped' || seen.has(key)) continue;
    seen.add(key);
    out.push({ table: n.table, axis: n.axis, requested: n.requested, used: n.used, unit: n.unit });
  }
  return out;
}
