/**
 * Point-dose evaluations per second on one core, with real table lookups on the demo machine: SAD
 * and SSD setups over a spread of fields, depths and off-axis distances, with and without a wedge.
 * Target: at least one million per second. No reference tool computes TG-71 point doses, so there
 * is no ratio here. Run: npm run bench
 */
import { loadMachine } from '../../src/beamdata/index.js';
import type { PhotonPointInput } from '../../src/model/index.js';
import { photonDosePerMu } from '../../src/physics/index.js';

const loaded = loadMachine(new URL('../../fixtures/demo/beam-data/manifest.json', import.meta.url).pathname);
if (!loaded.ok) throw new Error(loaded.issues.map((i) => i.message).join('; '));
const { machine } = loaded.value;
const beam = machine.beams[0]!;

const inputs: PhotonPointInput[] = [];
for (let k = 0; k < 1000; k++) {
  const x = 4 + (k % 17);
  const y = 4 + ((k * 7) % 19);
  const depth = 2 + ((k * 3) % 23);
  inputs.push({
    setup: k % 2 ? 'SAD' : 'SSD',
    collimatorFieldCm: { x, y },
    depthCm: depth,
    ssdCm: k % 2 ? 100 - depth : 90 + (k % 15),
    offAxisCm: (k % 9) * 0.7,
    ...(k % 4 === 0 && x <= 15 && y <= 15 ? { wedgeId: 'W30' } : {}),
  });
}

function run(n: number): number {
  let sink = 0;
  const t0 = process.hrtime.bigint();
  for (let i = 0; i < n; i++) {
    const r = photonDosePerMu(beam, machine.sadCm, inputs[i % inputs.length]!);
    if (r.ok) sink += r.value.dosePerMuCGy;
    else throw new Error(r.issues[0]!.message);
  }
  const s = Number(process.hrtime.bigint() - t0) / 1e9;
  if (sink === 0) throw new Error('no doses');
  return n / s;
}

run(200_000); // warm-up
const rates = [0, 1, 2].map(() => run(2_000_000));
console.log(
  `point dose (6 MV, demo machine, mixed SSD/SAD, OAR, wedge on 1 in 4): ${(Math.max(...rates) / 1e6).toFixed(2)} million evaluations/s (best of 3 x 2 000 000)`,
);
