/** The transfer syntaxes an RT Plan is read in (all uncompressed; a plan has no pixel data). */
export const IMPLICIT_VR_LE = '1.2.840.10008.1.2';
export const EXPLICIT_VR_LE = '1.2.840.10008.1.2.1';
export const DEFLATED_EXPLICIT_VR_LE = '1.2.840.10008.1.2.1.99';
export const EXPLICIT_VR_BE = '1.2.840.10008.1.2.2';

export const SUPPORTED_TRANSFER_SYNTAXES: Readonly<Record<string, string>> = {
  [IMPLICIT_VR_LE]: 'Implicit VR Little Endian',
  [EXPLICIT_VR_LE]: 'Explicit VR Little Endian',
  [DEFLATED_EXPLICIT_VR_LE]: 'Deflated Explicit VR Little Endian',
  [EXPLICIT_VR_BE]: 'Explicit VR Big Endian',
};
