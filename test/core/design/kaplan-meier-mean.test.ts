// Kaplan–Meier mean/SD for left-censored data: USEPA (2009) Unified Guidance Example 15-1 (secondary, via the
// EnvStats reproduction) and an independent scipy implementation run once (test/fixtures/design-kaplan-meier.*).
import { describe, expect, it } from 'vitest';
import { kaplanMeierMean } from '../../../src/design/kaplan-meier-mean.ts';
import type { Point } from '../../../src/model/types.ts';
import fixture from '../../fixtures/design-kaplan-meier.json';

describe('kaplanMeierMean — USEPA 2009 Example 15-1 (ln manganese)', () => {
  const f = fixture.published;
  const points: Point[] = [
    ...f.detects.map((x) => ({ value: Math.log(x) })),
    ...f.limits.map((x) => ({ value: Math.log(x), censored: true })),
  ];
  it('mean and SD (divisor n) match the published figures', () => {
    const r = kaplanMeierMean(points);
    if (r.status !== 'ok') throw new Error('expected ok');
    expect(Math.abs(r.mean - f.mean)).toBeLessThan(f.tolerance.abs);
    expect(Math.abs(r.sd - f.sd)).toBeLessThan(f.tolerance.abs);
    expect(r.n).toBe(25);
    expect(r.share).toBeCloseTo(0.24, 12);
  });
});

describe('kaplanMeierMean — against scipy.stats.ecdf on flipped data', () => {
  it.each(fixture.scipy.cases)('case %#', (c) => {
    const r = kaplanMeierMean(c.values.map((v, i) => ({ value: v, censored: c.censored[i]! })));
    if (r.status !== 'ok') throw new Error('expected ok');
    expect(Math.abs(r.mean / c.mean - 1)).toBeLessThan(fixture.scipy.tolerance.rel);
    expect(Math.abs(r.sd / c.sd - 1)).toBeLessThan(fixture.scipy.tolerance.rel);
  });
});

describe('kaplanMeierMean — invariants', () => {
  it('without censoring equals the sample mean; sd has divisor n and sdSample divisor n − 1', () => {
    const xs = [1, 2, 3, 4, 7, 7, 2.5];
    const n = xs.length;
    const m = xs.reduce((a, b) => a + b, 0) / n;
    const ss = xs.reduce((a, b) => a + (b - m) ** 2, 0);
    const r = kaplanMeierMean(xs.map((value) => ({ value })));
    if (r.status !== 'ok') throw new Error('expected ok');
    expect(r.mean).toBeCloseTo(m, 13);
    expect(r.sd).toBeCloseTo(Math.sqrt(ss / n), 13);
    expect(r.sdSample).toBeCloseTo(Math.sqrt(ss / (n - 1)), 13);
    expect(r.se).toBeCloseTo(Math.sqrt(ss / (n - 1) / n), 13);
  });
  it('the mean lies between the all-zero and the all-at-limit substitutions', () => {
    const pts: Point[] = [
      { value: 1, censored: true },
      { value: 0.5, censored: true },
      { value: 0.8 },
      { value: 1.6 },
      { value: 2.4 },
      { value: 3.1 },
      { value: 0.9 },
    ];
    const r = kaplanMeierMean(pts);
    if (r.status !== 'ok') throw new Error('expected ok');
    const sum = (f: (p: Point) => number) => pts.reduce((a, p) => a + f(p), 0) / pts.length;
    expect(r.mean).toBeGreaterThanOrEqual(sum((p) => (p.censored ? 0 : p.value)));
    expect(r.mean).toBeLessThanOrEqual(sum((p) => p.value));
  });
  it('fewer than two detects: too-few, with the share of non-detects', () => {
    const r = kaplanMeierMean([{ value: 1, censored: true }, { value: 1, censored: true }, { value: 2 }]);
    expect(r.status).toBe('too-few');
    expect(r.share).toBeCloseTo(2 / 3, 12);
    expect(() => kaplanMeierMean([{ value: Number.NaN }])).toThrow(RangeError);
  });
});
