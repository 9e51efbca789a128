/** The same plan sent again in another transfer syntax: other bytes, the same values (dcmtk's dcmconv writes the other encoding). */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { processInbox } from '../../src/service/pipeline.js';
import { clinic, put, setup } from '../helpers/inbox.js';

describe('the same plan sent again in another transfer syntax', () => {
  it('is recognised by its content and not checked twice (implicit VR written by dcmtk dcmconv)', async () => {
    const s = setup();
    const implicit = join(s.root, 'implicit.dcm');
    const r = spawnSync('dcmconv', ['+ti', clinic('brain-laterals.dcm'), implicit], { encoding: 'utf8' }); // dcmtk
    expect(r.status, r.stderr).toBe(0);
    expect(readFileSync(implicit).equals(readFileSync(clinic('brain-laterals.dcm')))).toBe(false);
    put(s.config.folders.inbox, clinic('brain-laterals.dcm'));
    s.advance(60);
    expect(await processInbox(s.ctx)).toMatchObject({ checked: 1 });
    put(s.config.folders.inbox, implicit);
    s.advance(60);
    expect(await processInbox(s.ctx)).toMatchObject({ checked: 0, duplicates: 1 });
    expect(await s.history.listChecks()).toHaveLength(1);
  });
});
