import { type Factor, factorLabel, type LookupNote } from '../model/index.js';

/** A beam's factors as the result lists them: each with its label and its own copy of the arguments. */
export function factorRows(factors: readonly Factor[]): { key: string; value: number; args: number[]; label: string; name?: string }[] {
  return factors.map((f) => ({ ...f, args: [...f.args], label: factorLabel(f) }));
}

/** The clamped lookups of a calculation, each told once. */
export function clampTexts(notes: readonly LookupNote[]): string[] {
  return [...new Set(notes.filter((n) => n.kind === 'clamped').map((n) => `${n.table}: ${n.axis} ${n.requested.toFixed(2)} ${n.unit} clamped to ${n.used} ${n.unit}`))];
}
