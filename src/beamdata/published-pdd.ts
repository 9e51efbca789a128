import type { LookupLog, PhotonBeamModel } from '../model/index.js';

/**
 * Central-axis PDD of a 10 × 10 field at SSD 100 cm from BJR Supplement 25 (1996), Tables
 * 5.2.1–5.5.1, as read from a secondary copy (the supplement itself was not at hand): the
 * values a beam of that quality should show. Only 10 and 20 cm were read; 5 cm is not compared.
 */
const BJR25_10X10: readonly { readonly mv: number; readonly pdd10: number; readonly pdd20: number }[] = [
  { mv: 4, pdd10: 63.0, pdd20: 34.1 },
  { mv: 5, pdd10: 65.0, pdd20: 36.2 },
  { mv: 6, pdd10: 67.5, pdd20: 39.3 },
  { mv: 8, pdd10: 71.0, pdd20: 43.4 },
];

/** TPR20,10 from the PDD ratio at SSD 100 cm, 10 × 10 (the relation of IAEA TRS-398). */
export const tpr2010FromPdd = (pdd10: number, pdd20: number): number => (1.2661 * pdd20) / pdd10 - 0.0595;

/** Beyond this (percent of the published value) a difference is worth a look (common practice, no source). */
export const PUBLISHED_TOLERANCE_PERCENT = 2;

export interface PublishedComparison {
  readonly beamId: string;
  /** Why no comparison was made, when none was. */
  readonly notCompared?: string;
  readonly tpr2010?: number;
  readonly rows: readonly {
    readonly depthCm: number;
    readonly clinicPercent: number;
    readonly publishedPercent: number;
    readonly differencePercent: number;
  }[];
}

/**
 * The clinic's 10 × 10 PDD at SSD 100 against the published data of the same beam quality
 * (interpolated linearly in TPR20,10 between the published energies). A beam measured at another
 * SSD, without a PDD, or of a quality outside the published range is not compared, and says why.
 */
export function comparePublishedPdd(beam: PhotonBeamModel): PublishedComparison {
  const none = (why: string): PublishedComparison => ({ beamId: beam.id, notCompared: why, rows: [] });
  if (!beam.pdd) return none('no PDD table');
  if (beam.fff) return none('a flattening-filter-free beam: the published data are of flattened beams');
  if (Math.abs(beam.pdd.ssdCm - 100) > 1e-9) return none(`its PDD was measured at SSD ${beam.pdd.ssdCm} cm, the published data at 100 cm`);
  const log: LookupLog = [];
  const pdd10 = beam.pdd.at(10, 10, log);
  const pdd20 = beam.pdd.at(20, 10, log);
  if (!Number.isFinite(pdd10) || !Number.isFinite(pdd20) || log.some((n) => n.kind === 'clamped'))
    return none('its PDD table does not reach 20 cm for a 10 × 10 field');
  const tpr = tpr2010FromPdd(pdd10, pdd20);
  const published = BJR25_10X10.map((p) => ({ ...p, tpr: tpr2010FromPdd(p.pdd10, p.pdd20) }));
  const k = published.findIndex((p, i) => i < published.length - 1 && tpr >= p.tpr && tpr <= published[i + 1]!.tpr);
  if (k < 0)
    return {
      ...none(
        `its TPR20,10 (${tpr.toFixed(3)}) is outside the published range read (${published[0]!.tpr.toFixed(3)} to ` +
          `${published.at(-1)!.tpr.toFixed(3)}, ${published[0]!.mv} to ${published.at(-1)!.mv} MV)`,
      ),
      tpr2010: tpr,
    };
  const [a, b] = [published[k]!, published[k + 1]!];
  const t = (tpr - a.tpr) / (b.tpr - a.tpr);
  const rows = (
    [
      [10, pdd10, a.pdd10 + t * (b.pdd10 - a.pdd10)],
      [20, pdd20, a.pdd20 + t * (b.pdd20 - a.pdd20)],
    ] as const
  ).map(([depthCm, clinicPercent, publishedPercent]) => ({
    depthCm,
    clinicPercent,
    publishedPercent,
    differencePercent: (100 * (clinicPercent - publishedPercent)) / publishedPercent,
  }));
  return { beamId: beam.id, tpr2010: tpr, rows };
}
