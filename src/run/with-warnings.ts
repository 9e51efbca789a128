import type { Note, PlanCheck } from '../model/index.js';

/** A plan's result with the warnings of what it was checked with (a CT not found, a companion unreadable) added. */
export function withWarnings(result: PlanCheck, warnings: readonly Note[]): PlanCheck {
  return warnings.length ? { ...result, warnings: [...result.warnings, ...warnings] } : result;
}
