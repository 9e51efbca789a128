import type { CtVolume, Structure } from '../model/index.js';

/**
 * The body as a voxel mask from the EXTERNAL structure: a voxel is inside when its centre lies
 * inside a closed planar contour on its slice (even-odd rule, so holes drawn as inner contours stay
 * out). Contours lie on slice planes; each is given to the nearest slice within half a slice spacing.
 */
export function bodyMask(volume: CtVolume, external: Structure): Uint8Array {
  const { columns: nx, rows: ny, slices: nz } = volume;
  const mask = new Uint8Array(nx * ny * nz);
  const originAlongNormal = dot(volume.originMm, volume.normal);
  for (const c of external.contours) {
    if (c.geometricType !== 'CLOSED_PLANAR' || c.pointsMm.length < 3) continue;
    const along = dot(c.pointsMm[0]!, volume.normal) - originAlongNormal;
    const k = Math.round(along / volume.sliceSpacingMm);
    if (k < 0 || k >= nz || Math.abs(along - k * volume.sliceSpacingMm) > volume.sliceSpacingMm / 2) continue;
    // The contour in voxel index coordinates of its slice (i along rows, j down columns).
    const poly = c.pointsMm.map((p) => {
      const d = [p[0] - volume.originMm[0], p[1] - volume.originMm[1], p[2] - volume.originMm[2]] as const;
      return [dot(d, volume.rowDirection) / volume.columnSpacingMm, dot(d, volume.columnDirection) / volume.rowSpacingMm] as const;
    });
    for (let j = 0; j < ny; j++) {
      // Crossings of the row's centre line with the polygon's edges, sorted: inside between pairs.
      const xs: number[] = [];
      for (let e = 0; e < poly.length; e++) {
        const [ax, ay] = poly[e]!;
        const [bx, by] = poly[(e + 1) % poly.length]!;
        if ((ay <= j && by > j) || (by <= j && ay > j)) xs.push(ax + ((j - ay) / (by - ay)) * (bx - ax));
      }
      xs.sort((a, b) => a - b);
      for (let q = 0; q + 1 < xs.length; q += 2) {
        for (let i = Math.max(0, Math.ceil(xs[q]!)); i <= Math.min(nx - 1, Math.floor(xs[q + 1]!)); i++) {
          const idx = i + nx * (j + ny * k);
          mask[idx] = mask[idx]! ^ 1;
        }
      }
    }
  }
  return mask;
}

function dot(a: readonly number[], b: readonly number[]): number {
  return a[0]! * b[0]! + a[1]! * b[1]! + a[2]! * b[2]!;
}
