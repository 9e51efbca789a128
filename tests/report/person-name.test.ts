import { describe, expect, it } from 'vitest';
import { personName } from '../../src/report/person-name.js';

describe('a DICOM person name in words', () => {
  it('family, then prefix, given and middle names, then suffix (PS3.5 6.2: components separated by ^, groups by =)', () => {
    expect(personName('Adams^John Robert Quincy^^Rev.^B.A. M.Div.')).toBe('Adams, Rev. John Robert Quincy B.A. M.Div.');
    expect(personName('Doe^Jane')).toBe('Doe, Jane');
    expect(personName('Wang^XiaoDong=王^小東')).toBe('Wang, XiaoDong');
    expect(personName('Mononym')).toBe('Mononym');
  });
});
