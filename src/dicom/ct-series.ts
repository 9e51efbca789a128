import { readFileSync } from 'node:fs';
import type { CtVolume, Issue, Result } from '../model/index.js';
import { ItemReader, need } from './item-reader.js';
import { parseDicomBytes } from './parse-bytes.js';
import { headScratch, parseHead } from './read-head.js';
import { addInPlace, allocateInt16 } from './int16-volume.js';
import { DEFLATED_EXPLICIT_VR_LE, EXPLICIT_VR_BE } from './transfer-syntax.js';
import { readRanges, startReadHelper, stopReadHelper, type ReadHelper } from './parallel-read.js';

export const CT_IMAGE_STORAGE = '1.2.840.10008.5.1.4.1.1.2';

const PIXEL_DATA = 'x7fe00010';
/** Geometry tolerance between slices: direction cosines, spacing, and gap regularity. */
const COSINE_TOLERANCE = 1e-4;
const SPACING_TOLERANCE_MM = 0.01;
/** From this many files a second thread helps read the pixels (its start-up costs a few ms of the other core). */
const HELPER_FROM_FILES = 16;

/** What the first pass learns of a slice: its geometry and where its pixels are, not the pixels. */
interface SliceHeader {
  readonly file: string;
  readonly series: string;
  readonly frame: string;
  readonly position: [number, number, number];
  readonly iop: number[];
  readonly spacing: number[];
  readonly rows: number;
  readonly columns: number;
  readonly signed: boolean;
  /** Bits Stored (≤ 16): bounds the stored values, so whether the rescale can overflow Int16. */
  readonly bitsStored: number;
  readonly slope: number;
  readonly intercept: number;
  readonly bigEndian: boolean;
  readonly pixelOffset: number;
  /** Deflated files only: the inflated pixel bytes (their offset in the file is meaningless). */
  readonly pixels?: Uint8Array;
}

/**
 * Reads a CT series into one Int16 volume of HU: slices sorted along the slice normal (never by file
 * name or instance number), orientation, size and spacing the same for all, gaps and tilts refused
 * naming the slices, rescale applied. Two passes: the headers first (parsing stops at the pixel
 * data), then each slice's pixels straight into the volume (by two threads, see parallel-read.ts),
 * so memory stays near one volume.
 */
export function readCtSeries(files: readonly string[]): Result<CtVolume> {
  const helper = files.length >= HELPER_FROM_FILES ? startReadHelper() : undefined;
  try {
    const issues: Issue[] = [];
    const headers: SliceHeader[] = [];
    const scratch = headScratch();
    for (const file of files) {
      const h = readHeader(file, issues, scratch);
      if (h && 'otherSopClassUid' in h) {
        issues.push({
          severity: 'error',
          code: 'invalid-value',
          file,
          path: 'SOPClassUID',
          message: 'not a CT image',
          expected: `CT Image Storage (${CT_IMAGE_STORAGE})`,
          found: h.otherSopClassUid ?? 'none',
        });
      } else if (h) headers.push(h);
    }
    if (issues.some((i) => i.severity === 'error')) return { ok: false, issues };
    return assemble(headers, helper);
  } finally {
    stopReadHelper(helper);
  }
}

/**
 * Every CT series among the files (a folder exported with plans of several patients), one volume
 * each; other objects are skipped. A broken series is an issue, not a reason to drop the others.
 */
export function readCtVolumes(files: readonly string[]): { volumes: CtVolume[]; issues: Issue[] } {
  const helper = files.length >= HELPER_FROM_FILES ? startReadHelper() : undefined;
  try {
    const bySeries = new Map<string, SliceHeader[]>();
    const issues: Issue[] = [];
    const scratch = headScratch();
    for (const file of files) {
      // Files that are not DICOM, or DICOM objects other than CT images, are simply not slices.
      const found: Issue[] = [];
      const h = readHeader(file, found, scratch);
      if (!h) {
        if (!found.every((i) => i.code === 'not-dicom' || i.code === 'not-rt-plan')) issues.push(...found);
        continue;
      }
      if ('otherSopClassUid' in h) continue;
      const group = bySeries.get(h.series);
      if (group) group.push(h);
      else bySeries.set(h.series, [h]);
    }
    const volumes: CtVolume[] = [];
    for (const group of bySeries.values()) {
      const r = assemble(group, helper);
      if (r.ok) volumes.push(r.value);
      else issues.push(...r.issues);
    }
    return { volumes, issues };
  } finally {
    stopReadHelper(helper);
  }
}

/** A CT slice's header; `{ otherSopClassUid }` for another DICOM object; undefined (with issues) for a broken file. */
function readHeader(file: string, issues: Issue[], scratch: Buffer): SliceHeader | { readonly otherSopClassUid: string | undefined } | undefined {
  const head = parseHead(file, scratch);
  if (!head.ok) {
    issues.push(...head.issues);
    return undefined;
  }
  const { parsed, size } = head.value;
  const ds = parsed.dataSet;
  const r = new ItemReader(ds, { file, path: '' }, issues, 'latin1');
  const sopClassUid = r.string('SOPClassUID');
  if (sopClassUid !== CT_IMAGE_STORAGE) return { otherSopClassUid: sopClassUid };
  const ipp = need(r, 'ImagePositionPatient', r.tuple('ImagePositionPatient', 3), 'the position of the first voxel (mm)');
  const iop = need(r, 'ImageOrientationPatient', r.tuple('ImageOrientationPatient', 6), 'the row and column direction cosines');
  const spacing = need(r, 'PixelSpacing', r.tuple('PixelSpacing', 2), 'the row and column spacing (mm)');
  const rows = need(r, 'Rows', r.integer('Rows'), 'the number of rows');
  const columns = need(r, 'Columns', r.integer('Columns'), 'the number of columns');
  const frame = need(r, 'FrameOfReferenceUID', r.string('FrameOfReferenceUID'), 'the frame of reference UID');
  const bits = r.integer('BitsAllocated');
  const el = ds.elements[PIXEL_DATA];
  if (!ipp || !iop || !spacing || rows === undefined || columns === undefined || !frame) return undefined;
  if (!el) {
    issues.push({ severity: 'error', code: 'missing-attribute', file, path: 'PixelData', message: 'the image has no pixel data' });
    return undefined;
  }
  if (el.length === 0xffffffff) {
    issues.push({
      severity: 'error',
      code: 'unsupported-transfer-syntax',
      file,
      path: 'PixelData',
      message: 'the pixel data are compressed; only uncompressed CT is read',
    });
    return undefined;
  }
  if (bits !== 16 || r.integer('SamplesPerPixel') !== 1) {
    issues.push({
      severity: 'error',
      code: 'invalid-value',
      file,
      path: 'BitsAllocated',
      message: 'only 16-bit greyscale CT is read',
      expected: '16 bits, 1 sample',
      found: `${bits} bits`,
    });
    return undefined;
  }
  const deflatedFile = parsed.transferSyntaxUid === DEFLATED_EXPLICIT_VR_LE;
  if (el.length !== rows * columns * 2 || el.dataOffset + el.length > (deflatedFile ? ds.byteArray.length : size)) {
    issues.push({
      severity: 'error',
      code: 'inconsistent',
      file,
      path: 'PixelData',
      message: 'the pixel data do not match Rows × Columns or run past the end of the file',
      expected: `${rows * columns * 2} bytes`,
      found: `${el.length}`,
    });
    return undefined;
  }
  // A deflated file's offsets are in the inflated bytes: keep its pixels (inflate the whole file once).
  const deflatedPixels = deflatedFile ? inflatedPixels(file, el.length) : undefined;
  return {
    file,
    series: r.string('SeriesInstanceUID') ?? '',
    frame,
    position: ipp as [number, number, number],
    iop,
    spacing,
    rows,
    columns,
    signed: r.integer('PixelRepresentation') === 1,
    bitsStored: Math.min(16, Math.max(1, r.integer('BitsStored') ?? 16)),
    slope: r.number('RescaleSlope') ?? 1,
    intercept: r.number('RescaleIntercept') ?? 0,
    bigEndian: parsed.transferSyntaxUid === EXPLICIT_VR_BE,
    pixelOffset: el.dataOffset,
    ...(deflatedPixels ? { pixels: deflatedPixels } : {}),
  };
}

function assemble(headers: readonly SliceHeader[], helper: ReadHelper | undefined): Result<CtVolume> {
  const issues: Issue[] = [];
  if (headers.length === 0) return { ok: false, issues: [{ severity: 'error', code: 'missing-attribute', message: 'no CT slices were given' }] };
  const ref = headers[0]!;
  for (const h of headers.slice(1)) {
    const mismatch = h.iop.some((v, i) => Math.abs(v - ref.iop[i]!) > COSINE_TOLERANCE)
      ? 'orientation'
      : h.rows !== ref.rows || h.columns !== ref.columns
        ? 'size'
        : h.spacing.some((v, i) => Math.abs(v - ref.spacing[i]!) > SPACING_TOLERANCE_MM)
          ? 'pixel spacing'
          : h.frame !== ref.frame
            ? 'frame of reference'
            : h.series !== ref.series
              ? 'series'
              : undefined;
    if (mismatch)
      issues.push({
        severity: 'error',
        code: 'inconsistent',
        file: h.file,
        message: `the slice's ${mismatch} differs from the first slice's (${ref.file})`,
      });
  }
  if (issues.length) return { ok: false, issues };
  const rowDir = ref.iop.slice(0, 3) as [number, number, number];
  const colDir = ref.iop.slice(3) as [number, number, number];
  const normal = cross(rowDir, colDir);
  const sorted = [...headers].sort((a, b) => dot(a.position, normal) - dot(b.position, normal));
  const gap = sorted.length > 1 ? dot(sorted[1]!.position, normal) - dot(sorted[0]!.position, normal) : 1;
  for (let k = 1; k < sorted.length; k++) {
    const a = sorted[k - 1]!;
    const b = sorted[k]!;
    const step = dot(b.position, normal) - dot(a.position, normal);
    if (step < SPACING_TOLERANCE_MM) {
      issues.push({ severity: 'error', code: 'duplicate', file: b.file, message: `two slices at the same position (${a.file} and ${b.file})` });
    } else if (Math.abs(step - gap) > Math.max(SPACING_TOLERANCE_MM, 0.01 * gap)) {
      issues.push({
        severity: 'error',
        code: 'inconsistent',
        file: b.file,
        message: `the slices are not evenly spaced: ${step.toFixed(3)} mm between ${a.file} and ${b.file}, ${gap.toFixed(3)} mm elsewhere (a missing slice?)`,
      });
    }
    // A tilted (gantry-tilt) series: successive positions not along the normal.
    const d = [b.position[0] - a.position[0], b.position[1] - a.position[1], b.position[2] - a.position[2]] as [number, number, number];
    const along = dot(d, normal);
    const off = Math.hypot(d[0] - along * normal[0], d[1] - along * normal[1], d[2] - along * normal[2]);
    if (off > SPACING_TOLERANCE_MM * 10) {
      issues.push({
        severity: 'error',
        code: 'inconsistent',
        file: b.file,
        message: `the slices are tilted: ${b.file} is offset ${off.toFixed(2)} mm across the slice normal from ${a.file}`,
      });
    }
  }
  if (issues.length) return { ok: false, issues };
  const n = ref.rows * ref.columns;
  const hu = allocateInt16(n * sorted.length);
  // The common case (little endian, slope 1, integer intercept): the stored values are read straight
  // into the volume, by two threads, then rescaled in place; the other slices one by one.
  const direct = (h: SliceHeader) => !h.pixels && !h.bigEndian && h.slope === 1 && Number.isInteger(h.intercept);
  const volumeBytes = new Uint8Array(hu.buffer, hu.byteOffset, hu.byteLength);
  try {
    const directSlices = sorted.flatMap((h, k) => (direct(h) ? [k] : []));
    readRanges(
      volumeBytes,
      directSlices.map((k) => ({ file: sorted[k]!.file, position: sorted[k]!.pixelOffset, at: 2 * k * n, length: 2 * n })),
      helper,
      (j) => {
        const k = directSlices[j]!;
        const h = sorted[k]!;
        rescaleInPlace(hu.subarray(k * n, (k + 1) * n), h.signed, h.bitsStored, h.intercept);
      },
    );
    for (let k = 0; k < sorted.length; k++) {
      const h = sorted[k]!;
      const slice = hu.subarray(k * n, (k + 1) * n);
      if (direct(h)) continue;
      if (h.pixels) toHu(h.pixels, h, slice);
      else {
        const raw = new Uint8Array(2 * n);
        readRanges(raw, [{ file: h.file, position: h.pixelOffset, at: 0, length: 2 * n }], undefined);
        toHu(raw, h, slice);
      }
    }
  } catch (e) {
    const err = e as NodeJS.ErrnoException & { file?: string };
    return {
      ok: false,
      issues: [
        {
          severity: 'error',
          code: 'unreadable',
          ...(err.file ? { file: err.file } : {}),
          message: `cannot read the pixel data (${err.code ?? String(e)})`,
        },
      ],
    };
  }
  return {
    ok: true,
    value: {
      frameOfReferenceUid: ref.frame,
      seriesInstanceUid: ref.series,
      columns: ref.columns,
      rows: ref.rows,
      slices: sorted.length,
      originMm: sorted[0]!.position,
      rowDirection: rowDir,
      columnDirection: colDir,
      normal,
      columnSpacingMm: ref.spacing[1]!,
      rowSpacingMm: ref.spacing[0]!,
      sliceSpacingMm: gap,
      hu,
    },
    warnings: [],
  };
}

/** Little-endian stored values already in place: reinterpret (unsigned when so stored) and add the intercept. */
function rescaleInPlace(slice: Int16Array, signed: boolean, bitsStored: number, intercept: number): void {
  const min = signed ? -(2 ** (bitsStored - 1)) : 0;
  const max = signed ? 2 ** (bitsStored - 1) - 1 : 2 ** bitsStored - 1;
  // Bits Stored bounds the stored values: when no result can leave Int16, the 16-bit wrap-around
  // addition is exact whatever the stored values' sign (the bits above Bits Stored must be clear).
  if (min + intercept >= -32768 && max + intercept <= 32767) {
    addInPlace(slice, intercept);
    return;
  }
  const stored = signed ? slice : new Uint16Array(slice.buffer, slice.byteOffset, slice.length);
  for (let i = 0; i < slice.length; i++) {
    const v = stored[i]! + intercept;
    slice[i] = v < -32768 ? -32768 : v > 32767 ? 32767 : v;
  }
}

function inflatedPixels(file: string, length: number): Uint8Array | undefined {
  const parsed = parseDicomBytes(readFileSync(file), file);
  if (!parsed.ok) return undefined;
  const el = parsed.value.dataSet.elements[PIXEL_DATA];
  return el ? parsed.value.dataSet.byteArray.slice(el.dataOffset, el.dataOffset + length) : undefined;
}

/** Stored values to HU with the rescale (any byte order or slope), clamped to Int16. */
function toHu(bytes: Uint8Array, h: SliceHeader, out: Int16Array): void {
  const n = out.length;
  const view = new DataView(bytes.buffer, bytes.byteOffset, 2 * n);
  for (let i = 0; i < n; i++) {
    const raw = h.signed ? view.getInt16(2 * i, !h.bigEndian) : view.getUint16(2 * i, !h.bigEndian);
    out[i] = Math.max(-32768, Math.min(32767, Math.round(raw * h.slope + h.intercept)));
  }
}

function cross(a: readonly [number, number, number], b: readonly [number, number, number]): [number, number, number] {
  return [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
}
function dot(a: readonly [number, number, number], b: readonly [number, number, number]): number {
  return a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
}
