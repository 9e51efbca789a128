/**
 * Follows the PDU stream of a DICOM association (PS3.8 9.3: each PDU a 6-byte header — type,
 * reserved, a 32-bit big-endian length — then that many bytes) as bytes arrive, so a PDU declaring
 * more than `maxPduBytes` is caught from its header, before the network library buffers its body.
 */
export class PduGuard {
  private header = Buffer.alloc(0);
  private bodyLeft = 0;

  constructor(private readonly maxPduBytes: number) {}

  /** The first declared length over the limit in this chunk, or undefined while every PDU is within it. */
  tooLong(chunk: Buffer): number | undefined {
    let at = 0;
    while (at < chunk.length) {
      if (this.bodyLeft > 0) {
        const take = Math.min(this.bodyLeft, chunk.length - at);
        this.bodyLeft -= take;
        at += take;
        continue;
      }
      const need = 6 - this.header.length;
      this.header = Buffer.concat([this.header, chunk.subarray(at, at + need)]);
      at += Math.min(need, chunk.length - at);
      if (this.header.length < 6) return undefined;
      const length = this.header.readUInt32BE(2);
      this.header = Buffer.alloc(0);
      if (length > this.maxPduBytes) return length;
      this.bodyLeft = length;
    }
    return undefined;
  }
}
