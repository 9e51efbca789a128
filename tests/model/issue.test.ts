import { describe, expect, it } from 'vitest';
import { formatIssue } from '../../src/model/issue.js';

describe('an issue in words', () => {
  it('says where (file and line, beam, control point, attribute and tag), what, what was expected and found, and its code', () => {
    expect(
      formatIssue({
        severity: 'error',
        code: 'invalid-number',
        file: 'plan.dcm',
        beamNumber: 2,
        beamName: 'LAT',
        controlPointIndex: 0,
        path: 'BeamSequence[1].ControlPointSequence[0].GantryAngle',
        tag: '(300a,011e)',
        message: 'not a number',
        expected: 'a decimal string',
        found: '"abc"',
      }),
    ).toBe(
      'error: plan.dcm: beam 2 "LAT": control point 0: BeamSequence[1].ControlPointSequence[0].GantryAngle (300a,011e): not a number; ' +
        'expected a decimal string, found "abc" [invalid-number]',
    );
    expect(formatIssue({ severity: 'warning', code: 'rough-table', file: 'tmr.csv', line: 7, column: 3, message: 'a step' })).toBe(
      'warning: tmr.csv:7:3: a step [rough-table]',
    );
  });
});
