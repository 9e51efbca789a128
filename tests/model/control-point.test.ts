/** The model's own check of device positions: only finite numbers enter it (common practice, no source: NaN or ±Infinity is never a position). */
import { describe, expect, it } from 'vitest';
import { DevicePosition } from '../../src/model/index.js';

describe('device positions in the model', () => {
  it('accepts a list of finite numbers and keeps it as given', () => {
    const positionsMm = [-50, 0.5, 50];
    const r = DevicePosition.safeParse({ type: 'MLCX', positionsMm });
    expect(r.success && r.data.positionsMm).toEqual(positionsMm);
  });
  it.each([[[1, Number.NaN]], [[Number.POSITIVE_INFINITY]], [['1']], ['1\\2'], [undefined]])('refuses %j', (positionsMm) => {
    const r = DevicePosition.safeParse({ type: 'ASYMX', positionsMm });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(['positionsMm']);
  });
});
