/**
 * A limit decision's verdict in words a field worker reads at a glance: worded as the decision it is, with
 * the limit and its unit, pass/fail limits in percent of items (SI Brochure, BIPM 9th edition 2019: a space
 * before %). The rule's own sentence (lines, statistics) is not part of these words. Evidence: read.
 */
import { describe, expect, it } from 'vitest';
import type { StudySetup } from '../../../src/model/records.ts';
import type { Assessment } from '../../../src/model/types.ts';
import { decisionWords, entryWords, otherOutcomeWords } from '../../../src/words/index.ts';

const base = { level: 0.95, sided: 'two', rule: 'standard', min: 10 } as const;
const fittings: StudySetup = {
  ...base,
  kind: 'pass-fail',
  outcomeName: 'loose fitting',
  target: { kind: 'limit', value: 0.1 },
};
const lead: StudySetup = {
  ...base,
  kind: 'measurement',
  unit: 'mg/kg',
  target: { kind: 'limit', value: 2.5 },
};

function a(verdict: Assessment['verdict']): Assessment {
  return {
    kind: 'pass-fail',
    n: 40,
    estimate: 0.02,
    lower: 0,
    upper: 0.08,
    level: 0.95,
    sided: 'upper',
    method: 'wilson',
    methodLabel: 'Wilson',
    verdict,
    more: null,
    details: {},
    warnings: [],
  };
}

describe('decisions', () => {
  it('below and above a limit read as decided, the limit with its unit', () => {
    const msg =
      'The bound is on one side of the limit (descriptive: use the limit decision for a tested answer).';
    expect(decisionWords(a({ status: 'below limit', message: msg }), fittings)).toBe(
      'Below the limit of 10 % loose fitting — decided.',
    );
    expect(decisionWords(a({ status: 'above limit', message: msg }), lead, ',')).toBe(
      'Above the limit of 2,5 mg/kg — decided.',
    );
    const open = decisionWords(
      a({ status: 'keep going', reason: 'undecided', message: 'S between lines' }),
      lead,
    );
    expect(open).toBe(
      'Not decided yet: the data do not yet show which side of the limit of 2.5 mg/kg it is.',
    );
    expect(open).not.toContain('descriptive');
  });
  it('the other result in the crew’s words, else "no" and the outcome', () => {
    expect(otherOutcomeWords(fittings)).toBe('no loose fitting');
    const latch: StudySetup = { ...fittings, outcomeName: 'fails to latch', otherOutcomeName: 'latches' };
    expect(otherOutcomeWords(latch)).toBe('latches');
    const r = { id: 'x', studyId: 's', seq: 1, at: '2026-01-01T00:00:00Z', device: 'd', value: 0 };
    expect(entryWords(r, latch)).toBe('latches');
  });
});
