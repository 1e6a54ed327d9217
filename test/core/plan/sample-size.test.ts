// Planning formulas against worked figures from the published formulas (source and evidence beside each)
// and scipy (stats-plan.json, `python3 test/fixtures/stats-fixtures.py`).
import { describe, expect, it } from 'vitest';
import { adjustedExcessKurtosis, boxVarianceDf } from '../../../src/plan/box-variance-df.ts';
import { sigmaQuantile } from '../../../src/plan/chi-square-sigma-limits.ts';
import { countSampleSize } from '../../../src/plan/count-sample-size.ts';
import { fixedPointSampleSize } from '../../../src/plan/fixed-point-sample-size.ts';
import { kupperHafnerSampleSize } from '../../../src/plan/kupper-hafner-assurance.ts';
import { logScaleRelativeSampleSize } from '../../../src/plan/log-scale-relative-sample-size.ts';
import { projectMeasurement } from '../../../src/plan/measurement-projection.ts';
import { proportionSampleSize, zeroAcceptanceSampleSize } from '../../../src/plan/proportion-sample-size.ts';
import fx from '../../fixtures/stats-plan.json';

describe('t fixed point n = (t₍n−1₎σ/d)² (Cochran 1977 §4.4)', () => {
  it('σ = 1, d = 0.25, 0.5, 0.75, 1 → 63.898, 17.832, 9.326, 6.353 (shared check values) [derived]', () => {
    const want = [63.897899, 17.832337, 9.325967, 6.352717];
    [0.25, 0.5, 0.75, 1].forEach((d, i) => {
      expect(Math.abs(fixedPointSampleSize(1, d, 0.975) - want[i]!) / want[i]!).toBeLessThan(2e-5);
    });
  });
  it.each(fx.cases.fixedPoint)('σ=$sigma d=$d p=$p vs scipy brentq [derived]', (c) => {
    expect(Math.abs(fixedPointSampleSize(c.sigma, c.d, c.p) - c.n) / c.n).toBeLessThan(2e-5);
  });
  it('with a population: n = n₀/(1 + n₀/N), never above N', () => {
    const n = fixedPointSampleSize(1, 0.1, 0.975, 200);
    expect(n).toBeLessThan(200);
    const n0 = fixedPointSampleSize(1, 0.1, 0.975);
    expect(n).toBeLessThan(n0);
    expect(fixedPointSampleSize(10, 0.01, 0.975, 50)).toBeLessThanOrEqual(50);
  });
  it('monotone: more for a tighter target, more for a larger σ', () => {
    let prev = 0;
    for (const d of [2, 1, 0.5, 0.2, 0.1, 0.05]) {
      const n = fixedPointSampleSize(1, d, 0.975);
      expect(n).toBeGreaterThanOrEqual(prev);
      prev = n;
    }
  });
});

describe('Kupper & Hafner (1989) assurance', () => {
  it('d/σ = 0.5, 95 %: γ = 0.5, 0.8, 0.9, 0.95 → 18, 22, 24, 26 (shared check values) [derived]', () => {
    expect([0.5, 0.8, 0.9, 0.95].map((g) => kupperHafnerSampleSize(1, 0.5, 0.975, g))).toEqual([
      18, 22, 24, 26,
    ]);
  });
  it('d/σ = 0.25: γ = 0.8 → 73, γ = 0.9 → 77, γ = 0.95 → 81 (Kupper & Hafner 1989) [derived]', () => {
    expect([0.8, 0.9, 0.95].map((g) => kupperHafnerSampleSize(1, 0.25, 0.975, g))).toEqual([73, 77, 81]);
  });
  it.each(fx.cases.kupperHafner)('σ=$sigma d=$d γ=$gamma vs scipy search [derived]', (c) => {
    expect(kupperHafnerSampleSize(c.sigma, c.d, c.p, c.gamma)).toBe(c.n);
  });
});

describe('likely range from the chi-square distribution of σ (src/plan/README.md)', () => {
  it.each(fx.cases.sigmaQuantile)('s=$s n=$n q=$q vs scipy [derived]', (c) => {
    expect(sigmaQuantile(c.s, c.n, c.q)).toBeCloseTo(c.sigma, 8);
  });
  // σ at the 50th, 10th, 90th and 80th percentile of its chi-square confidence distribution (7 df), each into
  // the fixed point n = (t₍0.975, n−1₎·σ/d)² (Cochran 1977 §4.4) and, at the 80th, Kupper & Hafner's (1989)
  // 80 %-assured n (Browne 1995: the pilot SD's upper limit), computed by scipy 1.17 with brentq and a count
  // up: likely 19.4131, low 11.4373, high 40.4079, assured 37 [derived]
  it('n = 8, s = 2, d = 1: likely 19.4, range 11.4–40.4, assured 37 (scipy) [derived]', () => {
    const r = projectMeasurement({ n: 8, s: 2, d: 1, p: 0.975 });
    expect(r.likely).toBeCloseTo(19.4131, 2);
    expect(r.low).toBeCloseTo(11.4373, 2);
    expect(r.high).toBeCloseTo(40.4079, 2);
    expect(r.assured).toBe(37);
  });
  it('heavy tails widen the range by Box’s degrees of freedom (ν = 2/(2/7 + 6/8) = 1.93 for g₂ = 6)', () => {
    const normal = projectMeasurement({ n: 8, s: 2, d: 1, p: 0.975 });
    const heavy = projectMeasurement({ n: 8, s: 2, d: 1, p: 0.975, kurtosis: 6 });
    expect(heavy.high).toBeGreaterThan(normal.high);
    expect(heavy.low).toBeLessThan(normal.low);
    // light tails are not credited
    expect(projectMeasurement({ n: 8, s: 2, d: 1, p: 0.975, kurtosis: -1.5 })).toEqual(normal);
  });
});

describe('counts (Krebs 1999 ch. 7; Elliott 1977; Karandinos 1976)', () => {
  it('NB m = 2, k = 0.5: D = 0.25 → 40; r = 0.25 at 95 % → 153.7 (Krebs 1999 ch. 7) [derived]', () => {
    const nb = { kind: 'negative-binomial', k: 0.5 } as const;
    expect(countSampleSize({ m: 2, variance: nb, target: 'precision', value: 0.25 })).toBeCloseTo(40, 10);
    expect(countSampleSize({ m: 2, variance: nb, target: 'relative', value: 0.25 })).toBeCloseTo(153.66, 1);
  });
  it('Taylor a = 2, b = 1.5, m = 2, D = 0.25 → 22.6 (Karandinos 1976) [derived]', () => {
    const n = countSampleSize({
      m: 2,
      variance: { kind: 'taylor', a: 2, b: 1.5 },
      target: 'precision',
      value: 0.25,
    });
    expect(n).toBeCloseTo(22.63, 2);
  });
  it('Poisson: n = 1/(m·D²)', () => {
    expect(
      countSampleSize({ m: 4, variance: { kind: 'poisson' }, target: 'precision', value: 0.1 }),
    ).toBeCloseTo(25, 10);
  });
});

describe('proportions (Cochran 1977 eq. 4.2, 4.3)', () => {
  it('p = 0.5, d = 0.05, 95 % → 384.15 [memory: Cochran eq. 4.2]', () => {
    expect(proportionSampleSize({ p: 0.5, target: 'margin', value: 0.05, z: 1.959963984540054 })).toBeCloseTo(
      384.15,
      2,
    );
  });
  it('Krejcie & Morgan (1970) table N = 100…10000 → 80, 132, 217, 278, 357, 370 [memory; χ² form, so ±1]', () => {
    const z = 1.959963984540054;
    const got = [100, 200, 500, 1000, 5000, 10000].map((N) =>
      Math.ceil(proportionSampleSize({ p: 0.5, target: 'margin', value: 0.05, z, population: N })),
    );
    const km = [80, 132, 217, 278, 357, 370];
    got.forEach((g, i) => {
      expect(Math.abs(g - km[i]!)).toBeLessThanOrEqual(1);
    });
  });
  it('zero acceptance: p_max = 0.02 at 95 % → 149 items (Hanley & Lippman-Hand 1983) [derived]', () => {
    expect(Math.ceil(zeroAcceptanceSampleSize(0.02, 0.05))).toBe(149);
  });
});

describe('log-scale relative target (Cox standard error, Zhou & Gao 1997)', () => {
  it('s_y = 1, r = 0.25 → 118.5 [derived]', () => {
    expect(logScaleRelativeSampleSize(1, 0.25, 0.975)).toBeCloseTo(118.5, 1);
  });
  // the side the target is checked on: two-sided (U − L)/2 = estimate·sinh(t·SE), below 1 − e^(−t·SE)
  // [scipy: brentq on sinh(t.ppf(0.975, n − 1)·√(1/n + 1/(2(n − 1)))) = 0.25 → 96.84959886401629; on
  //  1 − exp(−t.ppf(0.95, n − 1)·√(…)) = 0.25 → 51.23423953409522]
  it('two-sided and lower-side half-widths: sinh and 1 − e^(−x) [scipy brentq]', () => {
    expect(Math.abs(logScaleRelativeSampleSize(1, 0.25, 0.975, 'two') - 96.84959886401629)).toBeLessThan(
      2e-3,
    );
    expect(Math.abs(logScaleRelativeSampleSize(1, 0.25, 0.95, 'lower') - 51.23423953409522)).toBeLessThan(
      2e-3,
    );
  });
  it.each(fx.cases.logRelative)('s_y=$s_y r=$r vs scipy brentq [derived]', (c) => {
    expect(Math.abs(logScaleRelativeSampleSize(c.s_y, c.r, c.p) - c.n) / c.n).toBeLessThan(2e-5);
  });
});

describe('Box (1953) degrees of freedom of a variance under non-normality', () => {
  it('ν = 2/(2/(n − 1) + γ₂/n): n = 30, γ₂ = 6 → 7.4359; normal or light tails → n − 1 [derived by hand]', () => {
    expect(boxVarianceDf(30, 6)).toBeCloseTo(2 / (2 / 29 + 6 / 30), 12);
    expect(boxVarianceDf(30, 6)).toBeCloseTo(7.4359, 4);
    expect(boxVarianceDf(30, 0)).toBe(29);
    expect(boxVarianceDf(30, -1.2)).toBe(29);
  });
});

describe('the bias-corrected sample excess kurtosis G₂ (Joanes & Gill 1998)', () => {
  // ten skewed values: scipy.stats.kurtosis(x, bias=True) = g₂ = 2.026297325791843 and
  // scipy.stats.kurtosis(x, bias=False) = G₂ = 4.546489915239151
  // [scipy: x = [2.1, 3.4, 1.9, 8.7, 2.2, 2.8, 15.1, 3.0, 2.5, 4.4]]
  it('turns g₂ into scipy’s unbiased kurtosis; unchanged below four values', () => {
    expect(adjustedExcessKurtosis(10, 2.026297325791843)).toBeCloseTo(4.546489915239151, 12);
    expect(adjustedExcessKurtosis(3, 1.5)).toBe(1.5);
  });
});
