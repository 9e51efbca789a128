/**
 * A CT series read into one volume of HU: slices sorted along the slice normal whatever the file
 * order, the geometry of PS3.3 C.7.6.2.1.1, and a series with a gap, a duplicate or another object
 * refused naming the files. pydicom's CT_small.dcm is read in tests/reference/ct-small.test.ts.
 */
import { copyFileSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeCtPhantom } from '../../scripts/fixtures/ct-phantom.js';
import { readCtSeries, readCtVolumes } from '../../src/dicom/ct-series.js';
import { demoPlan } from '../helpers/fixtures.js';

/** HU = x + 10·y + 100·z at each voxel centre (mm), so every voxel says where it is. */
const hu = (x: number, y: number, z: number) => Math.round(x + 10 * y + 100 * z);
const series = (name: string, slices = 5) => {
  const dir = mkdtempSync(join(tmpdir(), `plumbline-ct-${name}-`));
  const files = writeCtPhantom(dir, {
    name,
    columns: 4,
    rows: 3,
    slices,
    spacingMm: [1, 2, 3],
    originMm: [-2, -1, -6],
    frameOfReferenceUid: '1.2.3.9',
    hu,
  });
  return { dir, files };
};

describe('readCtSeries', () => {
  it('sorts the slices along the normal and places each voxel where its HU says (x fastest, then y, then z)', () => {
    const { files } = series('ok');
    const r = readCtSeries(files);
    if (!r.ok) throw new Error(r.issues[0]!.message);
    const v = r.value;
    expect([v.columns, v.rows, v.slices, v.columnSpacingMm, v.rowSpacingMm, v.sliceSpacingMm]).toEqual([4, 3, 5, 1, 2, 3]);
    expect(v.originMm).toEqual([-2, -1, -6]);
    for (const [i, j, k] of [
      [0, 0, 0],
      [3, 2, 4],
      [1, 2, 3],
    ] as const)
      expect(v.hu[(k * v.rows + j) * v.columns + i]).toBe(hu(-2 + i, -1 + 2 * j, -6 + 3 * k));
  });
  it('refuses a series with a slice missing, naming the slices around the gap', () => {
    const { files } = series('gap');
    rmSync(files.find((f) => f.includes('0002'))!);
    const r = readCtSeries(files.filter((f) => !f.includes('0002')));
    expect(!r.ok && r.issues[0]!.message).toMatch(/not evenly spaced: 6\.000 mm between .* 3\.000 mm elsewhere \(a missing slice\?\)/);
  });
  it('refuses two slices at one position', () => {
    const { dir, files } = series('dup', 3);
    const copy = join(dir, 'copy.dcm');
    copyFileSync(files[0]!, copy);
    const r = readCtSeries([...files, copy]);
    expect(!r.ok && r.issues[0]!.code).toBe('duplicate');
  });
  it('refuses a plan among the slices as "not a CT image"', () => {
    const r = readCtSeries([...series('plan', 2).files, demoPlan('four-field-box.dcm')]);
    expect(!r.ok && r.issues[0]).toMatchObject({ code: 'invalid-value', path: 'SOPClassUID', message: 'not a CT image' });
  });
  it('refuses no slices at all', () => expect(readCtSeries([]).ok).toBe(false));
});

describe('readCtVolumes', () => {
  it('one volume per series; other objects skipped', () => {
    const a = series('a', 2).files;
    const b = series('b', 3).files;
    const r = readCtVolumes([...a, demoPlan('four-field-box.dcm'), ...b]);
    expect(r.issues).toEqual([]);
    expect(r.volumes.map((v) => v.slices).sort()).toEqual([2, 3]);
  });
});

describe('a folder of several series', () => {
  it('skips other objects but refuses a damaged slice instead of dropping it', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-ct-damaged-'));
    const files = writeCtPhantom(dir, {
      name: 'dmg',
      columns: 8,
      rows: 8,
      slices: 4,
      spacingMm: [4, 4, 4],
      originMm: [0, 0, 0],
      frameOfReferenceUid: '1.2.3',
      hu: () => 0,
    });
    writeFileSync(join(dir, 'notes.txt'), 'not DICOM');
    expect(readCtVolumes([...files, join(dir, 'notes.txt')]).volumes).toHaveLength(1);
    writeFileSync(files[2]!, readFileSync(files[2]!).subarray(0, 400));
    const r = readCtVolumes(files);
    expect(r.volumes).toHaveLength(0);
    expect(r.issues[0]!.file).toBe(files[2]);
  });
});
