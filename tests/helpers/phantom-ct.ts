import { mkdirSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type PhantomSpec, writeCtPhantom } from '../../scripts/fixtures/ct-phantom.js';
import { loadDensityTable } from '../../src/beamdata/index.js';
import type { PatientCt } from '../../src/check/index.js';
import { readCtSeries } from '../../src/dicom/index.js';
import { manifestPath } from './machines.js';

/** An analytic CT phantom written to a temporary folder and read back as the check takes a patient's CT (demo density table, body by threshold). */
export function phantomCt(spec: PhantomSpec, bodyThresholdHu: number): PatientCt {
  const dir = join(mkdtempSync(join(tmpdir(), `plumbline-${spec.name}-`)), 'ct');
  mkdirSync(dir);
  const volume = readCtSeries(writeCtPhantom(dir, spec));
  const table = loadDensityTable(manifestPath('fixtures/demo/ct/hu-to-density.csv'));
  if (!volume.ok || !table.ok) throw new Error('the phantom could not be read back');
  return { volume: volume.value, density: table.value.density, densityTable: 'demo', bodyThresholdHu, bodySource: `HU >= ${bodyThresholdHu}` };
}
