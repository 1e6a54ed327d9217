// "How many more" for a decision against a limit (src/plan/limit-decision-projection.ts).
// Reference: test/fixtures/limit-decision.json, made by test/fixtures/limit-decision.py with scipy.stats (the
// closed form, percentiles found by counting N up one entry at a time) and a numpy Monte Carlo of the predictive
// model itself (400,000 draws per point) — the predictive distribution of a future mean of Spiegelhalter,
// Freedman & Blackburn (1986), Controlled Clinical Trials 7:8–17.
import { describe, expect, it } from 'vitest';
import { tQuantileAtRealDf } from '../../../src/plan/fixed-point-sample-size.ts';
import {
  type LimitDecisionArgs,
  limitDecisionChance,
  projectLimitDecision,
} from '../../../src/plan/limit-decision-projection.ts';
import { normalQuantile } from '../../../src/stats/distributions.ts';
import fixture from '../../fixtures/limit-decision.json' with { type: 'json' };

function argsOf(c: (typeof fixture.cases)[number]): LimitDecisionArgs {
  const [kind, p] = c.multiplier as [string, number];
  return {
    n: c.n,
    distance: c.distance,
    spread: c.spread,
    boundSpread: c.boundSpread,
    multiplier: kind === 'z' ? () => normalQuantile(p) : (total) => tQuantileAtRealDf(p, total - 1),
  };
}

describe('limit decision projection against scipy and a Monte Carlo of the predictive model', () => {
  for (const c of fixture.cases) {
    const label = `n ${c.n}, distance ${c.distance}, σ ${c.spread}, ${c.multiplier.join(' ')}`;
    it(`percentiles of the decision total (${label})`, () => {
      const r = projectLimitDecision(argsOf(c));
      expect(r.low).toBe(c.percentiles['0.1']);
      expect(r.likely).toBe(c.percentiles['0.5']);
      expect(r.assured).toBe(c.percentiles['0.8']);
      expect(r.high).toBe(c.percentiles['0.9']);
    });
    it(`chance of a decision by N (${label})`, () => {
      for (const point of c.points) {
        const f = limitDecisionChance(argsOf(c), point.total);
        // the t quantile (jStat) agrees with scipy to about 1e-8, which moves F by less than 1e-6
        expect(f).toBeCloseTo(point.chance, 6);
        // the Monte Carlo's standard error is at most 0.0008 at 400,000 draws
        expect(Math.abs(f - point.simulated)).toBeLessThan(0.004);
      }
    });
  }

  it('never passes the population, and says nothing is decided at the current n', () => {
    const args = argsOf(fixture.cases[1]!);
    const r = projectLimitDecision({ ...args, population: 100 });
    expect(r.high).toBe(100);
    expect(r.low).toBeLessThanOrEqual(100);
    expect(limitDecisionChance(args, args.n)).toBe(0);
  });

  it('refuses what it cannot project', () => {
    expect(() => projectLimitDecision({ n: 1, distance: 1, spread: 1, multiplier: () => 2 })).toThrow(
      RangeError,
    );
    expect(() => projectLimitDecision({ n: 5, distance: 1, spread: 0, multiplier: () => 2 })).toThrow(
      RangeError,
    );
  });
});
