/**
 * Modulated beams: the two-arc VMAT demo plan (2 × 178 control points, 60 leaf pairs) checked by the
 * modified Clarkson integration, computation only (after loading plan, beam data and CT), with the
 * depths per control point from the plan's SSDs and traced through a 200 × 512 × 512 CT (a water
 * cylinder phantom in the plan's frame of reference, written here). Target: under 200 ms with the
 * CT. Then the same with every beam's deviation explained (`check --explain`): the leaf-end
 * sensitivity recalculates each arc once, so explaining costs about one check more; target: the
 * explanation at most twice the check. Best of 5 runs.
 * Run: npm run bench
 */
import { mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { loadMachine } from '../../src/beamdata/index.js';
import { checkPlan, DEFAULT_POLICY } from '../../src/check/index.js';
import { loadPatientCts } from '../../src/run/index.js';
import { importPlanFile } from '../../src/dicom/index.js';
import { writeCtPhantom } from '../fixtures/ct-phantom.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const plan = importPlanFile(join(ROOT, 'fixtures/demo/plans/two-arc-vmat.dcm'));
const machine = loadMachine(join(ROOT, 'fixtures/demo/beam-data/manifest.json'));
if (!plan.ok || !machine.ok) throw new Error('cannot load the demo plan or beam data');
const dir = mkdtempSync(join(tmpdir(), 'plumbline-bench-mod-'));
try {
  writeCtPhantom(dir, {
    name: 'arc',
    columns: 512,
    rows: 512,
    slices: 200,
    spacingMm: [1, 1, 2],
    originMm: [-255.5, -255.5, -249],
    frameOfReferenceUid: plan.value.plan.frameOfReferenceUid!,
    hu: (x, y) => (x * x + y * y < 150 * 150 ? 0 : -1000),
  });
  const cts = loadPatientCts([dir], join(ROOT, 'fixtures/demo/ct/hu-to-density.csv'), DEFAULT_POLICY.ct.bodyThresholdHu);
  if (!cts.ok) throw new Error(cts.issues.map((i) => i.message).join('; '));
  const options = { machine: machine.value.machine, policy: DEFAULT_POLICY, aliases: new Map<string, string>(), suggestPoint: false };
  const time = (ct?: (typeof cts.value)[number], explain = false) => {
    let best = Infinity;
    let checked = 0;
    for (let i = 0; i < 5; i++) {
      const t0 = process.hrtime.bigint();
      const r = checkPlan(
        plan.value.plan,
        { path: 'two-arc-vmat.dcm', sha256: '' },
        { ...options, explain, explainAll: explain, ...(ct ? { ct } : {}) },
      );
      best = Math.min(best, Number(process.hrtime.bigint() - t0) / 1e6);
      checked = r.fractionGroups.flatMap((g) => g.beams).filter((b) => b.status === 'checked').length;
    }
    return { best, checked };
  };
  const flat = time();
  const withCt = time(cts.value[0]);
  const explained = time(cts.value[0], true);
  console.log(
    `two-arc VMAT (2 x 178 control points, 60 leaf pairs, ${readdirSync(dir).length}-slice CT): ${withCt.checked} arcs checked in ${withCt.best.toFixed(0)} ms with CT depths per control point (target < 200 ms); ${flat.best.toFixed(0)} ms with the plan's SSD per control point`,
  );
  console.log(
    `  explained (--explain, with CT): ${explained.best.toFixed(0)} ms in all; the explanation adds ${(explained.best - withCt.best).toFixed(0)} ms, ` +
      `${((explained.best - withCt.best) / withCt.best).toFixed(2)} x the check (target <= 2)`,
  );
} finally {
  rmSync(dir, { recursive: true, force: true });
}
