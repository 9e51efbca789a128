import { describe, expect, it } from 'vitest';
import { note } from '../../src/model/index.js';
import { withWarnings } from '../../src/run/with-warnings.js';
import { check, importOrThrow } from '../helpers/check-run.js';
import { DEMO_MANIFEST, machine, manifestPath } from '../helpers/machines.js';

const brain = check(importOrThrow(manifestPath('fixtures/demo/clinic/brain-laterals.dcm')), machine(DEMO_MANIFEST));

describe("a plan's result with the warnings of its inputs", () => {
  it('adds them after its own, and leaves the result as it is without any', () => {
    const w = note('heterogeneity-unknown');
    expect(withWarnings(brain, [w]).warnings).toEqual([...brain.warnings, w]);
    expect(withWarnings(brain, [])).toBe(brain);
  });
});
