/** DICOM gives doses in Gy; plumbline reports per-fraction point doses in cGy. The one conversion. */
export const CGY_PER_GY = 100;
export const cGyFromGy = (gy: number): number => gy * CGY_PER_GY;

/** Geometry (DICOM, CT) is in mm, the beam data and the dose formalism in cm: where one hands over to the other. */
export const MM_PER_CM = 10;
