/**
 * Writes the CT of the demo pelvis patient (fixtures/demo/clinic-ct/pelvis-box/), an INVENTED
 * analytic phantom: a water-equivalent box whose faces give the demo plan's SSDs exactly (AP 90,
 * PA 88, left 83, right 83.5 cm) with a bone block (700 HU) in the path of the PA beam, in the plan's
 * frame of reference. 5 mm voxels, faces on voxel boundaries. Run: npm run demo-ct
 */
import { mkdirSync, rmSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { writeCtPhantom } from './fixtures/ct-phantom.js';
import { fixtureUid } from './lib/dcmjs-writer.js';

const OUT = fileURLToPath(new URL('../fixtures/demo/clinic-ct/pelvis-box/', import.meta.url));
rmSync(OUT, { recursive: true, force: true });
mkdirSync(OUT, { recursive: true });
const inside = (x: number, y: number, z: number) => x > -165 && x < 170 && y > -90 && y < 130 && z > -230 && z < 70;
const bone = (x: number, y: number, z: number) => x > -30 && x < 30 && y > 80 && y < 110 && z > -150 && z < -10;
const files = writeCtPhantom(OUT, {
  name: 'pelvis',
  columns: 82,
  rows: 56,
  slices: 68,
  spacingMm: [5, 5, 5],
  originMm: [-197.5, -117.5, -247.5],
  frameOfReferenceUid: fixtureUid('for:NG-1001'),
  patientId: 'NG-1001',
  hu: (x, y, z) => (!inside(x, y, z) ? -1000 : bone(x, y, z) ? 700 : 0),
});
console.log(`wrote ${files.length} slices into fixtures/demo/clinic-ct/pelvis-box/`);
