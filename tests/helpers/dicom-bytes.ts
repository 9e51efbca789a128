/**
 * DICOM bytes written by hand from the encoding rules of PS3.5 §7.1 (little endian), so the reader's
 * unit tests do not rest on another library's writer: explicit VR (2-byte length, or 2 reserved bytes
 * and a 4-byte length for OB, OW, OF, SQ, UT, UN), implicit VR (4-byte length), items and sequences
 * of defined length, and the Part-10 preamble, "DICM" and file meta group (PS3.10 §7.1).
 */
const LONG_VRS = new Set(['OB', 'OW', 'OF', 'OD', 'OL', 'SQ', 'UT', 'UN', 'UC', 'UR']);

/** A value padded to even length (space for text, NUL for UI and binary), as PS3.5 §6.2 asks. */
export function text(value: string, vr = 'LO'): Buffer {
  const b = Buffer.from(value, 'latin1');
  return b.length % 2 ? Buffer.concat([b, Buffer.from(vr === 'UI' ? [0] : [0x20])]) : b;
}

export function uint16(...values: number[]): Buffer {
  const b = Buffer.alloc(2 * values.length);
  values.forEach((v, i) => b.writeUInt16LE(v, 2 * i));
  return b;
}

export function float64(...values: number[]): Buffer {
  const b = Buffer.alloc(8 * values.length);
  values.forEach((v, i) => b.writeDoubleLE(v, 8 * i));
  return b;
}

function tagBytes(group: number, element: number): Buffer {
  return uint16(group, element);
}

/** One explicit VR little-endian element. */
export function explicit(group: number, element: number, vr: string, value: Buffer): Buffer {
  const head = LONG_VRS.has(vr) ? Buffer.alloc(8) : Buffer.alloc(4);
  head.write(vr, 0, 'latin1');
  if (LONG_VRS.has(vr)) head.writeUInt32LE(value.length, 4);
  else head.writeUInt16LE(value.length, 2);
  return Buffer.concat([tagBytes(group, element), head, value]);
}

/** One implicit VR little-endian element. */
export function implicit(group: number, element: number, value: Buffer): Buffer {
  const len = Buffer.alloc(4);
  len.writeUInt32LE(value.length, 0);
  return Buffer.concat([tagBytes(group, element), len, value]);
}

/** A sequence of defined length holding items of defined length (explicit VR). */
export function sequence(group: number, element: number, items: readonly Buffer[]): Buffer {
  const encoded = items.map((body) => {
    const head = Buffer.alloc(8);
    head.writeUInt16LE(0xfffe, 0);
    head.writeUInt16LE(0xe000, 2);
    head.writeUInt32LE(body.length, 4);
    return Buffer.concat([head, body]);
  });
  return explicit(group, element, 'SQ', Buffer.concat(encoded));
}

/** A Part-10 file: 128-byte preamble, "DICM", the meta group (its group length first), then the data set. */
export function part10(transferSyntaxUid: string, dataset: Buffer, sopClassUid = '1.2.840.10008.5.1.4.1.1.481.5'): Buffer {
  const meta = Buffer.concat([
    explicit(0x0002, 0x0001, 'OB', Buffer.from([0, 1])),
    explicit(0x0002, 0x0002, 'UI', text(sopClassUid, 'UI')),
    explicit(0x0002, 0x0003, 'UI', text('1.2.3.4.5.6', 'UI')),
    explicit(0x0002, 0x0010, 'UI', text(transferSyntaxUid, 'UI')),
  ]);
  const groupLength = Buffer.alloc(4);
  groupLength.writeUInt32LE(meta.length, 0);
  return Buffer.concat([Buffer.alloc(128), Buffer.from('DICM', 'latin1'), explicit(0x0002, 0x0000, 'UL', groupLength), meta, dataset]);
}
