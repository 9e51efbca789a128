import { z } from 'zod';

/**
 * What the check says about a beam or a plan, as data: a code and the numbers (or names) it rests
 * on. The check layer writes no prose; `src/report/note-text.ts` words every code.
 */
export const NOTE_CODES = [
  // Why a beam is not checked.
  'setup-beam',
  'radiation-type',
  'meterset-in-minutes',
  'no-meterset',
  'compensator',
  'electron-moves',
  'wedge-type',
  'table-eccentric',
  'no-patient-position',
  'patient-position',
  'no-isocenter',
  'no-energy',
  'input-refused',
  'no-point',
  'ct-not-this-plan',
  'swept-wedge-no-angle',
  'swept-wedge-orientation',
  'wedge-off-axis',
  'sad-differs',
  'no-ssd-no-ct',
  'point-above-surface',
  'no-open-aperture',
  'ct-trace',
  'no-axis-ssd',
  'point-blocked',
  'calculation-refused',
  'heterogeneity-outside-tables',
  'modulated-blocks',
  'modulated-wedge',
  'collimator-or-couch-turns',
  'energy-changes',
  'no-meterset-delivered',
  'aperture-closed',
  'segment-no-ssd',
  'segment-no-aperture',
  'electron-no-applicator',
  'electron-blocks',
  'cutout-too-large',
  'homogeneous-refused',
  // Approximations a calculation made.
  'ssd-irregular-tpr-form',
  'clarkson-irregular',
  // No longer written (wedge-off-axis took its place); kept so documents recorded before still word.
  'wedge-profile-not-applied',
  'wedge-central-axis-factor',
  'swept-wedge-asymmetric',
  'bolus-depth',
  'table-pitch-roll-ignored',
  'batho-interface-in-build-up',
  'batho-point-medium',
  'modulated-clarkson',
  'modulated-depths',
  'modulated-heterogeneity',
  'leaf-ends-not-modelled',
  'leaf-end-gap',
  'electron-cutout',
  'electron-extended-ssd',
  'electron-off-axis',
  // Why a point is not fit for a point check.
  'outside-field',
  'near-field-edge',
  'build-up',
  'past-interface',
  'covered-by-leaves',
  'build-up-some-angles',
  'ssd-differs-some-angle',
  'electron-build-up',
  'steep-fall-off',
  // Why a verdict is what it is.
  'no-beam-dose',
  'judged-on-share',
  'judged-on-composite',
  'no-dose-at-point',
  'compared-with-dose-grid',
  'dose-point-unstated',
  'point-unfit',
  'ct-correction',
  'ct-ssd-differs',
  'planning-system-depths',
  // How the setup was classified.
  'ssd-equals-sad',
  'isocenter-deep',
  'modulated-tpr-form',
  'electron-applicator',
  // Of a whole plan.
  'beams-not-checked',
  'no-beam-checked',
  'approval-status',
  'planning-system-heterogeneity-corrected',
  'heterogeneity-unknown',
  'no-ct-in-frame',
  'dose-not-this-plan',
  'mu-beyond-machine',
  'ct-without-density',
  'ct-unusable',
  'dose-unreadable',
] as const;

export const NoteCode = z.enum(NOTE_CODES);
export type NoteCode = z.infer<typeof NoteCode>;

export const NoteValue = z.union([z.number(), z.string(), z.array(z.number())]);
export type NoteValue = z.infer<typeof NoteValue>;

export const Note = z.object({ code: NoteCode, values: z.record(z.string(), NoteValue) });
export type Note = z.infer<typeof Note>;

/** A note; values left undefined are left out. */
export function note(code: NoteCode, values: Readonly<Record<string, NoteValue | undefined>> = {}): Note {
  const kept: Record<string, NoteValue> = {};
  for (const [k, v] of Object.entries(values)) if (v !== undefined) kept[k] = v;
  return { code, values: kept };
}
