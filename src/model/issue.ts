/**
 * A problem found in an input, phrased so a user can act on it: where (file, beam, control point,
 * attribute path), what was expected and what was found. Errors stop a reading; warnings do not.
 */
export type IssueSeverity = 'error' | 'warning';

export type IssueCode =
  | 'not-dicom'
  | 'not-rt-plan'
  | 'unsupported-transfer-syntax'
  | 'truncated'
  | 'length-past-end'
  | 'too-large'
  | 'missing-attribute'
  | 'empty-attribute'
  | 'invalid-number'
  | 'invalid-value'
  | 'wrong-multiplicity'
  | 'unknown-reference'
  | 'duplicate'
  | 'meterset-weight-decreasing'
  | 'jaws-crossed'
  | 'leaves-crossed'
  | 'inconsistent'
  | 'unreadable'
  | 'out-of-range'
  | 'missing-table'
  | 'invalid-table'
  | 'invalid-manifest'
  | 'invalid-option'
  | 'physical-range'
  | 'rough-table'
  | 'tables-disagree';

export interface Issue {
  readonly severity: IssueSeverity;
  readonly code: IssueCode;
  readonly file?: string;
  /** Attribute path in the dataset, e.g. `BeamSequence[1].ControlPointSequence[0].NominalBeamEnergy`. */
  readonly path?: string;
  /** The attribute's tag, `(gggg,eeee)`, when the issue is about one attribute. */
  readonly tag?: string;
  readonly beamNumber?: number;
  readonly beamName?: string;
  readonly controlPointIndex?: number;
  /** 1-based line and column in a text file (CSV, JSON), when known. */
  readonly line?: number;
  readonly column?: number;
  readonly expected?: string;
  readonly found?: string;
  readonly message: string;
}

/** A step that can refuse: its value (with any warnings that travel with it), or the issues that refuse it. */
export type Result<T> = { readonly ok: true; readonly value: T; readonly warnings?: readonly Issue[] } | Refused;

/** The issues that refuse a step's input; never empty. */
export interface Refused {
  readonly ok: false;
  readonly issues: readonly Issue[];
}

/** One line per issue, for stderr: file, beam, control point, attribute, message, expected vs found. */
export function formatIssue(issue: Omit<Issue, 'code'> & { readonly code: string }): string {
  const where: string[] = [];
  if (issue.file) {
    where.push(issue.line !== undefined ? `${issue.file}:${issue.line}${issue.column !== undefined ? `:${issue.column}` : ''}` : issue.file);
  }
  if (issue.beamNumber !== undefined) {
    where.push(`beam ${issue.beamNumber}${issue.beamName ? ` "${issue.beamName}"` : ''}`);
  }
  if (issue.controlPointIndex !== undefined) where.push(`control point ${issue.controlPointIndex}`);
  if (issue.path) where.push(issue.tag ? `${issue.path} ${issue.tag}` : issue.path);
  let text = `${issue.severity}: ${where.join(': ')}${where.length ? ': ' : ''}${issue.message}`;
  if (issue.expected !== undefined) text += `; expected ${issue.expected}`;
  if (issue.found !== undefined) text += `, found ${issue.found}`;
  return `${text} [${issue.code}]`;
}
