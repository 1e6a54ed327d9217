/**
 * Seeded generators checked against the known moments of their distributions (textbook formulas:
 * normal mean μ, variance σ²; lognormal mean m and CV (Aitchison & Brown 1957); Poisson mean = variance
 * = λ; negative binomial mean m, variance m + m²/k (Bliss & Fisher 1953); Bernoulli mean p, variance
 * p(1−p); Gamma(k,1) mean = variance = k). Evidence level: derived (closed-form moments).
 *
 * Tolerances: the sample mean of R draws has standard error √(var/R); we allow 4.5 standard errors for the
 * mean and a relative tolerance for the variance, so a correct generator fails with probability < 1e-5
 * for any seed while a wrong parameterisation (e.g. variance m + m²k, or σ instead of σ²) fails surely.
 */
import { describe, expect, it } from 'vitest';
import { bernoulliVariate } from '../../sim/bernoulli-variate.ts';
import { gammaVariate } from '../../sim/gamma-variate.ts';
import { lognormalVariate } from '../../sim/lognormal-variate.ts';
import { negativeBinomialVariate } from '../../sim/negative-binomial-variate.ts';
import { normalVariate } from '../../sim/normal-variate.ts';
import { poissonVariate } from '../../sim/poisson-variate.ts';
import { createRng, type Rng } from '../../sim/xoshiro128.ts';

function moments(draw: (rng: Rng) => number, seed: number, r: number) {
  const rng = createRng(seed);
  let s = 0;
  let ss = 0;
  for (let i = 0; i < r; i++) {
    const x = draw(rng);
    s += x;
    ss += x * x;
  }
  const mean = s / r;
  return { mean, variance: (ss - r * mean * mean) / (r - 1) };
}

function expectMoments(
  draw: (rng: Rng) => number,
  mean: number,
  variance: number,
  varRelTol: number,
  r = 200_000,
) {
  const m = moments(draw, 20240611, r);
  expect(Math.abs(m.mean - mean)).toBeLessThan(4.5 * Math.sqrt(variance / r));
  expect(Math.abs(m.variance / variance - 1)).toBeLessThan(varRelTol);
}

describe('xoshiro128** uniform stream', () => {
  it('is reproducible for a seed and differs between seeds', () => {
    const a = createRng(7);
    const b = createRng(7);
    const c = createRng(8);
    const xa = [a.next(), a.next(), a.next()];
    expect([b.next(), b.next(), b.next()]).toEqual(xa);
    expect(c.next()).not.toBe(xa[0]);
  });
  it('is uniform on (0,1): mean 1/2, variance 1/12, never 0 or 1', () => {
    const rng = createRng(3);
    let min = 1;
    let max = 0;
    const bins = new Array<number>(10).fill(0);
    for (let i = 0; i < 100_000; i++) {
      const u = rng.next();
      min = Math.min(min, u);
      max = Math.max(max, u);
      bins[Math.floor(u * 10)]! += 1;
    }
    expect(min).toBeGreaterThan(0);
    expect(max).toBeLessThan(1);
    // chi-square goodness of fit on 10 bins, df = 9: 99.9th percentile 27.88 (scipy.stats.chi2.ppf(0.999, 9))
    const chi2 = bins.reduce((acc, o) => acc + (o - 10_000) ** 2 / 10_000, 0);
    expect(chi2).toBeLessThan(27.88);
    expectMoments((g) => g.next(), 0.5, 1 / 12, 0.01);
  });
});

describe('generators reproduce their distributions’ moments', () => {
  it('normal N(10, 1)', () => expectMoments((g) => normalVariate(g, 10, 1), 10, 1, 0.02));
  it('gamma shape 0.5 and 3', () => {
    expectMoments((g) => gammaVariate(g, 0.5), 0.5, 0.5, 0.03);
    expectMoments((g) => gammaVariate(g, 3), 3, 3, 0.02);
  });
  it('lognormal mean 1, CV 0.5 and 1 (variance = CV² · mean²)', () => {
    expectMoments((g) => lognormalVariate(g, 1, 0.5), 1, 0.25, 0.03);
    expectMoments((g) => lognormalVariate(g, 1, 1), 1, 1, 0.08);
  });
  it('lognormal CV 2: mean 1 (variance too heavy-tailed to check tightly)', () => {
    const m = moments((g) => lognormalVariate(g, 1, 2), 5, 400_000);
    expect(Math.abs(m.mean - 1)).toBeLessThan(0.03);
    // median = exp(μ) = 1/√(1+CV²) = 0.4472
    const rng = createRng(6);
    const xs = Array.from({ length: 20_001 }, () => lognormalVariate(rng, 1, 2)).sort((a, b) => a - b);
    expect(xs[10_000]!).toBeCloseTo(1 / Math.sqrt(5), 1);
  });
  it('Poisson λ = 0.5, 2, 10 (inversion) and 80 (transformed rejection)', () => {
    for (const lambda of [0.5, 2, 10, 80])
      expectMoments((g) => poissonVariate(g, lambda), lambda, lambda, 0.02);
  });
  it('Poisson λ = 80 has the right shape: P(X ≤ 70) = 0.14339 (scipy.stats.poisson.cdf(70, 80))', () => {
    const rng = createRng(11);
    let hits = 0;
    const r = 100_000;
    for (let i = 0; i < r; i++) if (poissonVariate(rng, 80) <= 70) hits++;
    expect(Math.abs(hits / r - 0.14339)).toBeLessThan(4.5 * Math.sqrt((0.14339 * 0.85661) / r));
  });
  it('negative binomial mean 2, k = 0.5 and 2 (variance m + m²/k = 10 and 4)', () => {
    expectMoments((g) => negativeBinomialVariate(g, 2, 0.5), 2, 10, 0.06);
    expectMoments((g) => negativeBinomialVariate(g, 2, 2), 2, 4, 0.03);
  });
  it('negative binomial P(X = 0) = (k/(k+m))^k: k = 0.5, m = 2 → 0.4472', () => {
    const rng = createRng(12);
    let zeros = 0;
    const r = 100_000;
    for (let i = 0; i < r; i++) if (negativeBinomialVariate(rng, 2, 0.5) === 0) zeros++;
    expect(Math.abs(zeros / r - Math.sqrt(0.2))).toBeLessThan(0.007);
  });
  it('Bernoulli p = 0.02, 0.1, 0.5', () => {
    for (const p of [0.02, 0.1, 0.5]) expectMoments((g) => bernoulliVariate(g, p), p, p * (1 - p), 0.04);
  });
  it('rejects impossible parameters', () => {
    const rng = createRng(1);
    expect(() => poissonVariate(rng, -1)).toThrow(RangeError);
    expect(() => gammaVariate(rng, 0)).toThrow(RangeError);
    expect(() => bernoulliVariate(rng, 1.5)).toThrow(RangeError);
    expect(() => lognormalVariate(rng, 1, 0)).toThrow(RangeError);
  });
});
