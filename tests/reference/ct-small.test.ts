/** pydicom's CT_small.dcm (Debian python3-pydicom test files) read as a one-slice volume, against pydicom itself. */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readCtSeries } from '../../src/dicom/index.js';
import { runPython } from '../../scripts/lib/find-python.js';

const samples = runPython('import pydicom, os; print(os.path.join(os.path.dirname(pydicom.__file__), "data", "test_files"))').trim();
const file = join(samples, 'CT_small.dcm');

describe('CT_small.dcm', () => {
  const ref = JSON.parse(
    runPython(
      `
import json, sys, pydicom
d = pydicom.dcmread(sys.argv[1])
hu = d.pixel_array.astype(float) * float(d.RescaleSlope) + float(d.RescaleIntercept)
print(json.dumps({"min": hu.min(), "max": hu.max(), "sum": hu.sum(), "rows": d.Rows, "cols": d.Columns,
  "samples": [hu[r][c] for r, c in [(0, 0), (64, 64), (10, 100), (127, 3)]],
  "ipp": [float(v) for v in d.ImagePositionPatient], "spacing": [float(v) for v in d.PixelSpacing]}))
`,
      [file],
    ),
  );

  it('gives the HU pydicom gives, voxel for voxel (min, max, sum and samples)', () => {
    const r = readCtSeries([file]);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    const v = r.value;
    expect([v.rows, v.columns, v.slices]).toEqual([ref.rows, ref.cols, 1]);
    let min = Infinity,
      max = -Infinity,
      sum = 0;
    for (const h of v.hu) {
      min = Math.min(min, h);
      max = Math.max(max, h);
      sum += h;
    }
    expect([min, max, sum]).toEqual([ref.min, ref.max, ref.sum]);
    const at = (row: number, col: number) => v.hu[row * v.columns + col];
    expect([at(0, 0), at(64, 64), at(10, 100), at(127, 3)]).toEqual(ref.samples);
    expect(v.originMm).toEqual(ref.ipp);
    expect([v.rowSpacingMm, v.columnSpacingMm]).toEqual(ref.spacing);
  });

  it('refuses an RT Plan given as a CT slice', () => {
    const r = readCtSeries([join(samples, 'rtplan.dcm')]);
    expect(!r.ok && r.issues[0]!.message).toBe('not a CT image');
  });
});
