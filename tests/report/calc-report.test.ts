/**
 * The manual calculation as a physicist writes it, on Khan's SSD example (inputs read, secondary:
 * 200 cGy at 10 cm, 15 × 15 cm at SSD 100 cm, Sc 1.020, Sp 1.010, %DD 65.1; the textbook's 298 MU
 * from memory): the factors one per line, the MU for the dose, the clamp said, the caution last.
 */
import { describe, expect, it } from 'vitest';
import { photonDosePerMu } from '../../src/physics/index.js';
import { CAUTION } from '../../src/report/caution.js';
import { type CalcReport, CalcDocument, calcDocument, calcText } from '../../src/report/calc-report.js';
import { KHAN_MANIFEST, beam, machine } from '../helpers/machines.js';

const m = machine(KHAN_MANIFEST);
const b = beam(m, '4X');
const input = { setup: 'SSD' as const, collimatorFieldCm: { x: 15, y: 15 }, depthCm: 10, ssdCm: 100 };
const r = photonDosePerMu(b, m.sadCm, input);
if (!r.ok) throw new Error('refused');
const report: CalcReport = {
  machine: m,
  beam: b,
  input,
  result: r.value,
  doseCGy: 200,
  mu: 200 / r.value.dosePerMuCGy,
  given: 'dose',
  ssdNote: 'as given',
  flags: [],
};

describe('calcText', () => {
  const text = calcText(report);
  it('ends with the MU for 200 cGy: 298.2 MU (Khan: 298 MU)', () => {
    expect(text).toContain('  MU = 200 cGy / 0.6707 cGy/MU = 298.2 MU');
  });
  it('lists Sc 1.0200, Sp 1.0100 and the PDD 0.6510, each on its own line', () => {
    for (const v of ['1.0200', '1.0100', '0.6510']) expect(text.filter((l) => l.endsWith(`= ${v}`))).toHaveLength(1);
  });
  it('says the clamped Sp lookup (15.15 cm on a table ending at 15 cm)', () => {
    expect(text.some((l) => /note: 4X sp \(sp\.csv\): fieldSide 15\.15 cm is outside the table .* the edge value at 15 cm was used/.test(l))).toBe(
      true,
    );
  });
  it('names the setup and the geometry, and ends with the caution', () => {
    expect(text[0]).toBe('Point dose calculation, SSD setup (AAPM TG-71 formalism)');
    expect(text.at(-1)).toBe(CAUTION);
  });
  it('a flag is said as a FLAG line', () => {
    const flagged = calcText({ ...report, flags: [{ code: 'mu-beyond-machine', values: { mu: 2000, machine: 'M', maxMu: 999 } }] });
    expect(flagged).toContain('  FLAG: 2000.0 MU is more than machine M delivers in one beam (999 MU, its beam data)');
  });
});

describe('calcDocument', () => {
  it('is valid against its own schema and carries the same numbers', () => {
    const d = calcDocument(report, '0.0.0-test');
    expect(CalcDocument.parse(d)).toEqual(d);
    expect(d.mu).toBeCloseTo(298.2, 1);
    expect(d.factors.map((f) => f.key)).toEqual(['D0', 'Sc', 'Sp', 'PDD', 'ISF']);
    expect(d.clamps).toHaveLength(1);
    expect(d.caution).toBe(CAUTION);
  });
});
