/**
 * An object received over the network is recorded under the hash of its data set as sent (the
 * receiver writes its own file meta group), which dcmtk's dcmconv -F -e reproduces from the exported
 * file; a refused one keeps its sender's calling AE title.
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { receivedName } from '../../src/service/inbox-names.js';
import { processInbox } from '../../src/service/pipeline.js';
import { clinic, put, setup } from '../helpers/inbox.js';

describe('a received object in the record', () => {
  it("a received plan is recorded under its data set's hash (dcmconv -F -e writes the same bytes); a refused one with its sender's AE title", async () => {
    const s = setup();
    put(s.config.folders.inbox, clinic('spine-ssd.dcm'), receivedName('NG_TPS'));
    writeFileSync(join(s.config.folders.inbox, receivedName('OTHER TPS')), 'not DICOM');
    s.advance(31);
    expect(await processInbox(s.ctx)).toMatchObject({ checked: 1, refused: 1 });
    const out = join(s.root, 'dataset.bin');
    expect(spawnSync('dcmconv', ['-F', '-e', clinic('spine-ssd.dcm'), out]).status).toBe(0);
    const [c] = await s.history.listChecks();
    expect(c!.planSha256).toBe(createHash('sha256').update(readFileSync(out)).digest('hex'));
    expect(await s.history.intakeOutcomes()).toEqual([expect.objectContaining({ outcome: 'refused', callingAeTitle: 'OTHER TPS' })]);
  });
});
