import { readFileSync } from 'node:fs';
import type { CtVolume, Issue, Result } from '../model/index.js';
import { ItemReader, need } from './item-reader.js';
import { parseDicomBytes } from './parse-bytes.js';
import { EXPLICIT_VR_BE } from './transfer-syntax.js';

export const CT_IMAGE_STORAGE = '1.2.840.10008.5.1.4.1.1.2';

interface Slice {
  readonly file: string;
  readonly position: [number, number, number];
  readonly distanceMm: number;
  readonly hu: Int16Array;
}

/** Geometry tolerance between slices: direction cosines, spacing, and gap regularity. */
const COSINE_TOLERANCE = 1e-4;
const SPACING_TOLERANCE_MM = 0.01;

/**
 * Reads a CT series into one Int16 volume of HU: slices sorted along the slice normal (never by file
 * name or instance number), orientation, size and spacing the same for all, gaps and tilts refused
 * naming the slices, rescale applied. Files that are not CT images are issues.
 */
export function readCtSeries(files: readonly string[]): Result<CtVolume> {
  const issues: Issue[] = [];
  const slices: Slice[] = [];
  let ref: { iop: number[]; rows: number; columns: number; spacing: number[]; frame: string; series: string } | undefined;
  for (const file of files) {
    let bytes: Buffer;
    try {
      bytes = readFileSync(file);
    } catch (e) {
      issues.push({ severity: 'error', code: 'unreadable', file, message: `cannot read the file (${(e as NodeJS.ErrnoException).code ?? String(e)})` });
      continue;
    }
    const parsed = parseDicomBytes(bytes, file);
    if (!parsed.ok) {
      issues.push(...parsed.issues);
      continue;
    }
    const ds = parsed.value.dataSet;
    const r = new ItemReader(ds, { file, path: '' }, issues, 'latin1');
    const sop = r.string('SOPClassUID');
    if (sop !== CT_IMAGE_STORAGE) {
      issues.push({ severity: 'error', code: 'invalid-value', file, path: 'SOPClassUID', message: 'not a CT image', expected: `CT Image Storage (${CT_IMAGE_STORAGE})`, found: sop ?? 'none' });
      continue;
    }
    const ipp = need(r, 'ImagePositionPatient', r.tuple('ImagePositionPatient', 3), 'the position of the first voxel (mm)');
    const iop = need(r, 'ImageOrientationPatient', r.tuple('ImageOrientationPatient', 6), 'the row and column direction cosines');
    const spacing = need(r, 'PixelSpacing', r.tuple('PixelSpacing', 2), 'the row and column spacing (mm)');
    const rows = need(r, 'Rows', r.integer('Rows'), 'the number of rows');
    const columns = need(r, 'Columns', r.integer('Columns'), 'the number of columns');
    const frame = need(r, 'FrameOfReferenceUID', r.string('FrameOfReferenceUID'), 'the frame of reference UID');
    const series = r.string('SeriesInstanceUID') ?? '';
    const bits = r.integer('BitsAllocated');
    const signed = r.integer('PixelRepresentation') === 1;
    const slope = r.number('RescaleSlope') ?? 1;
    const intercept = r.number('RescaleIntercept') ?? 0;
    const el = ds.elements.x7fe00010;
    if (!ipp || !iop || !spacing || rows === undefined || columns === undefined || !frame) continue;
    if (!el || el.encapsulatedPixelData) {
      issues.push({ severity: 'error', code: el ? 'unsupported-transfer-syntax' : 'missing-attribute', file, path: 'PixelData',
        message: el ? 'the pixel data are compressed; only uncompressed CT is read' : 'the image has no pixel data' });
      continue;
    }
    if (bits !== 16 || r.integer('SamplesPerPixel') !== 1) {
      issues.push({ severity: 'error', code: 'invalid-value', file, path: 'BitsAllocated', message: 'only 16-bit greyscale CT is read', expected: '16 bits, 1 sample', found: `${bits} bits` });
      continue;
    }
    if (el.length !== rows * columns * 2) {
      issues.push({ severity: 'error', code: 'inconsistent', file, path: 'PixelData', message: 'the pixel data do not match Rows × Columns', expected: `${rows * columns * 2} bytes`, found: `${el.length}` });
      continue;
    }
    if (!ref) ref = { iop, rows, columns, spacing, frame, series };
    else {
      const mismatch = iop.some((v, i) => Math.abs(v - ref!.iop[i]!) > COSINE_TOLERANCE) ? 'orientation'
        : rows !== ref.rows || columns !== ref.columns ? 'size'
        : spacing.some((v, i) => Math.abs(v - ref!.spacing[i]!) > SPACING_TOLERANCE_MM) ? 'pixel spacing'
        : frame !== ref.frame ? 'frame of reference' : series !== ref.series ? 'series' : undefined;
      if (mismatch) {
        issues.push({ severity: 'error', code: 'inconsistent', file, message: `the slice's ${mismatch} differs from the first slice's (${files[0]})` });
        continue;
      }
    }
    // Pixel values with the rescale applied, as HU in Int16 (rounded when the slope is not 1).
    const bigEndian = parsed.value.transferSyntaxUid === EXPLICIT_VR_BE;
    const view = new DataView(ds.byteArray.buffer, ds.byteArray.byteOffset + el.dataOffset, el.length);
    const hu = new Int16Array(rows * columns);
    for (let k = 0; k < hu.length; k++) {
      const raw = signed ? view.getInt16(2 * k, !bigEndian) : view.getUint16(2 * k, !bigEndian);
      hu[k] = Math.max(-32768, Math.min(32767, Math.round(raw * slope + intercept)));
    }
    const normal = cross(iop.slice(0, 3) as [number, number, number], iop.slice(3) as [number, number, number]);
    slices.push({ file, position: ipp as [number, number, number], distanceMm: dot(ipp as [number, number, number], normal), hu });
  }
  if (issues.some((i) => i.severity === 'error')) return { ok: false, issues };
  if (!ref || slices.length === 0) return { ok: false, issues: [{ severity: 'error', code: 'missing-attribute', message: 'no CT slices were given' }] };
  slices.sort((a, b) => a.distanceMm - b.distanceMm);
  const rowDir = ref.iop.slice(0, 3) as [number, number, number];
  const colDir = ref.iop.slice(3) as [number, number, number];
  const normal = cross(rowDir, colDir);
  const first = slices[0]!;
  const gap = slices.length > 1 ? slices[1]!.distanceMm - first.distanceMm : 1;
  for (let k = 1; k < slices.length; k++) {
    const a = slices[k - 1]!;
    const b = slices[k]!;
    const step = b.distanceMm - a.distanceMm;
    if (step < SPACING_TOLERANCE_MM) {
      issues.push({ severity: 'error', code: 'duplicate', file: b.file, message: `two slices at the same position (${a.file} and ${b.file})` });
    } else if (Math.abs(step - gap) > Math.max(SPACING_TOLERANCE_MM, 0.01 * gap)) {
      issues.push({ severity: 'error', code: 'inconsistent', file: b.file, message: `the slices are not evenly spaced: ${step.toFixed(3)} mm between ${a.file} and ${b.file}, ${gap.toFixed(3)} mm elsewhere (a missing slice?)` });
    }
    // A tilted (gantry-tilt) series: successive positions not along the normal.
    const d = [b.position[0] - a.position[0], b.position[1] - a.position[1], b.position[2] - a.position[2]];
    const along = dot(d as [number, number, number], normal);
    const off = Math.hypot(d[0]! - along * normal[0], d[1]! - along * normal[1], d[2]! - along * normal[2]);
    if (off > SPACING_TOLERANCE_MM * 10) {
      issues.push({ severity: 'error', code: 'inconsistent', file: b.file, message: `the slices are tilted: ${b.file} is offset ${off.toFixed(2)} mm across the slice normal from ${a.file}` });
    }
  }
  if (issues.some((i) => i.severity === 'error')) return { ok: false, issues };
  const n = ref.rows * ref.columns;
  const hu = new Int16Array(n * slices.length);
  slices.forEach((s, k) => hu.set(s.hu, k * n));
  return {
    ok: true,
    value: {
      frameOfReferenceUid: ref.frame, seriesInstanceUid: ref.series, columns: ref.columns, rows: ref.rows, slices: slices.length,
      originMm: first.position, rowDirection: rowDir, columnDirection: colDir, normal,
      columnSpacingMm: ref.spacing[1]!, rowSpacingMm: ref.spacing[0]!, sliceSpacingMm: gap, hu,
    },
    warnings: issues,
  };
}

function cross(a: readonly [number, number, number], b: readonly [number, number, number]): [number, number, number] {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}
function dot(a: readonly [number, number, number], b: readonly [number, number, number]): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}

/**
 * Every CT series among the files (a folder exported with plans of several patients), one volume
 * each; other objects are skipped. A broken series is an issue, not a reason to drop the others.
 */
export function readCtVolumes(files: readonly string[]): { volumes: CtVolume[]; issues: Issue[] } {
  const bySeries = new Map<string, string[]>();
  const issues: Issue[] = [];
  for (const file of files) {
    let bytes: Buffer;
    try {
      bytes = readFileSync(file);
    } catch {
      continue;
    }
    const parsed = parseDicomBytes(bytes, file);
    if (!parsed.ok) continue;
    const ds = parsed.value.dataSet;
    if (ds.string('x00080016') !== CT_IMAGE_STORAGE) continue;
    const series = ds.string('x0020000e') ?? '';
    bySeries.set(series, [...(bySeries.get(series) ?? []), file]);
  }
  const volumes: CtVolume[] = [];
  for (const group of bySeries.values()) {
    const r = readCtSeries(group);
    if (r.ok) volumes.push(r.value);
    else issues.push(...r.issues);
  }
  return { volumes, issues };
}
