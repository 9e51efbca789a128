/**
 * The generated keyword table (from pydicom's copy of the DICOM data dictionary) cross-checked
 * against a second, independent copy: dcmtk's dicom.dic (Debian package libdcmtk).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ATTRIBUTES, SOP_CLASS_NAMES } from '../../src/dicom/dictionary.js';

function dcmtkDictionary(): string {
  if (process.env.DCMDICTPATH) return process.env.DCMDICTPATH.split(':')[0]!;
  const share = '/usr/share';
  const dir = readdirSync(share).find((d) => /^libdcmtk\d+$/.test(d));
  if (!dir) throw new Error('dcmtk data dictionary not found (install Debian dcmtk)');
  return join(share, dir, 'dicom.dic');
}

const dcmtk = new Map<string, { vr: string; name: string; retired: boolean }>();
for (const line of readFileSync(dcmtkDictionary(), 'latin1').split('\n')) {
  const m = /^\(([0-9A-F]{4}),([0-9A-F]{4})\)\t(\S+)\t(\S+)\t\S+\t(\S+)/.exec(line);
  if (m) dcmtk.set(`x${m[1]}${m[2]}`.toLowerCase(), { vr: m[3]!, name: m[4]!, retired: m[5]!.includes('retired') });
}

describe('generated attribute dictionary', () => {
  it('agrees with dcmtk dicom.dic on tag, VR and keyword for every attribute plumbline reads', () => {
    expect(dcmtk.size).toBeGreaterThan(3000);
    const disagreements = Object.entries(ATTRIBUTES).flatMap(([kw, a]) => {
      const d = dcmtk.get(a.tag);
      if (!d) return [`${kw} ${a.tag}: not in dcmtk`];
      const out: string[] = [];
      // dcmtk writes the pixel data's "OB or OW" as its own pseudo-VR "px".
      const same = d.vr === a.vr || (d.vr === 'px' && a.vr === 'OB or OW');
      if (!same) out.push(`${kw}: VR ${a.vr}, dcmtk ${d.vr}`);
      if (d.name.replace(/^RETIRED_/, '') !== kw) out.push(`${kw}: dcmtk calls it ${d.name}`);
      return out;
    });
    expect(disagreements).toEqual([]);
  });

  it('marks Beam Dose Specification Point retired and the beam dose point depths current, as dcmtk does', () => {
    expect(ATTRIBUTES.BeamDoseSpecificationPoint.retired).toBe(dcmtk.get('x300a0082')!.retired);
    expect(ATTRIBUTES.BeamDosePointDepth.retired).toBe(false);
    expect(dcmtk.get('x300a0088')!.retired).toBe(false);
  });

  it('names the RT Plan and CT storage SOP classes', () => {
    // PS3.4 Annex B (common practice, no source beyond the standard's UID registry).
    expect(SOP_CLASS_NAMES['1.2.840.10008.5.1.4.1.1.481.5']).toBe('RT Plan Storage');
    expect(SOP_CLASS_NAMES['1.2.840.10008.5.1.4.1.1.2']).toBe('CT Image Storage');
  });
});
