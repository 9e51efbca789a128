import { formatIssue } from '../model/index.js';
import { CAUTION } from '../report/caution.js';
import {
  compareElectronEnergy,
  comparePublishedPdd,
  ELECTRON_ENERGY_TOLERANCE_PERCENT,
  loadBeamData,
  PUBLISHED_TOLERANCE_PERCENT,
} from '../run/index.js';
import type { CommandOutcome } from './outcome.js';

/**
 * `plumbline beams compare-published`: each photon beam's 10 × 10 PDD at SSD 100 beside the
 * published data of its beam quality; exit 1 when a difference is beyond the tolerance.
 */
export function runBeamsComparePublished(manifestArg: string): CommandOutcome {
  const loaded = loadBeamData(manifestArg);
  if (!loaded.ok) return { stdout: [], stderr: loaded.issues.map(formatIssue), exitCode: 2 };
  const out = [
    `10 × 10 PDD at SSD 100 cm against BJR Supplement 25 (1996, Tables 5.2.1–5.5.1, read from a secondary copy), interpolated in TPR20,10;`,
    `differences beyond ±${PUBLISHED_TOLERANCE_PERCENT} % are flagged (common practice, no source). Only 10 and 20 cm were read.`,
  ];
  let flagged = 0;
  for (const beam of loaded.value.machine.beams) {
    const c = comparePublishedPdd(beam);
    if (c.notCompared) {
      out.push(`  ${beam.id}: not compared: ${c.notCompared}`);
      continue;
    }
    out.push(`  ${beam.id}: TPR20,10 ${c.tpr2010!.toFixed(3)}`);
    for (const r of c.rows) {
      const flag = Math.abs(r.differencePercent) > PUBLISHED_TOLERANCE_PERCENT;
      if (flag) flagged++;
      out.push(
        `    PDD(${r.depthCm} cm) ${r.clinicPercent.toFixed(1)} %, published ${r.publishedPercent.toFixed(1)} %, ` +
          `${r.differencePercent >= 0 ? '+' : ''}${r.differencePercent.toFixed(1)} %${flag ? '  <- look at this table' : ''}`,
      );
    }
  }
  for (const b of loaded.value.machine.electronBeams) {
    const e = compareElectronEnergy(b);
    if (e.notCompared) {
      out.push(`  ${b.id}: not compared: ${e.notCompared}`);
      continue;
    }
    const flag = Math.abs(e.differencePercent!) > ELECTRON_ENERGY_TOLERANCE_PERCENT;
    if (flag) flagged++;
    const difference = `${e.differencePercent! >= 0 ? '+' : ''}${e.differencePercent!.toFixed(0)} %`;
    out.push(
      `  ${b.id}: R50 ${e.r50Cm!.toFixed(2)} cm (10 cm field), E0 ≈ 2.33 MeV/cm × R50 = ${e.e0MeV!.toFixed(1)} MeV, ` +
        `nominal ${b.nominalEnergyMeV} MeV (${difference})${flag ? '  <- look at this table' : ''}`,
    );
  }
  out.push(CAUTION);
  return { stdout: out, stderr: [], exitCode: flagged ? 1 : 0 };
}
