import { loadDensityTable } from '../beamdata/index.js';
import type { PatientCt } from '../check/patient-ct.js';
import { readCtVolumes, readRtStruct } from '../dicom/index.js';
import { bodySurface } from '../geometry/index.js';
import type { Result, Structure } from '../model/index.js';
import { collectFiles } from './collect-files.js';
import { resolveDemoFile } from './demo-files.js';

/**
 * Reads `--ct` (folders or files; every CT series among them) with `--density` (a CSV, or `demo`
 * for the invented demo table). Each plan then uses the series in its own frame of reference.
 */
export function loadPatientCts(
  ctPaths: readonly string[],
  density: string | undefined,
  bodyThresholdHu: number,
  structuresFile?: string,
): Result<PatientCt[]> {
  if (!density) {
    return {
      ok: false,
      issues: [
        { severity: 'error', code: 'invalid-option', message: "--ct needs --density: the clinic's HU to relative electron density table (CSV)" },
      ],
    };
  }
  const table = loadDensityTable(density === 'demo' ? resolveDemoFile('ct/hu-to-density.csv') : density);
  if (!table.ok) return table;
  // Links to nothing and special files are never opened (a FIFO would never end); the rest are read.
  const files = collectFiles(ctPaths)
    .filter((f) => !f.problem)
    .map((f) => f.path);
  const { volumes, issues } = readCtVolumes(files);
  if (issues.length) return { ok: false, issues };
  if (!volumes.length)
    return { ok: false, issues: [{ severity: 'error', code: 'missing-attribute', message: `no CT series found in ${ctPaths.join(', ')}` }] };
  let external: Structure | undefined;
  if (structuresFile) {
    const rs = readRtStruct(structuresFile);
    if (!rs.ok) return rs;
    external = rs.value.structures.find((s) => s.type === 'EXTERNAL');
    if (!external)
      return {
        ok: false,
        issues: [
          {
            severity: 'error',
            code: 'missing-attribute',
            file: structuresFile,
            message: 'the structure set has no EXTERNAL structure (the body)',
            expected: 'an ROI of RT ROI Interpreted Type EXTERNAL',
          },
        ],
      };
  }
  return {
    ok: true,
    value: volumes.map((volume) => {
      const own = external && (!external.frameOfReferenceUid || external.frameOfReferenceUid === volume.frameOfReferenceUid) ? external : undefined;
      return {
        volume,
        density: table.value.density,
        densityTable: table.value.file,
        bodyThresholdHu,
        ...(own ? { body: bodySurface(volume, own), bodySource: `EXTERNAL "${own.name}"` } : { bodySource: `HU >= ${bodyThresholdHu}` }),
      };
    }),
  };
}
