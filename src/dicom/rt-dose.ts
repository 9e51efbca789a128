import type { DoseGrid, Result } from '../model/index.js';
import { need } from './item-reader.js';
import { readDicomObject } from './read-object.js';
import { EXPLICIT_VR_BE } from './transfer-syntax.js';

export const RT_DOSE_STORAGE = '1.2.840.10008.5.1.4.1.1.481.2';

/** Reads an RT Dose file (any summation type) into a dose grid in Gy, Dose Grid Scaling applied. */
export function readRtDose(file: string): Result<DoseGrid> {
  const obj = readDicomObject(file, RT_DOSE_STORAGE, 'RT Dose');
  if (!obj.ok) return obj;
  const { reader: r, dataSet: ds, issues } = obj.value;
  const ipp = need(r, 'ImagePositionPatient', r.tuple('ImagePositionPatient', 3), 'the position of the first voxel (mm)');
  const iop = need(r, 'ImageOrientationPatient', r.tuple('ImageOrientationPatient', 6), 'the direction cosines');
  const spacing = need(r, 'PixelSpacing', r.tuple('PixelSpacing', 2), 'the pixel spacing (mm)');
  const rows = need(r, 'Rows', r.integer('Rows'), 'the number of rows');
  const columns = need(r, 'Columns', r.integer('Columns'), 'the number of columns');
  const frames = r.integer('NumberOfFrames') ?? 1;
  const offsets =
    frames > 1
      ? need(r, 'GridFrameOffsetVector', r.tuple('GridFrameOffsetVector', frames), `${frames} frame offsets (mm)`)
      : (r.numbers('GridFrameOffsetVector') ?? [0]);
  const scaling = need(r, 'DoseGridScaling', r.number('DoseGridScaling'), 'the dose grid scaling');
  const frame = need(r, 'FrameOfReferenceUID', r.string('FrameOfReferenceUID'), 'the frame of reference UID');
  const summation = need(r, 'DoseSummationType', r.string('DoseSummationType'), 'PLAN, FRACTION, BEAM, …');
  const bits = r.integer('BitsAllocated');
  const el = ds.elements.x7fe00010;
  if (!ipp || !iop || !spacing || rows === undefined || columns === undefined || !offsets || scaling === undefined || !frame || !summation)
    return { ok: false, issues };
  if (!el || el.encapsulatedPixelData)
    return { ok: false, issues: [{ severity: 'error', code: 'missing-attribute', file, path: 'PixelData', message: 'no uncompressed pixel data' }] };
  if (bits !== 16 && bits !== 32)
    return {
      ok: false,
      issues: [
        { severity: 'error', code: 'invalid-value', file, path: 'BitsAllocated', message: 'dose grids of 16 or 32 bits are read', found: `${bits}` },
      ],
    };
  const n = rows * columns * frames;
  if (el.length !== (n * bits) / 8)
    return {
      ok: false,
      issues: [
        {
          severity: 'error',
          code: 'inconsistent',
          file,
          path: 'PixelData',
          message: 'the pixel data do not match the grid',
          expected: `${(n * bits) / 8} bytes`,
          found: `${el.length}`,
        },
      ],
    };
  const little = obj.value.transferSyntaxUid !== EXPLICIT_VR_BE;
  const signed = r.integer('PixelRepresentation') === 1;
  const view = new DataView(ds.byteArray.buffer, ds.byteArray.byteOffset + el.dataOffset, el.length);
  const doseGy = new Float32Array(n);
  for (let k = 0; k < n; k++) {
    const raw =
      bits === 32
        ? signed
          ? view.getInt32(4 * k, little)
          : view.getUint32(4 * k, little)
        : signed
          ? view.getInt16(2 * k, little)
          : view.getUint16(2 * k, little);
    doseGy[k] = raw * scaling;
  }
  const rowDir = iop.slice(0, 3) as [number, number, number];
  const colDir = iop.slice(3) as [number, number, number];
  const normal: [number, number, number] = [
    rowDir[1] * colDir[2] - rowDir[2] * colDir[1],
    rowDir[2] * colDir[0] - rowDir[0] * colDir[2],
    rowDir[0] * colDir[1] - rowDir[1] * colDir[0],
  ];
  // Offsets are relative to the first frame when the first is 0; otherwise they are positions along the normal.
  const base = offsets[0] === 0 ? 0 : ipp[0]! * normal[0] + ipp[1]! * normal[1] + ipp[2]! * normal[2];
  const plans = r.sequence('ReferencedRTPlanSequence');
  const planUid = plans[0]?.string('ReferencedSOPInstanceUID');
  const beamNumber = plans[0]?.sequence('ReferencedFractionGroupSequence')[0]?.sequence('ReferencedBeamSequence')[0]?.integer('ReferencedBeamNumber');
  const heterogeneity = r.strings('TissueHeterogeneityCorrection');
  if (issues.some((i) => i.severity === 'error')) return { ok: false, issues };
  return {
    ok: true,
    value: {
      file,
      frameOfReferenceUid: frame,
      summationType: summation,
      units: r.string('DoseUnits') ?? '',
      type: r.string('DoseType') ?? '',
      ...(heterogeneity?.length ? { tissueHeterogeneityCorrection: heterogeneity } : {}),
      ...(planUid ? { referencedPlanUid: planUid } : {}),
      ...(beamNumber !== undefined ? { referencedBeamNumber: beamNumber } : {}),
      columns,
      rows,
      originMm: ipp as [number, number, number],
      rowDirection: rowDir,
      columnDirection: colDir,
      normal,
      columnSpacingMm: spacing[1]!,
      rowSpacingMm: spacing[0]!,
      frameOffsetsMm: offsets.map((o) => o - base),
      doseGy,
    },
    warnings: issues,
  };
}
