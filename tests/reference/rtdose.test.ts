/** pydicom's rtdose.dcm (Debian python3-pydicom test files) read and interpolated, against pydicom and numpy. */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readRtDose } from '../../src/dicom/index.js';
import { doseAtPointGy } from '../../src/geometry/index.js';
import { runPython } from '../../scripts/lib/find-python.js';

const samples = runPython('import pydicom, os; print(os.path.join(os.path.dirname(pydicom.__file__), "data", "test_files"))').trim();
const file = join(samples, 'rtdose.dcm');

describe('rtdose.dcm', () => {
  // pydicom's reading: the grid in Gy, voxel-centre positions, and the mean of a 2 x 2 x 2 block of
  // voxels, which is what trilinear interpolation must give at the block's centre.
  const ref = JSON.parse(
    runPython(
      `
import json, sys, pydicom, numpy as np
d = pydicom.dcmread(sys.argv[1])
g = d.pixel_array.astype(float) * float(d.DoseGridScaling)
ipp = [float(v) for v in d.ImagePositionPatient]; ps = [float(v) for v in d.PixelSpacing]; off = [float(v) for v in d.GridFrameOffsetVector]
def pos(k, j, i): return [ipp[0] + i * ps[1], ipp[1] + j * ps[0], ipp[2] + off[k]]
blocks = []
for (k, j, i) in [(0, 0, 0), (5, 4, 3), (13, 8, 8)]:
    blocks.append({"point": [(a + b) / 2 for a, b in zip(pos(k, j, i), pos(k + 1, j + 1, i + 1))], "mean": g[k:k+2, j:j+2, i:i+2].mean()})
print(json.dumps({"max": g.max(), "shape": list(g.shape), "summation": d.DoseSummationType, "units": d.DoseUnits,
  "voxel": {"point": pos(7, 5, 2), "dose": g[7, 5, 2]}, "blocks": blocks}))
`,
      [file],
    ),
  );

  it('reads the grid as pydicom does: shape, maximum, summation type and units', () => {
    const r = readRtDose(file);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect([r.value.frameOffsetsMm.length, r.value.rows, r.value.columns]).toEqual(ref.shape);
    expect(Math.max(...r.value.doseGy)).toBeCloseTo(ref.max, 6);
    expect(r.value.summationType).toBe(ref.summation);
    expect(r.value.units).toBe(ref.units);
  });

  it('interpolates exactly at voxel centres and to the block mean at block centres (trilinear)', () => {
    const r = readRtDose(file);
    if (!r.ok) throw new Error('not read');
    expect(doseAtPointGy(r.value, ref.voxel.point)).toBeCloseTo(ref.voxel.dose, 6);
    for (const b of ref.blocks) expect(doseAtPointGy(r.value, b.point)).toBeCloseTo(b.mean, 6);
    expect(doseAtPointGy(r.value, [1e4, 0, 0])).toBeUndefined();
  });
});

describe("pydicom's rtdose.dcm with a nonsense Dose Grid Scaling", () => {
  // Written by pydicom (the reference tool), so the file is well-formed DICOM with one value no planning system writes.
  const scaled = (value: string) => {
    const out = join(mkdtempSync(join(tmpdir(), 'plumbline-rtdose-')), 'scaled.dcm');
    runPython(`import sys, pydicom; d = pydicom.dcmread(sys.argv[1]); d.DoseGridScaling = sys.argv[3]; d.save_as(sys.argv[2])`, [file, out, value]);
    return out;
  };
  for (const value of ['-1e-3', '1e300', '0']) {
    it(`${value} is refused naming the attribute, never a dose of −3 000 cGy or 1e300`, () => {
      const r = readRtDose(scaled(value));
      expect(r.ok).toBe(false);
      if (!r.ok) expect(r.issues).toContainEqual(expect.objectContaining({ code: 'physical-range', path: 'DoseGridScaling' }));
    });
  }
});

describe("pydicom's rtdose.dcm with a Tissue Heterogeneity Correction", () => {
  it('reads the values pydicom wrote (IMAGE, ROI_OVERRIDE), and none where the file states none', () => {
    const out = join(mkdtempSync(join(tmpdir(), 'plumbline-rtdose-')), 'corrected.dcm');
    runPython(
      `import sys, pydicom; d = pydicom.dcmread(sys.argv[1]); d.TissueHeterogeneityCorrection = ['IMAGE', 'ROI_OVERRIDE']; d.save_as(sys.argv[2])`,
      [file, out],
    );
    const written = runPython(`import sys, pydicom; print(list(pydicom.dcmread(sys.argv[1]).TissueHeterogeneityCorrection))`, [out]).trim();
    expect(written).toBe("['IMAGE', 'ROI_OVERRIDE']");
    const r = readRtDose(out);
    expect(r.ok && r.value.tissueHeterogeneityCorrection).toEqual(['IMAGE', 'ROI_OVERRIDE']);
    const plain = readRtDose(file);
    const stated = runPython(`import sys, pydicom; print('TissueHeterogeneityCorrection' in pydicom.dcmread(sys.argv[1]))`, [file]).trim();
    expect(plain.ok && plain.value.tissueHeterogeneityCorrection !== undefined).toBe(stated === 'True');
  });
});
