/** Seeded CT noise of ±15 HU at a voxel position (a hash of the position through a linear congruential step): the same every run. */
export function ctNoiseHu(x: number, y: number, z: number): number {
  let h = (Math.imul(Math.round(x) + 1000, 73856093) ^ Math.imul(Math.round(y) + 1000, 19349663) ^ Math.imul(Math.round(z) + 1000, 83492791)) >>> 0;
  h = (Math.imul(h, 1664525) + 1013904223) >>> 0;
  return (h / 2 ** 32) * 30 - 15;
}
