/** `depth` as a document: each beam of the demo pelvis plan traced through its own CT; a plan without a CT in its frame of reference refused. */
import { describe, expect, it } from 'vitest';
import { planDepthsFromCt } from '../../src/run/plan-depths-from-ct.js';
import { DepthDocument } from '../../src/report/depth-report.js';
import { demoPlan } from '../helpers/fixtures.js';
import { manifestPath } from '../helpers/machines.js';

const request = { ct: [manifestPath('fixtures/demo/clinic-ct/pelvis-box')], density: 'demo', bodyThresholdHu: -400 };

describe('planDepthsFromCt', () => {
  it("the pelvis plan in its CT's frame: a row per beam, each with a depth and the CT's SSD", () => {
    const r = planDepthsFromCt(manifestPath('fixtures/demo/clinic/pelvis-box.dcm'), request);
    if (!r.ok) throw new Error(r.issues[0]!.message);
    expect(DepthDocument.parse(r.value)).toEqual(r.value);
    expect(r.value.beams.length).toBeGreaterThan(1);
    for (const b of r.value.beams) {
      expect(b.problem).toBeUndefined();
      expect(b.geometricDepthMm).toBeGreaterThan(0);
      expect(b.ctSsdAlongAxisMm).toBeGreaterThan(0);
    }
  });
  it("a plan of another patient: no CT series in the plan's frame of reference", () => {
    const r = planDepthsFromCt(demoPlan('four-field-box.dcm'), request);
    expect(!r.ok && r.issues[0]).toMatchObject({
      code: 'inconsistent',
      path: 'FrameOfReferenceUID',
      message: "no CT series in the plan's frame of reference",
    });
  });
});
