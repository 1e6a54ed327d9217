// "Where next": the greedy rule derived in src/design/where-next.ts. Checked against an exhaustive search
// (brute force over every whole-number allocation — an implementation independent of the greedy step) and
// against Neyman's allocation (Cochran 1977 §5.5) as the continuous limit.
import { describe, expect, it } from 'vitest';
import { neymanAllocation } from '../../../src/design/neyman-allocation.ts';
import { type WhereNextStratum, whereNext } from '../../../src/design/where-next.ts';

function variance(w: number[], s: number[], n: number[]): number {
  return w.reduce((a, wi, i) => a + (wi * wi * s[i]! * s[i]!) / n[i]!, 0);
}

describe('whereNext', () => {
  it('asks for strata with fewer than two entries first (fewest, then heaviest)', () => {
    const r = whereNext([
      { name: 'a', weight: 0.2, n: 1, sd: 0 },
      { name: 'b', weight: 0.5, n: 1, sd: 0 },
      { name: 'c', weight: 0.3, n: 6, sd: 9 },
    ]);
    expect(r.status === 'suggest' && r.stratum).toBe('b');
    expect(r.status === 'suggest' && r.reason).toBe('needs-two');
  });
  it('picks the stratum with the largest variance reduction per unit cost', () => {
    const strata: WhereNextStratum[] = [
      { name: 'woodland', weight: 0.6, n: 4, sd: 2 },
      { name: 'meadow', weight: 0.4, n: 4, sd: 6 },
    ];
    const r = whereNext(strata);
    if (r.status !== 'suggest') throw new Error('expected a suggestion');
    expect(r.stratum).toBe('meadow');
    // Δ_h = W² S² / (n (n+1)): woodland 0.36·4/20 = 0.072, meadow 0.16·36/20 = 0.288
    expect(r.gains[0]).toBeCloseTo(0.072, 12);
    expect(r.gains[1]).toBeCloseTo(0.288, 12);
    // A cost five times higher in the meadow turns the suggestion round (0.288 / 5 < 0.072).
    const costly = whereNext([strata[0]!, { ...strata[1]!, cost: 5 }]);
    expect(costly.status === 'suggest' && costly.stratum).toBe('woodland');
  });
  it('the gain is the exact variance reduction, with or without the finite population correction', () => {
    const w = [0.3, 0.7];
    const s = [1.5, 2.5];
    const n = [5, 8];
    const N = [40, 90];
    const r = whereNext(
      w.map((wi, i) => ({ name: `s${i}`, weight: wi, n: n[i]!, sd: s[i]!, population: N[i]! })),
    );
    if (r.status !== 'suggest') throw new Error('expected a suggestion');
    const v = (nn: number[]) =>
      w.reduce((a, wi, i) => a + wi * wi * s[i]! ** 2 * (1 / nn[i]! - 1 / N[i]!), 0);
    expect(r.gains[0]).toBeCloseTo(v(n) - v([6, 8]), 14);
    expect(r.gains[1]).toBeCloseTo(v(n) - v([5, 9]), 14);
  });
  it('followed step by step from 2 each, it reaches the best whole-number allocation (brute force)', () => {
    const w = [0.5, 0.3, 0.2];
    const s = [1, 4, 2.5];
    const n = [2, 2, 2];
    for (let total = 7; total <= 30; total++) {
      while (n.reduce((a, b) => a + b, 0) < total) {
        const r = whereNext(w.map((wi, i) => ({ name: `s${i}`, weight: wi, n: n[i]!, sd: s[i]! })));
        if (r.status !== 'suggest') throw new Error('expected a suggestion');
        n[r.index]!++;
      }
      let best = Number.POSITIVE_INFINITY;
      for (let a = 2; a <= total - 4; a++)
        for (let b = 2; b <= total - a - 2; b++) best = Math.min(best, variance(w, s, [a, b, total - a - b]));
      expect(variance(w, s, n) / best - 1).toBeLessThan(1e-12);
    }
    // …and the allocation is close to Neyman's continuous one (within one entry per stratum).
    const ney = neymanAllocation(
      w.map((wi, i) => ({ weight: wi, sd: s[i]! })),
      30,
    );
    for (const [i, x] of n.entries()) expect(Math.abs(x - ney[i]!)).toBeLessThanOrEqual(1);
  });
  it('a stratum with no spread yet borrows the pooled SD; all-zero spread assumes equal SDs', () => {
    const r = whereNext([
      { name: 'a', weight: 0.5, n: 2, sd: 0 },
      { name: 'b', weight: 0.5, n: 8, sd: 3 },
    ]);
    expect(r.status === 'suggest' && r.stratum).toBe('a');
    const z = whereNext([
      { name: 'a', weight: 0.5, n: 6, sd: 0 },
      { name: 'b', weight: 0.5, n: 3, sd: 0 },
    ]);
    expect(z.status === 'suggest' && [z.stratum, z.reason]).toEqual(['b', 'equal-spread-assumed']);
  });
  it('skips fully measured strata and says when nothing is left', () => {
    const r = whereNext([
      { name: 'a', weight: 0.5, n: 4, sd: 9, population: 4 },
      { name: 'b', weight: 0.5, n: 4, sd: 1, population: 10 },
    ]);
    expect(r.status === 'suggest' && r.stratum).toBe('b');
    expect(whereNext([{ name: 'a', weight: 1, n: 3, sd: 1, population: 3 }]).status).toBe('none');
    expect(() => whereNext([])).toThrow(RangeError);
    expect(() => whereNext([{ name: 'a', weight: 1, n: 3, sd: 1, cost: -1 }])).toThrow(/cost > 0/);
  });
});
