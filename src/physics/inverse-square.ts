/** Inverse square law: the factor (reference distance / distance)², distances from the source. */
export function inverseSquareFactor(referenceDistanceCm: number, distanceCm: number): number {
  const r = referenceDistanceCm / distanceCm;
  return r * r;
}

/** A field side at one distance from the source, projected (by similar triangles) to another. */
export function projectFieldCm(sideCm: number, fromDistanceCm: number, toDistanceCm: number): number {
  return (sideCm * toDistanceCm) / fromDistanceCm;
}
