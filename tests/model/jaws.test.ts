/** The jaw opening at a control point, from the X/ASYMX and Y/ASYMY devices (PS3.3 C.8.8.14.8 device types). */
import { describe, expect, it } from 'vitest';
import { jawOpeningMm } from '../../src/model/jaws.js';
import type { ControlPoint } from '../../src/model/index.js';
import { modelControlPoint } from '../helpers/model-beam.js';

describe('jawOpeningMm', () => {
  it('asymmetric jaws as given', () => {
    expect(jawOpeningMm(modelControlPoint([-40, 60], [-50, 70]))).toEqual({ x1: -40, x2: 60, y1: -50, y2: 70 });
  });
  it('symmetric X and Y devices too', () => {
    const cp: ControlPoint = {
      ...modelControlPoint([0, 0], [0, 0]),
      devices: [
        { type: 'X', positionsMm: [-30, 30] },
        { type: 'Y', positionsMm: [-20, 20] },
      ],
    };
    expect(jawOpeningMm(cp)).toEqual({ x1: -30, x2: 30, y1: -20, y2: 20 });
  });
  it('no jaws along an axis (MLC only): that axis left out, never guessed', () => {
    const cp: ControlPoint = {
      ...modelControlPoint([0, 0], [0, 0]),
      devices: [
        { type: 'ASYMY', positionsMm: [-20, 20] },
        { type: 'MLCX', positionsMm: [0, 0, 1, 1] },
      ],
    };
    expect(jawOpeningMm(cp)).toEqual({ y1: -20, y2: 20 });
  });
});
