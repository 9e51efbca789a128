/** pydicom's rtstruct.dcm (a raw dataset without a Part-10 header), read and compared with pydicom. */
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readRtStruct } from '../../src/dicom/index.js';
import { runPython } from '../../scripts/lib/find-python.js';

const samples = runPython('import pydicom, os; print(os.path.join(os.path.dirname(pydicom.__file__), "data", "test_files"))').trim();
const file = join(samples, 'rtstruct.dcm');

describe('rtstruct.dcm', () => {
  const ref = JSON.parse(
    runPython(
      `
import json, sys, pydicom
d = pydicom.dcmread(sys.argv[1], force=True)
types = {int(o.ReferencedROINumber): o.RTROIInterpretedType for o in d.RTROIObservationsSequence}
cont = {int(c.ReferencedROINumber): [[float(v) for v in k.ContourData] for k in c.ContourSequence] for c in d.ROIContourSequence}
print(json.dumps([{"number": int(r.ROINumber), "name": r.ROIName, "type": types.get(int(r.ROINumber)), "contours": cont.get(int(r.ROINumber), [])} for r in d.StructureSetROISequence]))
`,
      [file],
    ),
  );

  it('gives every ROI with its name, interpreted type and contour points as pydicom does', () => {
    const r = readRtStruct(file);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(
      r.value.structures.map((s) => ({ number: s.number, name: s.name, type: s.type, contours: s.contours.map((c) => c.pointsMm.flat()) })),
    ).toEqual(ref);
    expect(r.value.structures.find((s) => s.type === 'EXTERNAL')!.name).toBe('patient');
  });
});
