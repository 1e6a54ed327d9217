/**
 * Strict rule pieces: Stein's second-stage size, the strict cost shown in setup, and the beta–binomial
 * confidence sequence. Sources beside each check.
 */
import { describe, expect, it } from 'vitest';
import { wilsonInterval } from '../../../src/stats/wilson-interval.ts';
import { betaBinomialConfidenceSequence } from '../../../src/stop/beta-binomial-confidence-sequence.ts';
import { steinTwoStage } from '../../../src/stop/stein-two-stage.ts';
import { strictCost } from '../../../src/stop/strict-cost.ts';
import { createRng } from '../../sim/xoshiro128.ts';

describe("Stein's two-stage size N = max(m, ⌊(t₍1−α/2, m−1₎ s_m/d)²⌋ + 1) (Stein 1945)", () => {
  it('worked example m = 10, s = 2, d = 1, 95 %: t = 2.262157, (t·s/d)² = 20.469 → N = 21 [derived]', () => {
    // python3: from scipy.stats import t; (t.ppf(.975, 9)*2/1)**2 → 20.469420116796897
    const r = steinTwoStage({ m: 10, pilotSd: 2, d: 1, level: 0.95, sided: 'two' });
    expect(r.quantile).toBeCloseTo(2.262157162798205, 6);
    expect(r.total).toBe(21);
  });
  it('never below the pilot, and one-sided uses t₍1−α₎', () => {
    expect(steinTwoStage({ m: 10, pilotSd: 0.1, d: 1, level: 0.95, sided: 'two' }).total).toBe(10);
    // python3: t.ppf(.95, 14) = 1.7613101357748562; (1.76131*3/0.5)**2 = 111.68 → 112
    const one = steinTwoStage({ m: 15, pilotSd: 3, d: 0.5, level: 0.95, sided: 'upper' });
    expect(one.quantile).toBeCloseTo(1.7613101357748562, 6);
    expect(one.total).toBe(112);
  });
  it('cost shown in setup: E(N)/n* → (t₍m−1₎/z)² = 1.3321 at m = 10 (check value seq-stein-EN-m10) [derived]', () => {
    const c = strictCost(
      {
        kind: 'measurement',
        level: 0.95,
        sided: 'two',
        rule: 'strict',
        min: 10,
        // a hot-spot share of 50 % needs 5 entries, so the pilot is min = 10
        hotSpotShare: 0.5,
        target: { kind: 'margin', value: 1 },
      },
      100,
    );
    expect(Math.abs(c.factor - 1.3321)).toBeLessThan(1e-4);
  });
  it('refuses caller mistakes', () => {
    expect(() => steinTwoStage({ m: 1, pilotSd: 1, d: 1, level: 0.95, sided: 'two' })).toThrow(RangeError);
    expect(() => steinTwoStage({ m: 10, pilotSd: 1, d: 0, level: 0.95, sided: 'two' })).toThrow(RangeError);
  });
});

describe('beta–binomial mixture confidence sequence (Robbins 1970; Howard et al. 2021 §3)', () => {
  it('matches an independent scipy root-finding implementation [derived]', () => {
    // python3: betaln(.5+S,.5+n-S)-betaln(.5,.5)-log(20) - S log p - (n-S) log(1-p) = 0, scipy.optimize.brentq
    const cases: [number, number, number, number][] = [
      [50, 100, 0.3382575526457915, 0.6617424473542085],
      [0, 20, 0, 0.2240061120127827],
      [3, 150, 0.0011605231747083185, 0.08495092492248726],
      [10, 400, 0.0064292512932291645, 0.06284525792713273],
      [20, 20, 0.7759938879872172, 1],
    ];
    for (const [S, n, lo, hi] of cases) {
      const r = betaBinomialConfidenceSequence(S, n, 0.95);
      expect(Math.abs(r.lower - lo)).toBeLessThan(1e-9);
      expect(Math.abs(r.upper - hi)).toBeLessThan(1e-9);
    }
  });
  it('contains the Wilson interval at the same level over a grid (the strict rule’s prefilter relies on it)', () => {
    for (const level of [0.8, 0.9, 0.95, 0.99])
      for (const n of [1, 2, 5, 10, 30, 100, 400, 2000])
        for (let S = 0; S <= n; S += Math.max(1, Math.floor(n / 25))) {
          const cs = betaBinomialConfidenceSequence(S, n, level);
          const w = wilsonInterval(S, n, level, 'two');
          expect(cs.lower).toBeLessThanOrEqual(w.lower + 1e-12);
          expect(cs.upper).toBeGreaterThanOrEqual(w.upper - 1e-12);
          expect(cs.lower).toBeGreaterThanOrEqual(0);
          expect(cs.upper).toBeLessThanOrEqual(1);
        }
  });
  it('is valid however often you look: 400 seeded runs of 500 items at p = 0.3 miss at any step at most α (+ MC margin)', () => {
    const rng = createRng(404);
    let everMissed = 0;
    const runs = 400;
    for (let r = 0; r < runs; r++) {
      let S = 0;
      for (let n = 1; n <= 500; n++) {
        if (rng.next() < 0.3) S++;
        const cs = betaBinomialConfidenceSequence(S, n, 0.9);
        if (cs.lower > 0.3 || cs.upper < 0.3) {
          everMissed++;
          break;
        }
      }
    }
    // Ville: P(ever miss) ≤ 0.10; binomial 99.9 % upper limit for 400 runs at 0.10 is about 0.16
    expect(everMissed / runs).toBeLessThan(0.16);
  });
});
