import { type Factor, factorLabel } from '../model/index.js';

/** The factors one per line, their product, and the dose for the MU or the MU for the dose, as written by hand. */
export function handCalculation(
  factors: readonly Factor[],
  dosePerMuCGy: number,
  r: { readonly given: 'mu' | 'dose'; readonly mu: number; readonly doseCGy: number },
): string[] {
  return [
    ...factors.map((f) => `  ${factorLabel(f).padEnd(44)} = ${f.value.toFixed(4)}`),
    `  ${'dose per MU'.padEnd(44)} = ${dosePerMuCGy.toFixed(4)} cGy/MU`,
    '',
    r.given === 'mu'
      ? `  dose = ${r.mu} MU x ${dosePerMuCGy.toFixed(4)} cGy/MU = ${r.doseCGy.toFixed(1)} cGy`
      : `  MU = ${r.doseCGy} cGy / ${dosePerMuCGy.toFixed(4)} cGy/MU = ${r.mu.toFixed(1)} MU`,
  ];
}
