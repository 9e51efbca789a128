/** One ring of a Clarkson sector. */
export interface Ring {
  /** Outer radius of the ring from the point, mm at the isocenter plane. */
  readonly outerMm: number;
  /** 1 where open, the leaves' or the block's transmission where they block, 0 beyond the jaws. */
  readonly weight: number;
}

/**
 * The rings of n sectors in three flat arrays: sector i's rings are entries start[i] to
 * start[i + 1] − 1 of `outerMm` and `weight`, outward from the point. An arc has thousands of
 * segments × 72 sectors: one object per ring made most of its check's garbage.
 */
export interface PackedRings {
  readonly start: readonly number[];
  readonly outerMm: readonly number[];
  readonly weight: readonly number[];
}

/** Lengths below this are no ring (and rings closer than it are one). */
export const RING_EPS_MM = 1e-9;

/**
 * Builds PackedRings sector by sector in buffers it keeps for the next use; `finish` copies out
 * (into plain arrays: a small typed array costs several times more to allocate).
 * A ring of the same weight as the sector's last one extends it; one shorter than RING_EPS_MM is dropped.
 */
export class RingWriter {
  private outer = new Float64Array(1024);
  private weights = new Float64Array(1024);
  private starts = new Int32Array(129);
  private count = 0;
  private sectors = 0;
  private sectorStart = 0;

  begin(sectors: number): void {
    if (this.starts.length < sectors + 1) this.starts = new Int32Array(sectors + 1);
    this.count = 0;
    this.sectors = 0;
    this.sectorStart = 0;
    this.starts[0] = 0;
  }

  /** Adds a ring of the current sector out to `outerMm`. */
  push(outerMm: number, weight: number): void {
    const has = this.count > this.sectorStart;
    const lastOuter = has ? this.outer[this.count - 1]! : 0;
    if (outerMm - lastOuter < RING_EPS_MM) return;
    if (has && this.weights[this.count - 1] === weight) {
      this.outer[this.count - 1] = outerMm;
      return;
    }
    if (this.count === this.outer.length) {
      const o = new Float64Array(2 * this.count);
      o.set(this.outer);
      this.outer = o;
      const w = new Float64Array(2 * this.count);
      w.set(this.weights);
      this.weights = w;
    }
    this.outer[this.count] = outerMm;
    this.weights[this.count] = weight;
    this.count++;
  }

  /** Closes the current sector; the next push starts the next one. */
  endSector(): void {
    this.starts[++this.sectors] = this.count;
    this.sectorStart = this.count;
  }

  finish(): PackedRings {
    return { start: copy(this.starts, this.sectors + 1), outerMm: copy(this.outer, this.count), weight: copy(this.weights, this.count) };
  }
}

function copy(from: Float64Array | Int32Array, n: number): number[] {
  const out = new Array<number>(n);
  for (let i = 0; i < n; i++) out[i] = from[i]!;
  return out;
}

/** The rings of each sector as objects (for tests and reports). */
export function ringsOf(p: PackedRings): Ring[][] {
  const out: Ring[][] = [];
  for (let i = 0; i + 1 < p.start.length; i++) {
    const rings: Ring[] = [];
    for (let k = p.start[i]!; k < p.start[i + 1]!; k++) rings.push({ outerMm: p.outerMm[k]!, weight: p.weight[k]! });
    out.push(rings);
  }
  return out;
}
