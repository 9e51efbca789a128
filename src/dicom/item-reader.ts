import type { DataSet, Element } from 'dicom-parser';
import type { Issue, IssueCode, IssueSeverity } from '../model/issue.js';
import { printable } from '../model/printable.js';
import { parseNumberBytes } from './decimal-string.js';
import { ATTRIBUTES, type Keyword } from './dictionary.js';
import { isPlausible, PLAUSIBLE, plausibleText } from './plausible-values.js';

/** Where an item sits, for messages: the file, the attribute path, and the beam / control point. */
export interface Scope {
  readonly file: string;
  readonly path: string;
  readonly beamNumber?: number;
  readonly beamName?: string;
  readonly controlPointIndex?: number;
}

const BINARY_SIZE: Readonly<Record<string, number>> = { FL: 4, FD: 8, US: 2, SS: 2, UL: 4, SL: 4 };
const STRING_VRS = new Set(['AE', 'AS', 'CS', 'DA', 'DT', 'LO', 'LT', 'PN', 'SH', 'ST', 'TM', 'UC', 'UI', 'UR', 'UT']);

/**
 * Reads one dataset or sequence item by keyword, decoding each attribute by its VR (taken from the
 * element in explicit VR, from the generated dictionary in implicit VR). Values that cannot be read
 * faithfully are reported to the shared issue list and come back as undefined, never guessed.
 */
export class ItemReader {
  constructor(
    private readonly ds: DataSet,
    readonly scope: Scope,
    private readonly issues: Issue[],
    private readonly encoding: 'latin1' | 'utf8',
  ) {}

  /** A reader for the same item with more context (beam, control point) in its messages. */
  within(extra: Partial<Omit<Scope, 'file' | 'path'>>): ItemReader {
    return new ItemReader(this.ds, { ...this.scope, ...extra }, this.issues, this.encoding);
  }

  has(kw: Keyword): boolean {
    return this.ds.elements[ATTRIBUTES[kw].tag] !== undefined;
  }

  /**
   * Present with no value: zero-length (how DICOM writes an unknown type-2 attribute), or a text
   * value of nothing but padding (spaces, NULs), which says no more.
   */
  isEmpty(kw: Keyword): boolean {
    const el = this.ds.elements[ATTRIBUTES[kw].tag];
    if (!el) return false;
    if (el.length === 0) return true;
    return STRING_VRS.has(el.vr ?? ATTRIBUTES[kw].vr) && this.rawText(el).replace(/[\s\0\\]/g, '') === '';
  }

  string(kw: Keyword): string | undefined {
    return this.strings(kw)?.[0];
  }

  /** All values of a string attribute (backslash-separated), trimmed; undefined when absent or empty. */
  strings(kw: Keyword): string[] | undefined {
    const el = this.element(kw);
    if (!el) return undefined;
    const vr = el.vr ?? ATTRIBUTES[kw].vr;
    if (!STRING_VRS.has(vr)) {
      this.report('error', 'invalid-value', kw, `has VR ${vr}`, `VR ${ATTRIBUTES[kw].vr}`, vr);
      return undefined;
    }
    const raw = this.rawText(el);
    // LT, ST, UT keep backslashes and leading spaces; the others are multi-valued and padded.
    if (vr === 'LT' || vr === 'ST' || vr === 'UT') {
      const v = printable(raw.replace(/[\s\0]+$/, ''));
      return v ? [v] : undefined;
    }
    // Padding trimmed; any control character left (ESC, CR, a NUL inside) is shown, never passed on to a terminal.
    const values = raw.split('\\').map((v) => printable(v.replace(/^[ ]+|[\s\0]+$/g, '')));
    return values.length === 1 && values[0] === '' ? undefined : values;
  }

  number(kw: Keyword): number | undefined {
    const values = this.numbers(kw);
    if (values === undefined) return undefined;
    if (values.length !== 1) {
      this.report('error', 'wrong-multiplicity', kw, 'has the wrong number of values', '1 value', `${values.length}`);
      return undefined;
    }
    return values[0];
  }

  integer(kw: Keyword): number | undefined {
    const v = this.number(kw);
    if (v !== undefined && !Number.isInteger(v)) {
      this.report('error', 'invalid-number', kw, 'is not an integer', 'an integer', String(v));
      return undefined;
    }
    return v;
  }

  /** A numeric attribute with exactly `count` values (e.g. 3 for a point), else an issue. */
  tuple(kw: Keyword, count: number): number[] | undefined {
    const values = this.numbers(kw);
    if (values === undefined) return undefined;
    if (values.length !== count) {
      this.report('error', 'wrong-multiplicity', kw, 'has the wrong number of values', `${count} values`, `${values.length}`);
      return undefined;
    }
    return values;
  }

  /** All values of a numeric attribute (DS, IS or binary), each checked; undefined when absent or empty. */
  numbers(kw: Keyword): number[] | undefined {
    const el = this.element(kw);
    if (!el) return undefined;
    const vr = el.vr ?? ATTRIBUTES[kw].vr;
    if (vr === 'DS' || vr === 'IS') {
      const b = this.ds.byteArray;
      const parsed = parseNumberBytes(b, el.dataOffset, Math.min(el.dataOffset + el.length, b.length), vr === 'IS');
      if (parsed.ok) return this.plausible(kw, parsed.values);
      const where = parsed.count > 1 ? `value ${parsed.index + 1} of ${parsed.count}` : 'value';
      this.report(
        'error',
        'invalid-number',
        kw,
        `${where} cannot be read as a number`,
        vr === 'DS' ? 'a decimal string (DS)' : 'an integer string (IS)',
        JSON.stringify(parsed.text),
      );
      return undefined;
    }
    const size = BINARY_SIZE[vr];
    if (size === undefined) {
      this.report('error', 'invalid-value', kw, `has VR ${vr}, not a number`, `VR ${ATTRIBUTES[kw].vr}`, vr);
      return undefined;
    }
    if (el.length % size !== 0) {
      this.report('error', 'invalid-value', kw, `has a length not a multiple of ${size}`, `a multiple of ${size} bytes`, `${el.length}`);
      return undefined;
    }
    const tag = ATTRIBUTES[kw].tag;
    const read = { FL: this.ds.float, FD: this.ds.double, US: this.ds.uint16, SS: this.ds.int16, UL: this.ds.uint32, SL: this.ds.int32 }[
      vr as 'FL'
    ].bind(this.ds);
    const out: number[] = [];
    for (let i = 0; i < el.length / size; i++) {
      const v = read(tag, i);
      if (v === undefined || !Number.isFinite(v)) {
        this.report('error', 'invalid-number', kw, 'is not a finite number', 'a finite number', String(v));
        return undefined;
      }
      out.push(v);
    }
    return this.plausible(kw, out);
  }

  /** The values when each lies where a real plan's can (see plausible-values.ts), else an input error. */
  private plausible(kw: Keyword, values: number[]): number[] | undefined {
    const p = PLAUSIBLE[kw];
    const bad = p ? values.findIndex((v) => !isPlausible(v, p)) : -1;
    if (bad < 0) return values;
    const where = values.length > 1 ? `value ${bad + 1} of ${values.length}` : 'the value';
    this.report('error', 'physical-range', kw, `${where} is outside what a treatment can hold`, plausibleText(p!), `${values[bad]}`);
    return undefined;
  }

  /** The items of a sequence; an absent or empty sequence gives []. */
  sequence(kw: Keyword): ItemReader[] {
    const el = this.ds.elements[ATTRIBUTES[kw].tag];
    if (!el || el.length === 0) return [];
    if (!el.items) {
      this.report('error', 'invalid-value', kw, 'is not a sequence', 'a sequence of items', `VR ${el.vr ?? 'unknown'}`);
      return [];
    }
    return el.items.map((item, i) => {
      const path = `${this.scope.path ? `${this.scope.path}.` : ''}${kw}[${i}]`;
      if (!item.dataSet) {
        this.report('error', 'unreadable', kw, `item ${i} has no content`);
        return new ItemReader({ elements: {} } as DataSet, { ...this.scope, path }, this.issues, this.encoding);
      }
      return new ItemReader(item.dataSet, { ...this.scope, path }, this.issues, this.encoding);
    });
  }

  /** Records an issue about attribute `kw` of this item (or about the item itself when kw is undefined). */
  report(severity: IssueSeverity, code: IssueCode, kw: Keyword | undefined, message: string, expected?: string, found?: string): void {
    const { file, path, beamNumber, beamName, controlPointIndex } = this.scope;
    const fullPath = kw ? `${path ? `${path}.` : ''}${kw}` : path;
    // An attribute read twice (required, then carried) is one problem, said once.
    if (this.issues.some((i) => i.path === fullPath && i.code === code && i.message === message && i.file === file)) return;
    const tag = kw ? ATTRIBUTES[kw].tag : undefined;
    const tagText = tag ? `(${tag.slice(1, 5).toUpperCase()},${tag.slice(5).toUpperCase()})` : undefined;
    this.issues.push({
      severity,
      code,
      file,
      ...(fullPath ? { path: fullPath } : {}),
      ...(tagText ? { tag: tagText } : {}),
      ...(beamNumber !== undefined ? { beamNumber } : {}),
      ...(beamName !== undefined ? { beamName } : {}),
      ...(controlPointIndex !== undefined ? { controlPointIndex } : {}),
      ...(expected !== undefined ? { expected } : {}),
      ...(found !== undefined ? { found } : {}),
      message,
    });
  }

  /** The element, or undefined when absent or zero-length (an empty type-2 value). */
  private element(kw: Keyword): Element | undefined {
    const el = this.ds.elements[ATTRIBUTES[kw].tag];
    return el && el.length > 0 ? el : undefined;
  }

  private rawText(el: Element): string {
    const b = this.ds.byteArray;
    const end = Math.min(el.dataOffset + el.length, b.length);
    // Buffer decoding is much faster than TextDecoder for the short values of a plan.
    const buf = Buffer.isBuffer(b) ? b : Buffer.from(b.buffer, b.byteOffset, b.byteLength);
    return buf.toString(this.encoding, el.dataOffset, end);
  }
}

/**
 * Reports a missing attribute unless it was present but unreadable (already reported).
 * Returns the value so calls read as `need(r, 'BeamMeterset', r.number('BeamMeterset'), '…')`.
 */
export function need<T>(r: ItemReader, kw: Keyword, value: T | undefined, expected: string, severity: IssueSeverity = 'error'): T | undefined {
  if (value === undefined && !r.has(kw)) {
    r.report(severity, 'missing-attribute', kw, 'is missing', expected);
  } else if (value === undefined && r.isEmpty(kw)) {
    r.report(severity, 'empty-attribute', kw, 'is empty', expected);
  }
  return value;
}

/** A coded string checked against its allowed values; anything else is reported and dropped. */
export function oneOf<T extends string>(r: ItemReader, kw: Keyword, allowed: readonly T[], severity: IssueSeverity = 'error'): T | undefined {
  const v = r.string(kw);
  if (v === undefined) return undefined;
  if ((allowed as readonly string[]).includes(v)) return v as T;
  r.report(severity, 'invalid-value', kw, 'has a value the standard does not define here', allowed.join(', '), JSON.stringify(v));
  return undefined;
}
