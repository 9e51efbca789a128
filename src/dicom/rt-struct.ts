import type { Result, Structure, StructureSet } from '../model/index.js';
import { need } from './item-reader.js';
import { readDicomObject } from './read-object.js';

export const RT_STRUCTURE_SET_STORAGE = '1.2.840.10008.5.1.4.1.1.481.3';

/** Reads an RT Structure Set: ROIs with names, interpreted types and closed planar (or point) contours. */
export function readRtStruct(file: string): Result<StructureSet> {
  const obj = readDicomObject(file, RT_STRUCTURE_SET_STORAGE, 'RT Structure Set');
  if (!obj.ok) return obj;
  const { reader: r, issues } = obj.value;
  const rois = r.sequence('StructureSetROISequence').map((x) => ({
    number: need(x, 'ROINumber', x.integer('ROINumber'), 'the ROI number'),
    name: x.string('ROIName') ?? '',
    frame: x.string('ReferencedFrameOfReferenceUID'),
  }));
  const types = new Map(
    r.sequence('RTROIObservationsSequence').map((o) => [o.integer('ReferencedROINumber'), o.string('RTROIInterpretedType')] as const),
  );
  const contours = new Map(
    r.sequence('ROIContourSequence').map(
      (c) =>
        [
          c.integer('ReferencedROINumber'),
          c.sequence('ContourSequence').map((k) => {
            const n = need(k, 'NumberOfContourPoints', k.integer('NumberOfContourPoints'), 'the number of points') ?? 0;
            const data = need(k, 'ContourData', k.tuple('ContourData', 3 * n), `${3 * n} coordinates (mm)`) ?? [];
            const pointsMm: [number, number, number][] = [];
            for (let i = 0; i + 2 < data.length; i += 3) pointsMm.push([data[i]!, data[i + 1]!, data[i + 2]!]);
            return { geometricType: k.string('ContourGeometricType') ?? '', pointsMm };
          }),
        ] as const,
    ),
  );
  if (issues.some((i) => i.severity === 'error')) return { ok: false, issues };
  const structures: Structure[] = rois
    .filter((x) => x.number !== undefined)
    .map((x) => ({
      number: x.number!,
      name: x.name,
      ...(types.get(x.number!) ? { type: types.get(x.number!)! } : {}),
      ...(x.frame ? { frameOfReferenceUid: x.frame } : {}),
      contours: contours.get(x.number!) ?? [],
    }));
  return {
    ok: true,
    value: {
      file,
      sopInstanceUid: r.string('SOPInstanceUID') ?? '',
      ...(r.string('StructureSetLabel') ? { label: r.string('StructureSetLabel')! } : {}),
      structures,
    },
    warnings: issues,
  };
}
