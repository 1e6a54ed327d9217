/**
 * Wald SPRT lines, operating characteristic and ASN.
 * Sources beside each check; evidence levels: Montgomery example [memory, from the shared check values
 * seq-sprt-montgomery]; scipy/numpy recomputations of Wald's formulas [derived], commands kept inline.
 */
import { describe, expect, it } from 'vitest';
import { sprtBoundaries } from '../../../src/stop/sprt-boundaries.ts';
import { sprtFixedSize } from '../../../src/stop/sprt-fixed-size.ts';
import { sprtOperatingCharacteristic } from '../../../src/stop/sprt-operating-characteristic.ts';

const montgomery = { family: 'bernoulli' as const, theta0: 0.01, theta1: 0.06, alpha: 0.05, beta: 0.1 };

describe('sprtBoundaries', () => {
  it('Montgomery (Introduction to Statistical Quality Control, sequential sampling example): h1 = 1.22, h2 = 1.57, s = 0.028 [memory]', () => {
    const l = sprtBoundaries(montgomery);
    expect(Math.abs(l.h0 - 1.22)).toBeLessThan(0.005);
    expect(Math.abs(l.h1 - 1.57)).toBeLessThan(0.005);
    expect(Math.abs(l.slope - 0.028)).toBeLessThan(0.0005);
  });
  it('matches the scipy/numpy values 1.22115, 1.5678, 0.02811 [derived]', () => {
    // python3: g1=log(.06/.01); g2=log(.99/.94); q=g1+g2; log(.95/.1)/q, log(.9/.05)/q, g2/q
    const l = sprtBoundaries(montgomery);
    expect(l.h0).toBeCloseTo(1.221149208680614, 9);
    expect(l.h1).toBeCloseTo(1.5677999569546843, 9);
    expect(l.slope).toBeCloseTo(0.028111034141301172, 10);
  });
  it('Poisson and negative binomial (Waters 1955) lines against numpy [derived]', () => {
    // python3: q=log(2.5/1.5); log(.95/.1)/q, log(.9/.05)/q, 1/q
    const p = sprtBoundaries({ family: 'poisson', theta0: 1.5, theta1: 2.5, alpha: 0.05, beta: 0.1 });
    expect(p.h0).toBeCloseTo(4.407163019758405, 9);
    expect(p.h1).toBeCloseTo(5.65823565503097, 9);
    expect(p.slope).toBeCloseTo(1.9576151889712174, 9);
    // python3: k=2; q=log(2.5*3.5/(1.5*4.5)); log(.95/.1)/q, log(.9/.05)/q, k*log(4.5/3.5)/q
    const nb = sprtBoundaries({
      family: 'negative-binomial',
      k: 2,
      theta0: 1.5,
      theta1: 2.5,
      alpha: 0.05,
      beta: 0.1,
    });
    expect(nb.h0).toBeCloseTo(8.675123993777323, 8);
    expect(nb.h1).toBeCloseTo(11.137753623667031, 8);
    expect(nb.slope).toBeCloseTo(1.936829182349094, 9);
  });
  it('normal, σ known: midline (μ0+μ1)/2 and h = σ² ln(…)/(μ1−μ0) (Wald 1947) [derived]', () => {
    const l = sprtBoundaries({ family: 'normal', theta0: 10, theta1: 12, sigma: 2, alpha: 0.05, beta: 0.1 });
    expect(l.slope).toBe(11);
    expect(l.h0).toBeCloseTo((4 * Math.log(0.95 / 0.1)) / 2, 12);
    expect(l.h1).toBeCloseTo((4 * Math.log(0.9 / 0.05)) / 2, 12);
  });
  it('refuses impossible settings', () => {
    expect(() => sprtBoundaries({ ...montgomery, theta1: 0.005 })).toThrow(RangeError);
    expect(() => sprtBoundaries({ ...montgomery, alpha: 0.6, beta: 0.5 })).toThrow(RangeError);
    expect(() => sprtBoundaries({ family: 'normal', theta0: 1, theta1: 2, alpha: 0.05, beta: 0.1 })).toThrow(
      RangeError,
    );
  });
});

describe('sprtOperatingCharacteristic (Wald 1947 parametric OC and ASN)', () => {
  it('L(θ0) = 1 − α and L(θ1) = β by construction', () => {
    for (const model of [
      montgomery,
      { family: 'poisson' as const, theta0: 1.5, theta1: 2.5, alpha: 0.05, beta: 0.1 },
      { family: 'negative-binomial' as const, k: 2, theta0: 1.5, theta1: 2.5, alpha: 0.05, beta: 0.1 },
      { family: 'lognormal' as const, sigma: 0.8, theta0: 0.8, theta1: 1.25, alpha: 0.05, beta: 0.1 },
    ]) {
      expect(sprtOperatingCharacteristic(model, model.theta0).acceptProbability).toBeCloseTo(0.95, 6);
      expect(sprtOperatingCharacteristic(model, model.theta1).acceptProbability).toBeCloseTo(0.1, 6);
    }
  });
  it('Montgomery plan: OC and ASN against an independent scipy root-finding implementation [derived]', () => {
    // python3 (scipy.optimize.brentq on p(p1/p0)^h + (1−p)((1−p1)/(1−p0))^h = 1):
    // p = 0.01 → L 0.95, ASN 59.726; 0.03 → 0.515446, 68.952; 0.06 → 0.1, 40.419; 0.1 → 0.0116292, 21.357
    const expected: [number, number, number][] = [
      [0.01, 0.95, 59.72611734699484],
      [0.03, 0.5154457895957475, 68.9519355427157],
      [0.06, 0.1, 40.4185274023101],
      [0.1, 0.011629172191646235, 21.357474941169666],
    ];
    for (const [p, L, asn] of expected) {
      const r = sprtOperatingCharacteristic(montgomery, p);
      expect(Math.abs(r.acceptProbability - L)).toBeLessThan(1e-6);
      expect(Math.abs(r.asn / asn - 1)).toBeLessThan(1e-5);
    }
  });
  it('the OC curve falls as θ rises and the ASN peaks inside the zone', () => {
    let prev = 1;
    for (let p = 0.002; p < 0.2; p += 0.004) {
      const L = sprtOperatingCharacteristic(montgomery, p).acceptProbability;
      expect(L).toBeLessThanOrEqual(prev + 1e-12);
      prev = L;
    }
    const mid = sprtOperatingCharacteristic(montgomery, 0.028).asn;
    expect(mid).toBeGreaterThan(sprtOperatingCharacteristic(montgomery, 0.01).asn);
    expect(mid).toBeGreaterThan(sprtOperatingCharacteristic(montgomery, 0.06).asn);
  });
  it('fixed-size equivalent: Poisson 1 vs 2 → ((1.6449·1 + 1.2816·√2)/1)² = 11.9525 [derived]', () => {
    // python3: from scipy.stats import norm; ((norm.ppf(.95)+norm.ppf(.9)*2**.5))**2
    expect(sprtFixedSize({ family: 'poisson', theta0: 1, theta1: 2, alpha: 0.05, beta: 0.1 })).toBeCloseTo(
      11.952516935031666,
      8,
    );
  });
});
