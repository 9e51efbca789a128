/** `depth`: the demo pelvis plan through its CT, as text or JSON (exit 0); options and inputs refused with exit 2. */
import { describe, expect, it } from 'vitest';
import { runDepth } from '../../src/cli/depth.js';
import { DepthDocument } from '../../src/report/depth-report.js';
import { manifestPath } from '../helpers/machines.js';

const plan = manifestPath('fixtures/demo/clinic/pelvis-box.dcm');
const ct = [manifestPath('fixtures/demo/clinic-ct/pelvis-box')];

describe('depth', () => {
  it('text, then the same as a JSON document', () => {
    const text = runDepth(plan, { ct, density: 'demo' });
    expect(text.exitCode).toBe(0);
    expect(text.stdout[0]).toMatch(/^Depths from the CT for /);
    const json = runDepth(plan, { ct, density: 'demo', json: true });
    const doc = DepthDocument.parse(JSON.parse(json.stdout.join('\n')));
    expect(doc.beams.length).toBeGreaterThan(1);
  });
  it('refuses a body threshold that is not an integer, and a CT without its density table', () => {
    expect(runDepth(plan, { ct, density: 'demo', bodyThreshold: '-400.5' }).stderr.join(' ')).toMatch(/--body-threshold must be an integer HU/);
    const noDensity = runDepth(plan, { ct });
    expect(noDensity.exitCode).toBe(2);
    expect(noDensity.stderr.join(' ')).toMatch(/--ct needs --density/);
  });
});
