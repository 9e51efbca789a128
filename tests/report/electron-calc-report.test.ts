/**
 * The electron calculation as a physicist writes it, on a beam built from numbers with the 9 MeV
 * output factors of the 10 × 10 applicator (AAPM TG-71 Table VII, read): 200 cGy at dmax through a
 * 4 × 4 cm cutout (Se 0.963) needs 200/0.963 = 207.7 MU (arithmetic by hand).
 */
import { describe, expect, it } from 'vitest';
import { electronDosePerMu } from '../../src/physics/index.js';
import { CAUTION } from '../../src/report/caution.js';
import { type ElectronCalcReport, ElectronCalcDocument, electronCalcDocument, electronCalcText } from '../../src/report/electron-calc-report.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';
import { electronBeam } from '../helpers/model-beam.js';

const TABLE_VII: Readonly<Record<number, number>> = { 4: 0.963, 6: 1.003, 8: 1.003, 10: 1.0 };
const beam = electronBeam({
  pdd: (d) => (d <= 2 ? 90 + 5 * d : Math.max(4, 100 - 30 * (d - 2))),
  outputFactor: (s) => TABLE_VII[s]!,
  effectiveSsdCm: 85,
});
const m = { ...machine(DEMO_MANIFEST), electronBeams: [beam] };
const report = (input: ElectronCalcReport['input'], isodosePercent?: number): ElectronCalcReport => {
  const r = electronDosePerMu(beam, input);
  if (!r.ok) throw new Error('refused');
  return {
    machine: m,
    beam,
    input,
    result: r.value,
    doseCGy: 200,
    mu: 200 / r.value.dosePerMuCGy,
    given: 'dose',
    flags: [],
    ...(isodosePercent ? { isodosePercent } : {}),
  };
};
const square4 = { applicatorId: 'A10', field: { kind: 'equivalent-square' as const, sideCm: 4, method: 'as given' }, depthCm: 2, ssdCm: 100 };

describe('electronCalcText', () => {
  it('a 4 × 4 cutout at dmax, nominal SSD: 207.7 MU for 200 cGy, the caution last', () => {
    const text = electronCalcText(report(square4));
    expect(text).toContain('  MU = 200 cGy / 0.9630 cGy/MU = 207.7 MU');
    expect(text).toContain('  applicator A10, cutout equivalent square 4.00 cm (as given)');
    expect(text.some((l) => l.includes('air gap 0.0 cm, effective SSD 85.0 cm'))).toBe(true);
    expect(text.at(-1)).toBe(CAUTION);
  });
  it('a rectangle says the square-root rule; an isodose depth says so', () => {
    const text = electronCalcText(report({ ...square4, field: { kind: 'rectangle', xCm: 4, yCm: 8 }, depthCm: 2 + 20 / 30 }, 80));
    expect(text).toContain('  applicator A10, cutout 4 x 8 cm at the nominal SSD (Se and PDD by the square-root rule)');
    expect(text.some((l) => l.startsWith('  depth 2.67 cm (the depth of the 80 % isodose on the central axis)'))).toBe(true);
  });
});

describe('electronCalcDocument', () => {
  it('is valid against its own schema and carries the same numbers', () => {
    const d = electronCalcDocument(report(square4), '0.0.0-test');
    expect(ElectronCalcDocument.parse(d)).toEqual(d);
    expect(d.mu).toBeCloseTo(200 / 0.963, 9);
  });
});
