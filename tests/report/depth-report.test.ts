/**
 * The depths report: a row per beam (per control point of an arc), the point and entry per beam, the
 * caution last; from depths traced through a box of water built in memory.
 */
import { describe, expect, it } from 'vitest';
import { staticBeam } from '../../scripts/fixtures/plan-parts.js';
import { planDepths } from '../../src/check/plan-depths.js';
import { CAUTION } from '../../src/report/caution.js';
import { DepthDocument, depthText } from '../../src/report/depth-report.js';
import { oneBeamPlan } from '../helpers/check-run.js';
import { boxCt } from '../helpers/model-ct.js';

const iso: [number, number, number] = [0, 0, 0];
const ct = boxCt({ halfMm: 100, slabs: [{ fromMm: -60, toMm: -25, hu: -750 }] });
const plan = oneBeamPlan('depth-report', staticBeam(1, 'AP', 6, 0, 905, iso), iso);
const doc: DepthDocument = DepthDocument.parse({
  schemaVersion: 2,
  kind: 'plumbline.depth',
  tool: { name: 'plumbline', version: '0.0.0-test' },
  plan: 'depth-report.dcm',
  ct: {
    seriesInstanceUid: '1.2.3.10',
    frameOfReferenceUid: '1.2.3.9',
    slices: ct.volume.slices,
    bodyThresholdHu: -400,
    body: 'HU >= -400',
    densityTable: 'linear (test)',
  },
  beams: planDepths(plan, ct),
  caution: CAUTION,
});
const cells = (line: string) => line.trim().split(/\s{2,}/);

describe('depthText', () => {
  const text = depthText(doc);
  it('heads with the plan, the series, the body and the density table', () => {
    expect(text[0]).toBe('Depths from the CT for depth-report.dcm: series 1.2.3.10 (43 slices), body HU >= -400, densities from linear (test)');
  });
  it("a row with the plan's and the CT's SSD, their difference and the depths (a 40 mm slab of density 0.25: 30 mm less radiologically)", () => {
    const row = cells(text.find((l) => l.trim().startsWith('1 '))!);
    expect(row.slice(0, 10)).toEqual(['1', 'AP', '—', '0.0', '905.0', '897.5', '-7.5', '102.5', '72.5', '0.25–1.00']);
  });
  it('the point and where the ray enters, then the caution', () => {
    expect(text).toContain(
      '  beam 1: point 0.0, 0.0, 0.0 mm (the Beam Dose Specification Point of the beam in the fraction group); enters at 0.0, -102.5, 0.0 mm',
    );
    expect(text.at(-1)).toBe(CAUTION);
  });
});
