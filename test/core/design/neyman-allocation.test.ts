// Neyman allocation with cost against the optimum-allocation example of Scheaffer et al. ch. 5
// (test/fixtures/design-stratified.json, `neyman`: printed intermediates N_h S_h / √c_h [secondary]).
import { describe, expect, it } from 'vitest';
import { neymanAllocation } from '../../../src/design/neyman-allocation.ts';
import fixture from '../../fixtures/design-stratified.json';

describe('neymanAllocation', () => {
  const f = fixture.neyman;
  const strata = f.population.map((N, i) => ({ weight: N, sd: f.sd[i]!, cost: f.cost[i]! }));
  it('reproduces the printed scores N_h S_h / √c_h (as shares of n)', () => {
    // With total = Σ scores the allocation returns the scores themselves.
    const sum = f.population.reduce((a, N, i) => a + (N * f.sd[i]!) / Math.sqrt(f.cost[i]!), 0);
    const scores = neymanAllocation(strata, sum);
    scores.forEach((s, i) => {
      expect(Math.abs(s - f.scores_printed[i]!)).toBeLessThan(f.tolerance.scores_abs);
    });
  });
  it('allocates n = 58 as derived from the printed scores', () => {
    const a = neymanAllocation(strata, f.total);
    a.forEach((x, i) => {
      expect(Math.abs(x / f.allocation[i]! - 1)).toBeLessThan(f.tolerance.allocation_rel);
    });
    expect(a.reduce((p, q) => p + q, 0)).toBeCloseTo(58, 10);
  });
  it('with equal SDs and costs it is proportional allocation', () => {
    const a = neymanAllocation(
      [
        { weight: 0.2, sd: 2 },
        { weight: 0.8, sd: 2 },
      ],
      50,
    );
    expect(a[0]).toBeCloseTo(10, 12);
    expect(a[1]).toBeCloseTo(40, 12);
  });
  it('throws on caller mistakes', () => {
    expect(() => neymanAllocation([{ weight: 1, sd: 0 }], 10)).toThrow(/sd > 0/);
    expect(() => neymanAllocation([{ weight: 1, sd: 1, cost: 0 }], 10)).toThrow(/cost > 0/);
    expect(() => neymanAllocation([{ weight: 1, sd: 1 }], 0)).toThrow(/total > 0/);
  });
});
