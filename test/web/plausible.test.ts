// The "keep it?" rules (web/app/plausible.ts): the modified z-score of Iglewicz & Hoaglin (1993, "How to
// Detect and Handle Outliers", ASQC Basic References in Quality Control 16, §3.3): M = 0.6745 (x − x̃) / MAD,
// potential outlier when |M| > 3.5. Expected values worked by hand [derived from the published formula].
import { describe, expect, it } from 'vitest';
import type { StudySetup } from '../../src/model/records.ts';
import { localeSeparator } from '../../web/app/number-style.ts';
import { expectedRange, modifiedZ, plausibilityQuestion } from '../../web/app/plausible.ts';

const lead: StudySetup = {
  kind: 'measurement',
  unit: 'mg/kg',
  level: 0.95,
  sided: 'two',
  rule: 'standard',
  min: 10,
};
const earlier = [2.1, 2.4, 2.6, 2.8, 3.0];

describe('modified z-score', () => {
  it('matches the published formula on a worked example', () => {
    // median 2.6; |x − 2.6| = 0.5, 0.2, 0, 0.2, 0.4 → sorted 0, 0.2, 0.2, 0.4, 0.5 → MAD 0.2
    // x = 9: 0.6745 × 6.4 / 0.2 = 21.584; x = 3.4: 0.6745 × 0.8 / 0.2 = 2.698
    expect(modifiedZ(9, earlier)).toBeCloseTo(21.584, 10);
    expect(modifiedZ(3.4, earlier)).toBeCloseTo(2.698, 10);
    // an even count: sorted 2.1, 2.2, 2.4, 2.6, 2.8, 2.9 → median 2.5; deviations sorted 0.1, 0.1, 0.3, 0.3,
    // 0.4, 0.4 → MAD 0.3; x = 4: 0.6745 × 1.5 / 0.3 = 3.3725 (inside 3.5)
    expect(modifiedZ(4, [2.1, 2.4, 2.6, 2.8, 2.9, 2.2])).toBeCloseTo(3.3725, 10);
  });
  it('gives the same hand-worked figure whatever the order of the earlier values', () => {
    // sorted 1, 2, 3, 4, 5, 6, 100 → median 4; deviations 3, 2, 1, 0, 1, 2, 96 → sorted 0, 1, 1, 2, 2, 3, 96
    // → MAD 2 (the far value does not move it); x = 20: 0.6745 × 16 / 2 = 5.396. The field screen passes
    // the values ascending (no sort on the tap path); the other orders take the sorting path.
    for (const xs of [
      [1, 2, 3, 4, 5, 6, 100],
      [100, 6, 5, 4, 3, 2, 1],
      [4, 100, 1, 6, 2, 5, 3],
    ])
      expect(modifiedZ(20, xs)).toBeCloseTo(5.396, 10);
    // the even example above, ascending: 2.1, 2.2, 2.4, 2.6, 2.8, 2.9 → 3.3725
    expect(modifiedZ(4, [2.1, 2.2, 2.4, 2.6, 2.8, 2.9])).toBeCloseTo(3.3725, 10);
  });
  it('needs five earlier values and some spread', () => {
    expect(modifiedZ(9, earlier.slice(0, 4))).toBeNull();
    expect(modifiedZ(9, [3, 3, 3, 3, 3, 4])).toBeNull(); // MAD 0: no scale
  });
});

describe('the question before saving', () => {
  it('asks beyond 3.5, not inside it; never for an ordinary value', () => {
    expect(plausibilityQuestion(9, lead, earlier)).toBe(
      '9 mg/kg is far above the 5 values so far (more than 3.5 modified z-scores from their median).',
    );
    expect(plausibilityQuestion(3.4, lead, earlier)).toBeNull();
    expect(plausibilityQuestion(-5, lead, earlier)).toMatch(/^-5 mg\/kg is far below/);
  });
  it('counts expect 0 to 10,000 per plot; percent measurements 0 to 100; a set range wins', () => {
    const counts: StudySetup = { ...lead, kind: 'count', unit: '1' };
    expect(expectedRange(counts)).toEqual({ low: 0, high: 10_000 });
    expect(plausibilityQuestion(100_000, counts, [])).toBe(
      '100000 per plot is above the expected highest value, 10000 per plot.',
    );
    expect(expectedRange({ ...lead, unit: '%' })).toEqual({ low: 0, high: 100 });
    expect(expectedRange(lead)).toEqual({});
    const set = { ...lead, expectedRange: { low: 0.5 } };
    expect(plausibilityQuestion(0.2, set, [], ',')).toBe(
      '0,2 mg/kg is below the expected lowest value, 0,5 mg/kg.',
    );
  });
});

describe('the phone locale decides the separator (ECMA-402 Intl.NumberFormat parts)', () => {
  it('German and French write a comma, English a point', () => {
    expect(localeSeparator('de-DE')).toBe(',');
    expect(localeSeparator('fr-FR')).toBe(',');
    expect(localeSeparator('en-US')).toBe('.');
    expect(localeSeparator('not a tag')).toBe('.');
  });
});
