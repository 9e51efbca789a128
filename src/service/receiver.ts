import { randomUUID } from 'node:crypto';
import { closeSync, fsyncSync, mkdirSync, openSync, readdirSync, renameSync, rmSync, writeSync } from 'node:fs';
import net from 'node:net';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import dimse from 'dcmjs-dimse';
import { InternalError } from '../errors.js';
import { STORAGE_CLASSES, VERSION } from '../run/index.js';
import { PduGuard } from './pdu-guard.js';
import { receivedName } from './inbox-names.js';

const { Scp, Dataset, constants, responses, log } = dimse;
const { CEchoResponse, CStoreResponse } = responses;
const { SopClass, TransferSyntax, Status, RejectResult, RejectSource, RejectReason, PresentationContextResult } = constants;

export interface ReceiverOptions {
  readonly host: string;
  readonly port: number;
  readonly aeTitle: string;
  readonly allowedCallingAeTitles: readonly string[];
  readonly maxObjectBytes: number;
  /** The longest PDU accepted (bytes); a longer one closes the association from its header. */
  readonly maxPduBytes?: number;
  /** An association silent this long is closed (seconds). */
  readonly idleSeconds?: number;
  /** Objects land here, complete, before their success response is sent. */
  readonly inbox: string;
  readonly log: (line: string) => void;
  /** Told after each object is safely in the inbox (the pipeline need not wait for its next look). */
  readonly onStored?: () => void;
}

const ACCEPTED_SOP_CLASSES = new Set<string>([SopClass.Verification, ...Object.values(STORAGE_CLASSES)]);
/** In order of preference; every SCP must accept Implicit VR Little Endian. */
const ACCEPTED_TRANSFER_SYNTAXES = [
  TransferSyntax.ExplicitVRLittleEndian,
  TransferSyntax.ImplicitVRLittleEndian,
  TransferSyntax.ExplicitVRBigEndian,
  '1.2.840.10008.1.2.1.99',
];
/** Our implementation UID (a UUID-derived OID, PS3.5 B.2) and name, written in each stored file's meta header. */
const IMPLEMENTATION_UID = '2.25.301929349735478839237066361593011584412';
const IMPLEMENTATION_NAME = `PLUMBLINE_${VERSION}`.slice(0, 16);
const INCOMING = '.incoming';
/** C-STORE status "Refused: Out of Resources" (A7xx, PS3.4 B.2.3). */
const REFUSED_OUT_OF_RESOURCES = 0xa700;

/**
 * The DICOM storage receiver (C-STORE and C-ECHO SCP): only on the configured address, only for
 * the configured AE title and the allowed calling AE titles (others rejected at association), only
 * RT Plan, CT, RT Structure Set and RT Dose storage. Each object is streamed to a temporary file
 * (Part-10 meta header, then the dataset exactly as received), fsynced and renamed into the inbox
 * before the success response: what was acknowledged survives a crash; what was not leaves no file.
 */
export function startReceiver(o: ReceiverOptions): Promise<{ close: () => Promise<void>; port: number }> {
  log.setLevel('warn');
  const incoming = join(o.inbox, INCOMING);
  mkdirSync(incoming, { recursive: true });
  // Partial files of an earlier run were never acknowledged: they go.
  for (const f of readdirSync(incoming)) rmSync(join(incoming, f), { force: true });

  class StoreScp extends Scp {
    private readonly partial = new Set<string>();
    private readonly socket: net.Socket;
    /** The calling AE title of the association (allowed by then), kept in each received file's inbox name. */
    private caller = '';

    constructor(socket: net.Socket) {
      super(socket, {});
      this.socket = socket;
      socket.on('close', () => this.dropPartial());
    }

    associationRequested(a: InstanceType<typeof dimse.association.Association>): void {
      (this as unknown as { association: unknown }).association = a;
      if (a.getCalledAeTitle() !== o.aeTitle) {
        o.log(`association from ${a.getCallingAeTitle()} rejected: called AE title ${a.getCalledAeTitle()} is not ${o.aeTitle}`);
        this.sendAssociationReject(RejectResult.Permanent, RejectSource.ServiceUser, RejectReason.CalledAeNotRecognized);
        return;
      }
      if (!o.allowedCallingAeTitles.includes(a.getCallingAeTitle())) {
        o.log(`association rejected: calling AE title ${a.getCallingAeTitle()} is not allowed`);
        this.sendAssociationReject(RejectResult.Permanent, RejectSource.ServiceUser, RejectReason.CallingAeNotRecognized);
        return;
      }
      this.caller = a.getCallingAeTitle();
      for (const { context } of a.getPresentationContexts()) {
        if (!ACCEPTED_SOP_CLASSES.has(context.getAbstractSyntaxUid())) {
          context.setResult(PresentationContextResult.RejectAbstractSyntaxNotSupported);
          continue;
        }
        const ts = ACCEPTED_TRANSFER_SYNTAXES.find((t) => context.getTransferSyntaxUids().includes(t));
        if (ts) context.setResult(PresentationContextResult.Accept, ts);
        else context.setResult(PresentationContextResult.RejectTransferSyntaxesNotSupported);
      }
      this.sendAssociationAccept();
    }

    createStoreWritableStream(
      pc: { getAcceptedTransferSyntaxUid(): string | undefined },
      request: { getAffectedSopClassUid(): string; getAffectedSopInstanceUid(): string },
    ): Writable {
      const tmp = join(incoming, `${randomUUID()}.part`);
      this.partial.add(tmp);
      const fd = openSync(tmp, 'w');
      writeSync(
        fd,
        metaHeader(
          request.getAffectedSopClassUid(),
          request.getAffectedSopInstanceUid(),
          pc.getAcceptedTransferSyntaxUid() ?? TransferSyntax.ImplicitVRLittleEndian,
        ),
      );
      let bytes = 0;
      let closed = false;
      const finish = () => {
        if (closed) return;
        fsyncSync(fd);
        closeSync(fd);
        closed = true;
      };
      const w = new Writable({
        write(chunk: Buffer, _enc, done) {
          bytes += chunk.length;
          // Beyond the limit nothing more is written; the store is answered with a failure.
          if (bytes <= o.maxObjectBytes) writeSync(fd, chunk);
          done();
        },
        final(done) {
          finish();
          done();
        },
        destroy(err, done) {
          if (!closed) closeSync(fd);
          closed = true;
          done(err);
        },
      });
      Object.assign(w, { plumbline: { tmp, bytes: () => bytes, finish } });
      return w;
    }

    createDatasetFromStoreWritableStream(
      w: Writable,
      pc: { getAcceptedTransferSyntaxUid(): string | undefined },
      callback: (d: InstanceType<typeof Dataset>) => void,
    ): void {
      const d = new Dataset({}, pc.getAcceptedTransferSyntaxUid());
      Object.assign(d, { plumbline: (w as unknown as { plumbline: unknown }).plumbline });
      callback(d);
    }

    cEchoRequest(request: InstanceType<typeof dimse.requests.CEchoRequest>, callback: (r: InstanceType<typeof CEchoResponse>) => void): void {
      const r = CEchoResponse.fromRequest(request);
      r.setStatus(Status.Success);
      callback(r);
    }

    cStoreRequest(request: InstanceType<typeof dimse.requests.CStoreRequest>, callback: (r: InstanceType<typeof CStoreResponse>) => void): void {
      const r = CStoreResponse.fromRequest(request);
      const info = (request.getDataset() as unknown as { plumbline?: { tmp: string; bytes: () => number; finish: () => void } }).plumbline;
      try {
        if (!info) throw new InternalError('a stored object reached the receiver without its dataset');
        info.finish();
        if (info.bytes() > o.maxObjectBytes) {
          rmSync(info.tmp, { force: true });
          this.partial.delete(info.tmp);
          o.log(`refused an object of ${info.bytes()} bytes (limit ${o.maxObjectBytes})`);
          r.setStatus(REFUSED_OUT_OF_RESOURCES);
        } else {
          // Named by a random UUID and its sender: nothing in the object decides where a file goes.
          renameSync(info.tmp, join(o.inbox, receivedName(this.caller)));
          this.partial.delete(info.tmp);
          fsyncDirectory(o.inbox);
          r.setStatus(Status.Success);
          o.onStored?.();
        }
      } catch (e) {
        o.log(`could not store an object: ${(e as Error).message}`);
        r.setStatus(Status.ProcessingFailure);
      }
      callback(r);
    }

    associationReleaseRequested(): void {
      this.sendAssociationReleaseResponse();
    }

    /** The peer aborted: nothing of the object in progress is kept, and the connection is closed. */
    abort(): void {
      this.dropPartial();
      this.socket.destroy();
    }

    private dropPartial(): void {
      for (const f of this.partial) rmSync(f, { force: true });
      this.partial.clear();
    }
  }

  const server = net.createServer((socket) => {
    // Small PDUs and responses: without this, Nagle's algorithm and delayed acknowledgements cost ~40 ms per object.
    socket.setNoDelay(true);
    guard(socket, o);
    new StoreScp(socket);
  });
  return new Promise((resolvePromise, reject) => {
    server.once('error', reject);
    server.listen(o.port, o.host, () => {
      const address = server.address() as net.AddressInfo;
      o.log(`receiving as ${o.aeTitle} on ${o.host}:${address.port}`);
      resolvePromise({ port: address.port, close: () => new Promise((done) => server.close(() => done())) });
    });
  });
}

/**
 * Before the network library sees a byte: a PDU declaring more than the limit closes the association
 * from its 6-byte header (the library would buffer whatever length is declared), and so does silence.
 */
function guard(socket: net.Socket, o: ReceiverOptions): void {
  const pdus = new PduGuard(o.maxPduBytes ?? DEFAULT_MAX_PDU_BYTES);
  socket.prependListener('data', (chunk: Buffer) => {
    const length = pdus.tooLong(chunk);
    if (length === undefined || socket.destroyed) return;
    o.log(`association from ${socket.remoteAddress} closed: a PDU declares ${length} bytes, more than ${o.maxPduBytes ?? DEFAULT_MAX_PDU_BYTES}`);
    socket.destroy();
  });
  socket.setTimeout((o.idleSeconds ?? DEFAULT_IDLE_SECONDS) * 1000, () => {
    o.log(`association from ${socket.remoteAddress} closed: silent for ${o.idleSeconds ?? DEFAULT_IDLE_SECONDS} s`);
    socket.destroy();
  });
}

/** dcmtk's and most senders' PDUs are 16 KB to 128 KB; 4 MiB leaves room and bounds what one header can demand. */
const DEFAULT_MAX_PDU_BYTES = 4 * 1024 ** 2;
const DEFAULT_IDLE_SECONDS = 60;

/** So the rename itself survives a crash. */
function fsyncDirectory(dir: string): void {
  const fd = openSync(dir, 'r');
  try {
    fsyncSync(fd);
  } finally {
    closeSync(fd);
  }
}

/** The Part-10 preamble, "DICM" and file meta group (explicit VR little endian, PS3.10 7.1). */
function metaHeader(sopClass: string, sopInstance: string, transferSyntax: string): Buffer {
  const element = (e: number, vr: string, value: Buffer) => {
    const padded = value.length % 2 ? Buffer.concat([value, Buffer.from(vr === 'UI' ? '\0' : ' ')]) : value;
    const long = vr === 'OB';
    const h = Buffer.alloc(long ? 12 : 8);
    h.writeUInt16LE(0x0002, 0);
    h.writeUInt16LE(e, 2);
    h.write(vr, 4, 'ascii');
    if (long) h.writeUInt32LE(padded.length, 8);
    else h.writeUInt16LE(padded.length, 6);
    return Buffer.concat([h, padded]);
  };
  const body = Buffer.concat([
    element(0x0001, 'OB', Buffer.from([0, 1])),
    element(0x0002, 'UI', Buffer.from(sopClass)),
    element(0x0003, 'UI', Buffer.from(sopInstance)),
    element(0x0010, 'UI', Buffer.from(transferSyntax)),
    element(0x0012, 'UI', Buffer.from(IMPLEMENTATION_UID)),
    element(0x0013, 'SH', Buffer.from(IMPLEMENTATION_NAME)),
  ]);
  const length = Buffer.alloc(4);
  length.writeUInt32LE(body.length);
  return Buffer.concat([Buffer.alloc(128), Buffer.from('DICM'), element(0x0000, 'UL', length), body]);
}
