// Count intervals: Garwood exact Poisson, quasi-Poisson, index-of-dispersion test — against the shared
// check values (evidence beside each) and scipy (stats-counts.json, `python3 test/fixtures/stats-fixtures.py`).
import { describe, expect, it } from 'vitest';
import type { Sided } from '../../../src/model/types.ts';
import { dispersionIndexTest } from '../../../src/stats/dispersion-index-test.ts';
import { garwoodInterval } from '../../../src/stats/garwood-poisson-interval.ts';
import { quasiPoissonInterval } from '../../../src/stats/quasi-poisson-interval.ts';
import { RunningSummary } from '../../../src/stats/running-summary.ts';
import fx from '../../fixtures/stats-counts.json';

describe('Garwood exact Poisson', () => {
  it.each([
    [0, 0, 3.6889],
    [1, 0.0253, 5.5716],
    [3, 0.6187, 8.7673],
    [5, 1.6235, 11.6683],
    [10, 4.7954, 18.3904],
  ])(
    'T = %i → (%f, %f): Garwood 1936 table / Ulm 1990 [secondary for 0, 1, 3, 5; memory for 10]',
    (t, lo, up) => {
      const r = garwoodInterval(t, 1, 0.95, 'two');
      expect(Math.abs(r.lower - lo)).toBeLessThan(5e-5);
      expect(Math.abs(r.upper - up)).toBeLessThan(5e-5);
    },
  );
  it('total 36 in 20 plots, 90 %: (1.336558, 2.377037) per plot [derived]', () => {
    const r = garwoodInterval(36, 20, 0.9, 'two');
    expect(Math.abs(r.lower - 1.336558)).toBeLessThan(1e-6);
    expect(Math.abs(r.upper - 2.377037)).toBeLessThan(1e-6);
  });
  it.each(fx.cases.garwood)('T=$total level=$level vs scipy chi2.ppf [derived]', (c) => {
    const r = garwoodInterval(c.total, 1, c.level, 'two');
    expect(Math.abs(r.lower - c.garwood[0]!)).toBeLessThan(1e-8 * Math.max(1, c.garwood[0]!));
    expect(Math.abs(r.upper - c.garwood[1]!)).toBeLessThan(1e-8 * Math.max(1, c.garwood[1]!));
    const one = garwoodInterval(c.total, 1, c.level, 'upper');
    expect(Math.abs(one.upper - c.garwoodUpperOneSided)).toBeLessThan(
      1e-8 * Math.max(1, c.garwoodUpperOneSided),
    );
    expect(one.lower).toBe(0);
  });
  // Large totals (a count of plankton cells, a day of particle counts): the chi-square quantile at
  // 2·10^15 degrees of freedom. scipy 1.17.1 [derived]:
  //   python3 -c "from scipy import stats; T=1e10; print(stats.chi2.ppf(0.025, 2*T)/2, stats.chi2.ppf(0.975, 2*T+2)/2)"
  it.each([
    [1e6, 0.95, 998040.9833402939, 1001961.9119454322],
    [1e6, 0.99, 997426.0490212408, 1002578.7088640063],
    [1e10, 0.95, 9999804004.5487, 10000195998.345615],
    [1e10, 0.99, 9999742418.947945, 10000257585.808666],
    [1e15, 0.95, 999999938020497.8, 1000000061979505.1],
    [1e15, 0.99, 999999918545127.2, 1000000081454877.5],
  ])(
    'T = %d at %f: (%f, %f) within 1e-6 of the half-width, vs scipy chi2.ppf [derived]',
    (t, level, lo, up) => {
      const r = garwoodInterval(t, 1, level, 'two');
      const half = (up - lo) / 2;
      expect(Math.abs(r.lower - lo)).toBeLessThan(1e-6 * half);
      expect(Math.abs(r.upper - up)).toBeLessThan(1e-6 * half);
    },
  );
});

describe('quasi-Poisson', () => {
  it.each(fx.cases.quasiPoisson)('T=$total n=$n φ=$phi vs scipy norm.ppf [derived]', (c) => {
    const r = quasiPoissonInterval(c.total, c.n, c.phi, c.level, 'two');
    expect(Math.abs(r.lower - c.interval[0]!)).toBeLessThan(1e-9);
    expect(Math.abs(r.upper - c.interval[1]!)).toBeLessThan(1e-9);
  });
  it('reduces to a Poisson-width interval at φ = 1 and widens by ~√φ on the log scale', () => {
    const a = quasiPoissonInterval(100, 10, 1, 0.95, 'two');
    const b = quasiPoissonInterval(100, 10, 4, 0.95, 'two');
    expect(Math.log(b.upper / b.estimate) / Math.log(a.upper / a.estimate)).toBeCloseTo(2, 10);
  });
});

describe('index-of-dispersion test (Fisher 1950; Krebs 1999 ch. 6)', () => {
  it.each(fx.cases.dispersion)('counts $counts vs scipy chi2 [derived]', (c) => {
    const s = RunningSummary.of(c.counts);
    const r = dispersionIndexTest(s.n, s.mean, s.variance);
    expect(r.index).toBeCloseTo(c.index, 12);
    expect(r.statistic).toBeCloseTo(c.statistic, 10);
    expect(Math.abs(r.critical - c.critical)).toBeLessThan(1e-7);
    expect(r.overdispersed).toBe(c.pValue < 0.05);
  });
});

describe('invariants over a grid', () => {
  it('never negative, wider at higher confidence, contain the estimate', () => {
    for (const total of [0, 1, 4, 17, 250]) {
      for (const sided of ['two', 'upper', 'lower'] as Sided[]) {
        let prev = Number.NEGATIVE_INFINITY;
        for (const level of [0.6, 0.8, 0.9, 0.95, 0.99]) {
          for (const r of [
            garwoodInterval(total, 5, level, sided),
            quasiPoissonInterval(total, 5, 2.5, level, sided),
          ]) {
            expect(r.lower).toBeGreaterThanOrEqual(0);
            expect(r.lower).toBeLessThanOrEqual(r.estimate);
            expect(r.upper).toBeGreaterThanOrEqual(r.estimate);
          }
          const g = garwoodInterval(total, 5, level, sided);
          const w = sided === 'lower' ? -g.lower : g.upper - g.lower;
          expect(w).toBeGreaterThanOrEqual(prev);
          prev = w;
        }
      }
    }
  });
});
