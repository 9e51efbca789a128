import { describe, expect, it } from 'vitest';
import { Note, NOTE_CODES, note } from '../../src/model/check-note.js';

describe('coded notes', () => {
  it('keep their values, leaving out those undefined, and validate as the JSON document carries them', () => {
    const n = note('near-field-edge', { edgeDistanceCm: 0.8, marginCm: undefined });
    expect(n).toEqual({ code: 'near-field-edge', values: { edgeDistanceCm: 0.8 } });
    expect(Note.parse(n)).toEqual(n);
    expect(Note.safeParse({ code: 'no-such-code', values: {} }).success).toBe(false);
  });
  it('every code is listed once', () => {
    expect(new Set(NOTE_CODES).size).toBe(NOTE_CODES.length);
  });
});
