/**
 * The point-fitness rules: where a point check is too sensitive to trust (thresholds are common
 * practice, no source; the policy holds the margins).
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_POLICY } from '../../../src/check/index.js';
import { buildUpFlags, edgeFlags, electronDepthFlags, interfaceFlags } from '../../../src/check/beam/point-fitness.js';

const codes = (notes: readonly { code: string }[]) => notes.map((n) => n.code);

describe('electron depth', () => {
  it('a point 1 mm above dmax where the PDD is 99.97 % is not in the build-up', () => {
    expect(electronDepthFlags(1.9, 2.0, 99.97)).toEqual([]);
  });
  it('a shallow point where the PDD is still below 90 % is', () => {
    expect(codes(electronDepthFlags(0.3, 2.0, 84))).toEqual(['electron-build-up']);
  });
  it('past dmax, below 80 % is the fall-off (9 MeV at 5 cm, PDD 7.3 %), above it is not', () => {
    expect(codes(electronDepthFlags(5, 2.0, 7.3))).toEqual(['steep-fall-off']);
    expect(electronDepthFlags(2.5, 2.0, 95)).toEqual([]);
  });
});

describe('photon points', () => {
  it('shallower than dmax is the build-up', () => {
    expect(codes(buildUpFlags(1.0, 1.5))).toEqual(['build-up']);
    expect(buildUpFlags(1.5, 1.5)).toEqual([]);
  });
  it('near or outside the field edge by the policy margin', () => {
    const m = DEFAULT_POLICY.point.edgeMarginCm;
    expect(edgeFlags(m, DEFAULT_POLICY)).toEqual([]);
    expect(codes(edgeFlags(m / 2, DEFAULT_POLICY))).toEqual(['near-field-edge']);
    expect(codes(edgeFlags(-0.1, DEFAULT_POLICY))).toEqual(['outside-field']);
  });
  it('just past a density interface by the policy margin', () => {
    const mm = DEFAULT_POLICY.point.interfaceMarginCm * 10;
    expect(interfaceFlags(undefined, DEFAULT_POLICY)).toEqual([]);
    expect(interfaceFlags(mm, DEFAULT_POLICY)).toEqual([]);
    expect(codes(interfaceFlags(mm / 2, DEFAULT_POLICY))).toEqual(['past-interface']);
  });
});
