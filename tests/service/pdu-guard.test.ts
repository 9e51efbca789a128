/** The PDU stream followed header by header (PS3.8 9.3: type, reserved, 32-bit big-endian length, body). */
import { describe, expect, it } from 'vitest';
import { PduGuard } from '../../src/service/pdu-guard.js';

const pdu = (type: number, length: number, body = Buffer.alloc(length)) => {
  const h = Buffer.alloc(6);
  h[0] = type;
  h.writeUInt32BE(length, 2);
  return Buffer.concat([h, body]);
};

describe('following PDUs', () => {
  it('passes a stream of PDUs within the limit, headers and bodies split anywhere', () => {
    const stream = Buffer.concat([pdu(1, 200), pdu(4, 1000), pdu(4, 16), pdu(5, 4)]);
    const g = new PduGuard(1000);
    for (let at = 0; at < stream.length; at += 7) expect(g.tooLong(stream.subarray(at, at + 7))).toBeUndefined();
  });
  it('catches a PDU declaring more than the limit from its header alone, even a header split in two', () => {
    const g = new PduGuard(1024 ** 2);
    const big = pdu(4, 48 * 1024 ** 2, Buffer.alloc(0));
    expect(g.tooLong(Buffer.concat([pdu(1, 10), big.subarray(0, 3)]))).toBeUndefined();
    expect(g.tooLong(big.subarray(3))).toBe(48 * 1024 ** 2);
  });
});
