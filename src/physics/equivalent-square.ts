/**
 * Equivalent square of a rectangle by the area-to-perimeter rule, side = 4A/P = 2XY/(X + Y)
 * (Sterling; common practice). Units in, units out (cm in the engine).
 */
export function equivalentSquareCm(xCm: number, yCm: number): number {
  return (2 * xCm * yCm) / (xCm + yCm);
}

/** The area-to-perimeter rule for any field outline (an MLC-shaped aperture): side = 4A/P. */
export function equivalentSquareOfOutlineCm(areaCm2: number, perimeterCm: number): number {
  return (4 * areaCm2) / perimeterCm;
}

/** Square of the same area as a circle of radius r: side = r·√π (equal-area rule). */
export function equivalentSquareOfCircleCm(radiusCm: number): number {
  return radiusCm * Math.sqrt(Math.PI);
}

/**
 * Equivalent square for the in-air output ratio Sc with the collimator-exchange effect:
 * side = (1 + k)·X·Y / (k·X + Y), Y being the upper jaws (from memory: the form of Vadash and
 * Bjärngard). k = 1 gives back 4A/P; k > 1 weights the upper jaws more.
 */
export function collimatorEquivalentSquareCm(xCm: number, yCm: number, exchangeK = 1): number {
  return ((1 + exchangeK) * xCm * yCm) / (exchangeK * xCm + yCm);
}
