import zlib from 'node:zlib';
import dicomParser, { type DataSet } from 'dicom-parser';
import type { Issue, Result } from '../model/issue.js';
import { ATTRIBUTES } from './dictionary.js';
import { EXPLICIT_VR_LE, IMPLICIT_VR_LE, SUPPORTED_TRANSFER_SYNTAXES } from './transfer-syntax.js';

export interface ParsedDataset {
  readonly dataSet: DataSet;
  readonly transferSyntaxUid: string;
  readonly hasPart10Header: boolean;
}

export interface ParseOptions {
  /** Refuse a deflated dataset that inflates beyond this many bytes (a small file can expand enormously). */
  readonly maxInflatedBytes?: number;
  /** Stop at this tag (e.g. `x7fe00010`, the pixel data: its offset is known without reading it). */
  readonly untilTag?: string;
}

export type ParseOutcome = Result<ParsedDataset>;

const DEFAULT_MAX_INFLATED_BYTES = 256 * 1024 * 1024;

/** Tells dicom-parser each known attribute's VR in implicit VR, so sequences are never guessed. */
const VR_BY_TAG: ReadonlyMap<string, string> = new Map(Object.values(ATTRIBUTES).map((a) => [a.tag, a.vr] as const));
const vrCallback = (tag: string): string | undefined => VR_BY_TAG.get(tag);

const PREAMBLE_AND_PREFIX = 132;

/**
 * Parses DICOM bytes: a Part-10 file (preamble, "DICM", meta group), a meta group without the
 * preamble, or a bare dataset (implicit or explicit VR little endian, told apart by its first
 * element the way most readers do). Never throws: a failure is an issue naming what went wrong.
 */
export function parseDicomBytes(bytes: Uint8Array, file: string, options: ParseOptions = {}): ParseOutcome {
  const fail = (code: Issue['code'], message: string, extra: Partial<Issue> = {}): ParseOutcome => ({
    ok: false,
    issues: [{ severity: 'error', code, file, message, ...extra }],
  });
  const maxInflated = options.maxInflatedBytes ?? DEFAULT_MAX_INFLATED_BYTES;
  let inflateRefused = false;
  const inflater = (arr: Uint8Array, position: number): Uint8Array => {
    let body: Buffer;
    try {
      body = zlib.inflateRawSync(arr.subarray(position), { maxOutputLength: maxInflated });
    } catch (e) {
      inflateRefused = (e as { code?: string }).code === 'ERR_BUFFER_TOO_LARGE';
      throw e;
    }
    const out = new Uint8Array(position + body.length);
    out.set(arr.subarray(0, position));
    out.set(body, position);
    return out;
  };

  const layout = detectLayout(bytes);
  if (layout === 'unknown') {
    return fail('not-dicom', 'not a DICOM file: no "DICM" prefix at byte 128 and no recognisable dataset at the start', {
      expected: 'a DICOM Part-10 file or a bare DICOM dataset',
      found: `${bytes.length} bytes starting ${hexStart(bytes)}`,
    });
  }
  const input = layout === 'meta-without-preamble' ? withPreamble(bytes) : bytes;
  const hasPart10Header = layout === 'part10';
  const bareSyntax = layout === 'bare-explicit' ? EXPLICIT_VR_LE : IMPLICIT_VR_LE;

  let dataSet: DataSet;
  try {
    dataSet =
      layout === 'bare-implicit' || layout === 'bare-explicit'
        ? dicomParser.parseDicom(input, {
            TransferSyntaxUID: bareSyntax,
            vrCallback,
            inflater,
            ...(options.untilTag ? { untilTag: options.untilTag } : {}),
          } as never)
        : dicomParser.parseDicom(input, { vrCallback, inflater, ...(options.untilTag ? { untilTag: options.untilTag } : {}) } as never);
  } catch (e) {
    if (inflateRefused) {
      return fail('too-large', `deflated dataset inflates beyond the limit of ${maxInflated} bytes`);
    }
    return describeParseFailure(e, input, file);
  }

  const ts = layout === 'bare-implicit' || layout === 'bare-explicit' ? bareSyntax : dataSet.string('x00020010');
  if (!ts) {
    return fail('missing-attribute', 'the file meta information has no Transfer Syntax UID', {
      path: 'TransferSyntaxUID',
    });
  }
  if (!(ts in SUPPORTED_TRANSFER_SYNTAXES)) {
    return fail('unsupported-transfer-syntax', 'unsupported transfer syntax', {
      path: 'TransferSyntaxUID',
      expected: Object.keys(SUPPORTED_TRANSFER_SYNTAXES).join(', '),
      found: ts,
    });
  }
  return { ok: true, value: { dataSet, transferSyntaxUid: ts, hasPart10Header } };
}

type Layout = 'part10' | 'meta-without-preamble' | 'bare-implicit' | 'bare-explicit' | 'unknown';

function detectLayout(b: Uint8Array): Layout {
  if (b.length >= PREAMBLE_AND_PREFIX && ascii(b, 128, 4) === 'DICM') return 'part10';
  if (b.length < 8) return 'unknown';
  const group = b[0]! | (b[1]! << 8);
  const element = b[2]! | (b[3]! << 8);
  const vrLetters = isUpper(b[4]!) && isUpper(b[5]!);
  if (group === 0x0002 && vrLetters) return 'meta-without-preamble';
  // A bare dataset starts with a low standard group (0008 in practice) at an even group number.
  if (group === 0 || group > 0x0008 || group % 2 !== 0 || element > 0x1000) return 'unknown';
  return vrLetters ? 'bare-explicit' : 'bare-implicit';
}

function withPreamble(b: Uint8Array): Uint8Array {
  const out = new Uint8Array(PREAMBLE_AND_PREFIX + b.length);
  out.set([0x44, 0x49, 0x43, 0x4d], 128);
  out.set(b, PREAMBLE_AND_PREFIX);
  return out;
}

/** dicom-parser throws strings or `{ exception, dataSet }`; turn either into an actionable issue. */
function describeParseFailure(e: unknown, bytes: Uint8Array, file: string): ParseOutcome {
  const raw = e as { exception?: unknown; dataSet?: DataSet } | string | Error;
  const text = typeof raw === 'string' ? raw : raw instanceof Error ? raw.message : String(raw.exception ?? raw);
  const partial = typeof raw === 'object' && !(raw instanceof Error) ? raw.dataSet : undefined;
  const detail = text.replace(/^dicomParser\.[A-Za-z]+: /, '');
  const overrun = partial ? findOverrun(partial, bytes.length) : undefined;
  if (overrun) {
    return {
      ok: false,
      issues: [
        {
          severity: 'error',
          code: 'length-past-end',
          file,
          path: overrun.keyword,
          message:
            `element ${overrun.tagText} declares ${overrun.length} bytes from offset ${overrun.offset}, past the end of the file: ` +
            'the file is truncated or a length is corrupt',
          expected: `at most ${bytes.length - overrun.offset} bytes`,
          found: `${overrun.length}`,
        },
      ],
    };
  }
  const truncated = /past end|overread|maxPosition|end of buffer|eof/i.test(detail);
  return {
    ok: false,
    issues: [
      {
        severity: 'error',
        code: truncated ? 'truncated' : 'unreadable',
        file,
        // The parser's own words name its internals (function names, offsets): ours say what is wrong with the file.
        message: truncated
          ? `the file (${bytes.length} bytes) ends before the data it declares${lastElementText(partial)}`
          : `the dataset cannot be parsed: an element's tag, value representation or length is corrupt${lastElementText(partial)}`,
      },
    ],
  };
}

interface Overrun {
  readonly tagText: string;
  readonly keyword?: string;
  readonly offset: number;
  readonly length: number;
}

const KEYWORD_BY_TAG: ReadonlyMap<string, string> = new Map(Object.entries(ATTRIBUTES).map(([kw, a]) => [a.tag, kw] as const));

/** The first element (searched depth-first) whose declared length runs past the end of the bytes. */
function findOverrun(ds: DataSet, size: number): Overrun | undefined {
  for (const el of Object.values(ds.elements)) {
    if (!el.hadUndefinedLength && el.dataOffset + el.length > size) {
      const t = el.tag;
      const kw = KEYWORD_BY_TAG.get(t);
      return {
        tagText: `(${t.slice(1, 5).toUpperCase()},${t.slice(5).toUpperCase()})${kw ? ` ${kw}` : ''}`,
        ...(kw ? { keyword: kw } : {}),
        offset: el.dataOffset,
        length: el.length,
      };
    }
    for (const item of el.items ?? []) {
      const inner = item.dataSet ? findOverrun(item.dataSet, size) : undefined;
      if (inner) return inner;
    }
  }
  return undefined;
}

/** ", after (300A,00B0) BeamSequence": the last top-level element that was read, when known. */
function lastElementText(ds: DataSet | undefined): string {
  const els = ds ? Object.values(ds.elements).filter((e) => !e.tag.startsWith('x0002')) : [];
  if (els.length === 0) return '';
  const last = els.reduce((a, b) => (b.dataOffset > a.dataOffset ? b : a));
  const kw = KEYWORD_BY_TAG.get(last.tag);
  return `, inside or after element (${last.tag.slice(1, 5).toUpperCase()},${last.tag.slice(5).toUpperCase()})${kw ? ` ${kw}` : ''}`;
}

function ascii(b: Uint8Array, at: number, n: number): string {
  return String.fromCharCode(...b.subarray(at, at + n));
}
function isUpper(c: number): boolean {
  return c >= 0x41 && c <= 0x5a;
}
function hexStart(b: Uint8Array): string {
  return Array.from(b.subarray(0, 8), (x) => x.toString(16).padStart(2, '0')).join(' ');
}
