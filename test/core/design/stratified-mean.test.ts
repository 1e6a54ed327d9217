// Stratified mean against Scheaffer, Mendenhall & Ott, Elementary Survey Sampling, Example 5.1 (evidence and
// tolerances in test/fixtures/design-stratified.json), plus invariants.
import { describe, expect, it } from 'vitest';
import { type StratumSummary, stratifiedMean } from '../../../src/design/stratified-mean.ts';
import fixture from '../../fixtures/design-stratified.json';

function summarise(values: number[]) {
  const n = values.length;
  const mean = values.reduce((a, b) => a + b, 0) / n;
  const variance = values.reduce((a, b) => a + (b - mean) ** 2, 0) / (n - 1);
  return { n, mean, variance };
}

describe('stratifiedMean — Scheaffer et al. Example 5.1 (TV hours, three strata)', () => {
  const strata: StratumSummary[] = fixture.strata.map((s) => ({
    name: s.name,
    weight: s.population,
    population: s.population,
    ...summarise(s.values),
  }));
  const r = stratifiedMean(strata);
  it('reproduces the printed stratum means and variances (data as recalled)', () => {
    strata.forEach((s, i) => {
      expect(Math.abs(s.mean - fixture.printed.means[i]!)).toBeLessThan(fixture.printed.tolerance.means_abs);
      expect(Math.abs(s.variance - fixture.printed.variances[i]!)).toBeLessThan(
        fixture.printed.tolerance.variances_abs,
      );
    });
  });
  it('reproduces the printed estimate, variance and bound', () => {
    if (r.status !== 'ok') throw new Error('expected ok');
    const t = fixture.printed.tolerance;
    expect(Math.abs(r.mean - fixture.printed.mean)).toBeLessThan(t.mean_abs);
    expect(Math.abs(r.variance - fixture.printed.variance)).toBeLessThan(t.variance_abs);
    expect(Math.abs(2 * r.se - fixture.printed.bound)).toBeLessThan(t.bound_abs);
  });
  it('matches the numpy recomputation, including the Satterthwaite df', () => {
    if (r.status !== 'ok') throw new Error('expected ok');
    const rel = fixture.derived.tolerance.rel;
    expect(r.mean).toBeCloseTo(fixture.derived.mean, 12);
    expect(Math.abs(r.variance / fixture.derived.variance - 1)).toBeLessThan(rel);
    expect(Math.abs(r.df! / fixture.derived.df - 1)).toBeLessThan(rel);
  });
});

describe('stratifiedMean — invariants and guards', () => {
  it('one stratum equals the simple mean and SE (s/√n, no FPC)', () => {
    const xs = [3.1, 4.7, 2.2, 5.9, 4.4, 3.8];
    const s = summarise(xs);
    const r = stratifiedMean([{ name: 'only', weight: 7, ...s }]);
    if (r.status !== 'ok') throw new Error('expected ok');
    expect(r.mean).toBeCloseTo(s.mean, 14);
    expect(r.se).toBeCloseTo(Math.sqrt(s.variance / s.n), 14);
    expect(r.df).toBeCloseTo(s.n - 1, 12);
  });
  it('weights are rescaled (area shares or sizes give the same answer)', () => {
    const a = stratifiedMean([
      { name: 'a', weight: 0.6, n: 3, mean: 2, variance: 1 },
      { name: 'b', weight: 0.4, n: 4, mean: 5, variance: 2 },
    ]);
    const b = stratifiedMean([
      { name: 'a', weight: 60, n: 3, mean: 2, variance: 1 },
      { name: 'b', weight: 40, n: 4, mean: 5, variance: 2 },
    ]);
    expect(a).toEqual(b);
  });
  it('names the strata with fewer than two entries', () => {
    const r = stratifiedMean([
      { name: 'a', weight: 1, n: 1, mean: 2, variance: 0 },
      { name: 'b', weight: 1, n: 5, mean: 5, variance: 2 },
      { name: 'c', weight: 1, n: 0, mean: 0, variance: 0 },
    ]);
    expect(r).toEqual({ status: 'too-few', strata: ['a', 'c'] });
  });
  it('throws on caller mistakes', () => {
    expect(() => stratifiedMean([])).toThrow(RangeError);
    expect(() => stratifiedMean([{ name: 'a', weight: 0, n: 3, mean: 1, variance: 1 }])).toThrow(
      /weight > 0/,
    );
    expect(() =>
      stratifiedMean([{ name: 'a', weight: 1, n: 3, mean: 1, variance: 1, population: 2 }]),
    ).toThrow(/population >= n/);
  });
});
