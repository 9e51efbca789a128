const PREAMBLE = 128;
/** (0002,0000) File Meta Information Group Length, explicit VR little endian: tag, "UL", length 4, value. */
const GROUP_LENGTH_ELEMENT = 12;

/**
 * Where a Part-10 file's data set begins: after the preamble, "DICM" and the file meta group, whose
 * length its first element gives (PS3.10 7.1); 0 for bytes that are no Part-10 file.
 */
export function datasetOffset(bytes: Uint8Array): number {
  const b = Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (b.length < PREAMBLE + 4 + GROUP_LENGTH_ELEMENT || b.toString('latin1', PREAMBLE, PREAMBLE + 4) !== 'DICM') return 0;
  const at = PREAMBLE + 4;
  if (b.readUInt16LE(at) !== 0x0002 || b.readUInt16LE(at + 2) !== 0x0000 || b.toString('latin1', at + 4, at + 6) !== 'UL') return 0;
  const end = at + GROUP_LENGTH_ELEMENT + b.readUInt32LE(at + 8);
  return end <= b.length ? end : 0;
}
