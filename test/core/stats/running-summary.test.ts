// RunningSummary against batch moments (numpy-equivalent two-pass formulas computed here from the
// definition: mean, sample variance with divisor n − 1, log moments); add/remove symmetry.
import { describe, expect, it } from 'vitest';
import { RunningSummary } from '../../../src/stats/running-summary.ts';

function batch(xs: number[]) {
  const n = xs.length;
  const mean = xs.reduce((a, b) => a + b, 0) / n;
  const v = xs.reduce((a, b) => a + (b - mean) ** 2, 0) / (n - 1);
  return { n, mean, sd: Math.sqrt(v) };
}

describe('RunningSummary', () => {
  it('matches two-pass moments (Welford 1962) on a worked example', () => {
    const s = RunningSummary.of([2, 4, 4, 4, 5, 5, 7, 9]);
    expect(s.mean).toBe(5);
    expect(s.sd).toBeCloseTo(Math.sqrt(32 / 7), 12);
    expect(s.distinct).toBe(5);
    expect(s.total).toBe(40);
  });
  it('log moments run over positive values; zeros and negatives are counted', () => {
    const s = RunningSummary.of([1, Math.E, Math.E ** 2, 0, -1]);
    expect(s.positive).toBe(3);
    expect(s.logMean).toBeCloseTo(1, 12);
    expect(s.logSd).toBeCloseTo(1, 12);
    expect(s.zeros).toBe(1);
    expect(s.negative).toBe(1);
  });
  it('remove undoes add (random grid, 1e-9 relative)', () => {
    let seed = 7;
    const rnd = () => {
      seed = (seed * 1103515245 + 12345) % 2 ** 31;
      return seed / 2 ** 31;
    };
    const xs = Array.from({ length: 300 }, () => Math.exp(3 * rnd()) * 100);
    const s = RunningSummary.of(xs);
    for (let i = 0; i < 150; i++) s.remove(xs[i]!);
    const b = batch(xs.slice(150));
    expect(s.n).toBe(150);
    expect(Math.abs(s.mean - b.mean) / b.mean).toBeLessThan(1e-9);
    expect(Math.abs(s.sd - b.sd) / b.sd).toBeLessThan(1e-9);
    const logs = xs.slice(150).map(Math.log);
    const lb = batch(logs);
    expect(Math.abs(s.logMean - lb.mean)).toBeLessThan(1e-9);
    expect(Math.abs(s.logSd - lb.sd)).toBeLessThan(1e-9);
  });
  it('removing down to one distinct value leaves exactly zero spread', () => {
    const s = RunningSummary.of([3.1, 3.1, 0.7, 12.9]);
    s.remove(0.7).remove(12.9);
    expect(s.sd).toBe(0);
    expect(s.mean).toBe(3.1);
    expect(s.distinct).toBe(1);
  });
  it('censored points stay out of the moments', () => {
    const s = RunningSummary.of([{ value: 0.5, censored: true }, 2, 4]);
    expect(s.n).toBe(2);
    expect(s.censored).toBe(1);
    s.remove({ value: 0.5, censored: true });
    expect(s.censored).toBe(0);
  });
  it('refuses to remove a value never added', () => {
    expect(() => RunningSummary.of([1, 2]).remove(3)).toThrow(RangeError);
    expect(() => new RunningSummary().add(Number.NaN)).toThrow(RangeError);
  });
});
