/**
 * A CT series as one volume: HU in an Int16Array, x (column) fastest, then y (row), then z (slice,
 * sorted along the slice normal). Patient coordinates (LPS, mm) of voxel (i, j, k):
 *   P = origin + rowDirection·columnSpacing·i + columnDirection·rowSpacing·j + normal·sliceSpacing·k
 * (PS3.3 C.7.6.2.1.1; PixelSpacing lists the row spacing first).
 */
export interface ImageGrid {
  readonly columns: number;
  readonly rows: number;
  /** Image Position (Patient) of the first slice or frame: the centre of its first voxel. */
  readonly originMm: readonly [number, number, number];
  /** Direction of increasing column index (along a row). */
  readonly rowDirection: readonly [number, number, number];
  /** Direction of increasing row index (down a column). */
  readonly columnDirection: readonly [number, number, number];
  /** rowDirection × columnDirection: the direction of increasing slice (frame) index. */
  readonly normal: readonly [number, number, number];
  readonly columnSpacingMm: number;
  readonly rowSpacingMm: number;
}

export interface CtVolume extends ImageGrid {
  readonly frameOfReferenceUid: string;
  readonly seriesInstanceUid: string;
  readonly slices: number;
  readonly sliceSpacingMm: number;
  readonly hu: Int16Array;
}
