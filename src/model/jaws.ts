import type { ControlPoint } from './control-point.js';

/** The collimator jaw opening at a control point, mm at the isocenter plane (IEC BEAM LIMITING DEVICE). */
export interface JawOpeningMm {
  readonly x1: number;
  readonly x2: number;
  readonly y1: number;
  readonly y2: number;
}

/**
 * Jaws from the X/ASYMX and Y/ASYMY devices. A beam without jaws along an axis (MLC only) has
 * undefined for that axis: the opening is then set by the leaves alone.
 */
export function jawOpeningMm(cp: ControlPoint): Partial<JawOpeningMm> {
  const find = (a: 'X' | 'Y') => cp.devices.find((d) => d.type === a || d.type === `ASYM${a}`)?.positionsMm;
  const x = find('X');
  const y = find('Y');
  return { ...(x ? { x1: x[0]!, x2: x[1]! } : {}), ...(y ? { y1: y[0]!, y2: y[1]! } : {}) };
}
