/** DICOM gives doses in Gy; plumbline reports per-fraction point doses in cGy. The one conversion. */
export const CGY_PER_GY = 100;
export const cGyFromGy = (gy: number): number => gy * CGY_PER_GY;
