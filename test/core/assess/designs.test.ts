// Design-based estimates through the one pipeline: dispatch and verdict conventions. Numbers are checked against the estimator files (whose own
// tests carry the published sources) and against scipy where a new figure appears:
// python3 -c "from scipy import stats; print(stats.t.ppf(0.975, 21.089612008024652))" → 2.0790759231652784
import { describe, expect, it } from 'vitest';
import { assess, strataProgress } from '../../../src/assess/index.ts';
import type { AnalysisSetup, Point } from '../../../src/model/types.ts';
import { studentTInterval } from '../../../src/stats/student-t-interval.ts';
import fixture from '../../fixtures/design-stratified.json';

const base: AnalysisSetup = { kind: 'measurement', level: 0.95, sided: 'two', rule: 'naive', min: 4 };

describe('assessDesign — strata', () => {
  const setup: AnalysisSetup = {
    ...base,
    strata: fixture.strata.map((s) => ({ name: s.name, weight: s.population, population: s.population })),
  };
  const points: Point[] = fixture.strata.flatMap((s) =>
    s.values.map((value) => ({ value, stratum: s.name })),
  );
  it('gives the stratified mean with a Satterthwaite t interval (Scheaffer Example 5.1)', () => {
    const a = assess(points, setup);
    expect(a.method).toBe('stratified-t');
    expect(a.estimate).toBeCloseTo(fixture.derived.mean, 12);
    // t(0.975, 21.0896…) from scipy (rel 2e-6 allowed for the jstat quantile)
    const h = 2.0790759231652784 * Math.sqrt(fixture.derived.variance);
    expect(Math.abs((a.upper! - a.estimate!) / h - 1)).toBeLessThan(2e-6);
    expect(a.details['stratum.town B.n']).toBe(8);
    expect(typeof a.details.whereNext).toBe('string');
  });
  it('one stratum equals the simple Student t interval', () => {
    const xs = [3.1, 4.7, 2.2, 5.9, 4.4, 3.8];
    const a = assess(
      xs.map((value) => ({ value, stratum: 'all' })),
      { ...base, strata: [{ name: 'all', weight: 1 }] },
    );
    const m = xs.reduce((p, q) => p + q, 0) / xs.length;
    const sd = Math.sqrt(xs.reduce((p, q) => p + (q - m) ** 2, 0) / (xs.length - 1));
    const t = studentTInterval({ n: xs.length, mean: m, sd }, 0.95, 'two');
    expect(a.lower).toBeCloseTo(t.lower, 10);
    expect(a.upper).toBeCloseTo(t.upper, 10);
  });
  it('keeps going until every stratum has two entries, and says where next', () => {
    const s: AnalysisSetup = {
      ...base,
      min: 2,
      target: { kind: 'margin', value: 1 },
      strata: [
        { name: 'woodland', weight: 0.6 },
        { name: 'meadow', weight: 0.4 },
      ],
    };
    const a = assess(
      [
        { value: 3, stratum: 'woodland' },
        { value: 4, stratum: 'woodland' },
        { value: 5, stratum: 'meadow' },
      ],
      s,
    );
    expect(a.verdict.status === 'keep going' && a.verdict.reason).toBe('below-minimum');
    expect(a.verdict.message).toMatch(/meadow/);
    expect(a.details.whereNext).toBe('meadow');
    const p = strataProgress([{ value: 3, stratum: 'woodland' }], s);
    expect(p.map((x) => [x.name, x.n, x.ready])).toEqual([
      ['woodland', 1, false],
      ['meadow', 0, false],
    ]);
  });
  it('a cost per stratum changes the suggestion', () => {
    const pts: Point[] = [
      ...[1, 2, 3, 4].map((value) => ({ value, stratum: 'a' })),
      ...[1, 5, 9, 13].map((value) => ({ value, stratum: 'b' })),
    ];
    const cheap = assess(pts, {
      ...base,
      strata: [
        { name: 'a', weight: 0.5 },
        { name: 'b', weight: 0.5 },
      ],
    });
    const dear = assess(pts, {
      ...base,
      strata: [
        { name: 'a', weight: 0.5 },
        { name: 'b', weight: 0.5, cost: 50 },
      ],
    });
    expect(cheap.details.whereNext).toBe('b');
    expect(dear.details.whereNext).toBe('a');
  });
});

describe('assessDesign — primary units', () => {
  it('uses the transects as replicates, reports the design effect and warns', () => {
    const transects = [
      [2, 3, 2, 3],
      [8, 9, 8],
      [4, 5, 4, 5, 4],
      [10, 11, 10, 12],
      [6, 6, 7],
    ];
    const pts: Point[] = transects.flatMap((q, i) => q.map((value) => ({ value, cluster: `T${i + 1}` })));
    const a = assess(pts, { ...base, kind: 'count' });
    expect(a.method).toBe('cluster-ratio-t');
    expect(a.details.primaryUnits).toBe(5);
    expect(a.details.designEffect as number).toBeGreaterThan(2);
    expect(a.warnings.join(' ')).toMatch(/not independent/);
    const total = pts.reduce((p, q) => p + q.value, 0);
    expect(a.estimate).toBeCloseTo(total / pts.length, 12);
  });
});

describe('assessDesign — composites', () => {
  it('one composite: no bound, and says so', () => {
    const a = assess([{ value: 120 }], { ...base, sided: 'upper', design: 'composite' });
    expect(a.upper).toBeNull();
    expect(a.verdict.message).toMatch(/single composite/);
  });
  it('three composites: the upper bound is the t-UCL (or Chebyshev on request), decided against a limit', () => {
    const pts = [{ value: 152 }, { value: 174 }, { value: 131 }];
    const s: AnalysisSetup = {
      ...base,
      sided: 'upper',
      design: 'composite',
      target: { kind: 'limit', value: 250 },
    };
    const t = assess(pts, s);
    expect(t.upper).toBeCloseTo(t.details.tUcl as number, 9);
    expect(t.verdict.status).toBe('below limit');
    const c = assess(pts, { ...s, method: 'chebyshev' });
    expect(c.upper).toBeCloseTo(c.details.chebyshevUcl as number, 9);
  });
});

describe('assessDesign — non-detects', () => {
  const some: Point[] = [
    { value: 0.5, censored: true },
    { value: 1.2 },
    { value: 0.8 },
    { value: 2.5 },
    { value: 1.0, censored: true },
    { value: 3.1 },
  ];
  it('Kaplan–Meier by default, with the share of non-detects', () => {
    const a = assess(some, base);
    expect(a.method).toBe('kaplan-meier-t');
    expect(a.details.nonDetectShare).toBeCloseTo(2 / 6, 12);
    expect(a.warnings[0]).toMatch(/non-detects \(33 %\)/);
  });
  it('above half non-detects: a mean is not supportable', () => {
    const many: Point[] = [...some, ...[1, 1, 1].map((value) => ({ value, censored: true }))];
    const a = assess(many, { ...base, target: { kind: 'limit', value: 5 } });
    expect(a.verdict.status === 'keep going' && a.verdict.reason).toBe('not-supportable');
    expect(a.estimate).toBeNull();
    expect(a.more).toBeNull();
  });
  it('warns when a reporting limit is at or above the decision limit', () => {
    const a = assess(some, { ...base, target: { kind: 'limit', value: 1.0 } });
    expect(a.warnings.join(' ')).toMatch(/at or above the decision limit/);
  });
  it('half the limit only when chosen, and labelled', () => {
    const a = assess(some, { ...base, nonDetects: 'half-limit' });
    expect(a.warnings.join(' ')).toMatch(/^SUBSTITUTION|SUBSTITUTION/);
    expect(a.details.substituted).toBe(2);
    expect(a.method).toBe('half-limit-t');
    expect(a.methodLabel).toMatch(/substitution/);
  });
  it('a design-based estimate takes over for strata, composites, primary units and non-detects', () => {
    const two = (p: Partial<Point>) => [{ value: 1 }, { value: 2, ...p }];
    const design = (points: Point[], setup: AnalysisSetup) => assess(points, setup).details.design;
    expect(design(two({}), base)).toBeUndefined();
    expect(design(two({ censored: true }), base)).toBe('kaplan-meier-t');
    expect(design(two({ cluster: 'T1' }), base)).toBe('cluster-ratio-t');
    expect(design(two({}), { ...base, design: 'composite' })).toBe('composite-t');
    expect(design(two({ stratum: 'a' }), { ...base, strata: [{ name: 'a', weight: 1 }] })).toBe(
      'stratified-t',
    );
  });
});
