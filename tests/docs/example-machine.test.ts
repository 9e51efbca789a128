/** The example machine of docs/beam-data.md stays a valid, complete machine (project rule: docs that run). */
import { describe, expect, it } from 'vitest';
import { loadBeamData, validateMachine } from '../../src/run/index.js';
import { manifestPath } from '../helpers/machines.js';

describe('docs/examples/example-machine', () => {
  const manifest = manifestPath('docs/examples/example-machine/manifest.json');
  it('passes validation with no error and no warning, and is accepted by the gate', () => {
    expect(validateMachine(manifest).issues).toEqual([]);
    const r = loadBeamData(manifest);
    expect(r.ok && [r.value.machine.beams.length, r.value.machine.electronBeams.length]).toEqual([1, 1]);
  });
});
