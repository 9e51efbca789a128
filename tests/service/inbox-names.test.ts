import { describe, expect, it } from 'vitest';
import { arrivalOf, inboxNameFor, originalName, receivedName } from '../../src/service/inbox-names.js';

describe('inbox names', () => {
  it('a watched file keeps its exported name; a received object its calling AE title, whatever characters it holds', () => {
    expect(arrivalOf(inboxNameFor('/export/RP.1.2.dcm'))).toEqual({ fileName: 'RP.1.2.dcm', received: false });
    const name = receivedName('TPS/1 ..');
    expect(name).toMatch(/^[0-9a-f-]{36}@[0-9a-f]+\.dcm$/);
    expect(arrivalOf(name)).toEqual({ fileName: name, received: true, callingAeTitle: 'TPS/1 ..' });
    expect(originalName(name)).toBe(name);
  });
  it('a name of neither kind is kept as it is, from no sender', () => {
    expect(arrivalOf('plain.dcm')).toEqual({ fileName: 'plain.dcm', received: false });
  });
});
