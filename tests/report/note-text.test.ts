import { describe, expect, it } from 'vitest';
import { NOTE_CODES, note } from '../../src/model/index.js';
import { clampText, noteText, pointText } from '../../src/report/note-text.js';

describe('coded notes in words', () => {
  it('words every code, and never leaks a raw undefined', () => {
    for (const code of NOTE_CODES) {
      const text = noteText(note(code));
      expect(text.length).toBeGreaterThan(5);
      expect(text).not.toMatch(/undefined/);
    }
  });
  it('writes the numbers with their units and the precision a physicist reads', () => {
    expect(noteText(note('near-field-edge', { edgeDistanceCm: 1.234, marginCm: 1.5 }))).toBe(
      'the point is 1.2 cm from the field edge (margin 1.5 cm)',
    );
    expect(noteText(note('sad-differs', { sadMm: 800, machineSadCm: 100 }))).toBe("the beam's SAD (800 mm) is not the machine's (100 cm)");
    expect(noteText(note('segment-no-ssd', { controlPoint: 4 }))).toMatch(/^control points 4–5: the plan gives no SSD there/);
    expect(noteText(note('ct-trace', { message: 'the ray leaves the CT', controlPoint: 2 }))).toBe('CT, control points 2–3: the ray leaves the CT');
    expect(noteText(note('ct-trace', { message: 'the ray leaves the CT' }))).toBe('CT: the ray leaves the CT');
    expect(noteText(note('patient-position', { position: 'HFDR', supported: 'HFS, HFP, FFS, FFP' }))).toBe(
      'patient position HFDR: the beam geometry supports HFS, HFP, FFS and FFP so far',
    );
    expect(noteText(note('clarkson-irregular', { mlc: 0, blocks: 2, sectors: 72, leafTransmission: 0.015, blockTransmissions: [0, 0.05] }))).toBe(
      'irregular field (2 block(s)) by Clarkson integration over 72 sectors; leaf transmission 0.015, block transmission as the plan states (0, 0.05)',
    );
  });
  it('names the point by what chose it, and a clamp by its table, axis and values', () => {
    expect(pointText({ source: 'dose-reference', doseReferenceVia: 'referenced-uid', doseReferenceNumber: 3 })).toBe(
      "dose reference 3 named by the beam's Referenced Dose Reference UID",
    );
    expect(clampText({ table: '6X sp', axis: 'side', requested: 41.234, used: 40, unit: 'cm' })).toBe('6X sp: side 41.23 cm clamped to 40 cm');
  });
});

describe("the CT's refusals in words", () => {
  it('say why the CT cannot give a depth, with the numbers', () => {
    expect(noteText(note('ct-trace', { reason: 'hu-outside-table', hu: 3100 }))).toBe(
      'CT: HU 3100 on the ray lies outside the HU to electron density table',
    );
    expect(noteText(note('ct-trace', { reason: 'point-outside-ct', gapMm: 12.34, controlPoint: 7 }))).toBe(
      'CT, control points 7–8: the point lies outside the CT: the ray leaves the CT 12.3 mm before it, with no densities there',
    );
    expect(noteText(note('ct-trace', { reason: 'field-of-view-cuts-body', bodyThresholdHu: -400 }))).toMatch(
      /body threshold \(-400 HU\).*field of view cuts the body/,
    );
  });
});
