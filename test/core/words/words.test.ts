/**
 * The one module of words (src/words): digits, levels, units and targets as a person reads them.
 * Sources: JCGM 100:2008 (GUM) §7.2.2 and §7.2.6 — an uncertainty is quoted with at most two significant
 * digits and the estimate to the same decimal place (its example: m = 100.021 47 g with u = 0.35 mg);
 * the SI Brochure (BIPM, 9th edition, 2019) — a space between the number and %. Evidence: read.
 */
import { describe, expect, it } from 'vitest';
import type { StudySetup } from '../../../src/model/records.ts';
import type { Assessment } from '../../../src/model/types.ts';
import {
  CAUTIONS,
  checkedLevelWords,
  confidenceWords,
  decimalsFor,
  entryWords,
  estimateWords,
  fixed,
  intervalWords,
  kindWords,
  levelWords,
  methodWords,
  moreWords,
  readable,
  shownNumbers,
  targetWords,
} from '../../../src/words/index.ts';

const base = { level: 0.95, sided: 'two', rule: 'standard', min: 10 } as const;
const measurement: StudySetup = { ...base, kind: 'measurement', unit: 'mg/kg' };
const count: StudySetup = { ...base, kind: 'count', plotArea: 0.25, plotAreaUnit: 'm2' };
const passFail: StudySetup = { ...base, kind: 'pass-fail', outcomeName: 'cracked weld' };

function assessment(over: Partial<Assessment>): Assessment {
  return {
    kind: 'measurement',
    n: 20,
    estimate: null,
    lower: null,
    upper: null,
    level: 0.95,
    sided: 'two',
    method: 't',
    methodLabel: 'Student t, 95 % two-sided',
    verdict: { status: 'keep going', reason: 'target-not-met', message: 'not yet' },
    more: null,
    details: {},
    warnings: [],
    ...over,
  };
}

describe('digits', () => {
  it('GUM §7.2.2: u = 0.35 mg on a mass in grams gives 5 decimals, 100.02147 g', () => {
    const d = decimalsFor(0.00035);
    expect(d).toBe(5);
    expect(fixed(100.02147, d)).toBe('100.02147');
    // two significant digits of the half-width, whatever its magnitude
    expect(decimalsFor(0.0168)).toBe(3);
    expect(decimalsFor(15.4)).toBe(0);
    expect(decimalsFor(null)).toBe(2);
  });
  it('the decimal separator is a parameter', () => {
    expect(fixed(12.5, 2, ',')).toBe('12,50');
    expect(
      shownNumbers(assessment({ estimate: 9.27851, lower: 9.26174, upper: 9.29528 }), measurement, ','),
    ).toEqual({ estimate: '9,279', interval: '9,262 to 9,295', unit: 'mg/kg' });
  });
  it('readable: four significant digits, an exponent outside everyday magnitudes', () => {
    expect(readable(12.34567)).toBe('12.35');
    expect(readable(0.000012346)).toBe('1.235e-5');
    expect(readable(null)).toBe('—');
  });
});

describe('levels (SI Brochure: "95 %", a space before the sign)', () => {
  it('whole, one decimal, and more only where one decimal would read 100 %', () => {
    expect(levelWords(0.95)).toBe('95 %');
    expect(levelWords(0.955)).toBe('95.5 %');
    expect(levelWords(0.935808)).toBe('93.6 %');
    expect(levelWords(0.9996)).toBe('99.96 %');
    expect(confidenceWords(0.9, 'upper')).toBe('90 %, one-sided upper bound');
  });
  it('a raised level inside the method label reads the same way', () => {
    const a = assessment({ methodLabel: 'Student t, 98.5808 % two-sided; stopping rule: standard' });
    expect(methodWords(a)).toBe('Student t, 98.6 % two-sided; stopping rule: standard');
  });
});

describe('pass/fail in percent of items', () => {
  it('estimate, interval, margin and limit', () => {
    // 3 cracked welds in 20 items: 3/20 = 15 %; Wilson 95 % interval 0.05237 to 0.36042
    // (scipy 1.17: binomtest(3, 20).proportion_ci(0.95, method='wilson'))
    const a = assessment({
      kind: 'pass-fail',
      estimate: 0.15,
      lower: 0.05236874589621662,
      upper: 0.3604188647407569,
    });
    expect(estimateWords(a, passFail)).toBe('15.0 % cracked weld');
    expect(intervalWords(a, passFail)).toBe('5.2 to 36.0 % cracked weld');
    expect(targetWords({ kind: 'margin', value: 0.05 }, passFail)).toBe('margin ± 5 percentage points');
    expect(targetWords({ kind: 'limit', value: 0.25, source: 'CA-7', date: '2026-05-01' }, passFail)).toBe(
      'limit 25 % cracked weld (CA-7, 2026-05-01)',
    );
  });
  it('a one-sided bound reads "at most", with enough decimals not to meet the limit', () => {
    const setup: StudySetup = { ...passFail, target: { kind: 'limit', value: 0.25 } };
    const a = assessment({ kind: 'pass-fail', sided: 'upper', estimate: 0.1, lower: null, upper: 0.24996 });
    expect(intervalWords(a, setup)).toBe('at most 24.996 % cracked weld');
  });
});

describe('units, kinds, entries, more', () => {
  it('measurement unit, per plot for counts', () => {
    expect(kindWords(measurement)).toBe('measurement in mg/kg');
    expect(kindWords(count)).toBe('count per plot (plot area 0.25 m2)');
    expect(targetWords({ kind: 'margin', value: 0.1 + 0.2 }, measurement)).toBe('margin ± 0.3 mg/kg');
    expect(targetWords({ kind: 'margin', value: 2 }, count)).toBe('margin ± 2 per plot');
    expect(targetWords({ kind: 'relative', value: 0.3 }, count)).toBe('within ± 30 % of the estimate');
    expect(targetWords(undefined, count)).toBe('no target (interval only)');
  });
  it('entries as stored', () => {
    const r = { id: 'x', studyId: 's', seq: 1, at: '2026-05-04T09:00:00Z', device: 'd' };
    expect(entryWords({ ...r, value: 0.5, censored: true }, measurement)).toBe('< 0.5 mg/kg');
    expect(entryWords({ ...r, value: 3 }, count)).toBe('3 per plot');
    expect(entryWords({ ...r, value: 0 }, passFail)).toBe('no cracked weld');
    expect(entryWords(r, passFail)).toBe('void');
  });
  it('more', () => {
    const more = { likely: 12, low: 8, high: 15 };
    expect(moreWords(assessment({ more }))).toBe('about 12 more (likely 8–15)');
    expect(moreWords(assessment({ more }), (k) => `${k * 2} min`)).toBe(
      'about 12 more (likely 8–15), about 24 min at your pace',
    );
    expect(moreWords(assessment({ more, verdict: { status: 'enough', message: '' } }))).toBeNull();
  });
  it('one cautions text', () => {
    expect(CAUTIONS[0]).toMatch(/^The tool gives statistical guidance only\./);
    expect(CAUTIONS).toHaveLength(4);
  });
});

describe('checkedLevelWords: the chosen confidence is the claim, and a wider checked level says why', () => {
  const setup: StudySetup = {
    kind: 'measurement',
    level: 0.95,
    sided: 'two',
    rule: 'standard',
    min: 10,
    unit: 'mg/L',
  };
  const at = (level: number) => ({ level }) as Assessment;
  it('says nothing when the interval is at the chosen level', () => {
    expect(checkedLevelWords(at(0.95), setup)).toBeNull();
  });
  it('names both levels, rounded as people say them, and the reason', () => {
    expect(checkedLevelWords(at(0.9554546501165561), setup)).toBe(
      'Your claim is 95 % confidence; the interval is checked at 95.5 % because the data are looked at after every entry.',
    );
    expect(checkedLevelWords(at(0.9554546501165561), setup, ',')).toContain('95,5 %');
  });
});
