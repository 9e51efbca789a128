import { describe, expect, it } from 'vitest';
import { beamDataText } from '../../src/report/beam-data-text.js';

const stamp = {
  manifest: 'm.json',
  sha256: 'ab'.repeat(32),
  machine: 'LINAC 2',
  dataVersion: '2026-11',
  invented: false,
  validationWarnings: 0,
};

describe('the beam data in one sentence', () => {
  it('names the machine, version and hash, that validation passed, and who approved them when', () => {
    expect(beamDataText({ ...stamp, approvedOn: '2026-11-30', approvedBy: 'A. Physicist', commissionedOn: '2026-11-01' })).toBe(
      'beam data LINAC 2, version 2026-11, SHA-256 abababababababab…; validated, no warnings; approved 2026-11-30 by A. Physicist (commissioned 2026-11-01)',
    );
  });
  it('says invented data are never for a patient, how many warnings validation left, and that no approval is recorded', () => {
    const text = beamDataText({ ...stamp, invented: true, validationWarnings: 2 });
    expect(text).toContain('(INVENTED DEMO DATA, never for a patient)');
    expect(text).toContain('validated with 2 warning(s)');
    expect(text).toContain('approval not recorded in the beam data');
  });
});
