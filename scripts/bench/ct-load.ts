/** Child process of scripts/bench/ct.ts: loads one CT series, traces the rays of a plan, prints timings as JSON. */
import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { readCtSeries } from '../../src/dicom/index.js';
import { ctDepth } from '../../src/geometry/index.js';

const dir = process.argv[2]!;
const files = readdirSync(dir).map((f) => join(dir, f));
const t0 = performance.now();
const r = readCtSeries(files);
const loadMs = performance.now() - t0;
if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
const density = (hu: number) => (hu < -1000 ? 0 : 1 + hu / 1000);
const trace = (gantries: readonly number[]) => {
  const t = performance.now();
  for (const g of gantries) {
    const a = (g * Math.PI) / 180;
    const d = ctDepth(r.value, [1000 * Math.sin(a), -1000 * Math.cos(a), 0], [0, 0, 0], { bodyThresholdHu: -400, density });
    if (!d.ok) throw new Error(d.refusal.reason);
  }
  return performance.now() - t;
};
const fourField = trace([0, 90, 180, 270]);
const arcs = trace(Array.from({ length: 356 }, (_, i) => (181 + (i % 178) * (358 / 177)) % 360));
console.log(JSON.stringify({ loadMs, fourFieldTraceMs: fourField, twoArcTraceMs: arcs, volumeBytes: r.value.hu.byteLength }));
