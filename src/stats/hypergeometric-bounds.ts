/**
 * Exact hypergeometric bounds — how many items with the counted outcome a finite lot of N items can hold,
 * given x found in n items drawn without replacement.
 *
 * Source: the exact (Clopper–Pearson-type) inversion of the hypergeometric test, e.g. Buonaccorsi JP (1987)
 * A note on confidence intervals for proportions in finite populations, The American Statistician
 * 41:215–218; Wright T (1991) Exact Confidence Bounds when Sampling from Small Finite Universes, Springer
 * LNS 66. Upper bound D_U = the largest D with P(X ≤ x | N, D, n) ≥ α_tail; lower bound D_L = the smallest D
 * with P(X ≥ x | N, D, n) ≥ α_tail (α_tail = α/2 two-sided, α one-sided).
 * Preconditions: integers 0 ≤ x ≤ n ≤ N, n ≥ 1; 0 < level < 1.
 * Returns: D_L and D_U (numbers of items in the lot), and the proportions D_L/N, D_U/N.
 * Validity: exact for simple random sampling without replacement; cost O(x·log N) per call.
 * @example hypergeometricBounds(0, 50, 500, 0.95, 'upper').upperCount // 27
 */
import type { Sided } from '../model/types.ts';
import { binomialTail } from './binomial-args.ts';
import { logChoose } from './distributions.ts';

/** P(X ≤ x) for X ~ Hypergeometric(N, D, n): sum of terms from the lowest feasible k up, by term ratios. */
export function hypergeometricCdf(x: number, lot: number, defects: number, n: number): number {
  const kMin = Math.max(0, n - (lot - defects));
  const kMax = Math.min(n, defects);
  if (x < kMin) return 0;
  if (x >= kMax) return 1;
  let term = Math.exp(logChoose(defects, kMin) + logChoose(lot - defects, n - kMin) - logChoose(lot, n));
  let sum = term;
  for (let k = kMin; k < x; k++) {
    term *= ((defects - k) * (n - k)) / ((k + 1) * (lot - defects - n + k + 1));
    sum += term;
  }
  return Math.min(1, sum);
}

export function hypergeometricBounds(
  x: number,
  n: number,
  lot: number,
  level: number,
  sided: Sided,
): { estimate: number; lower: number; upper: number; lowerCount: number; upperCount: number } {
  const tail = binomialTail('hypergeometricBounds', x, n, level, sided);
  if (!(Number.isInteger(lot) && lot >= n))
    throw new RangeError('hypergeometricBounds requires an integer lot >= n');
  // Upper: P(X ≤ x | D) decreases in D; largest D (≥ x, ≤ lot − (n − x)) with cdf ≥ tail.
  let upperCount = lot - (n - x);
  if (sided !== 'lower' && x < n) {
    let lo = x; // cdf(x | D = x) = 1 > tail
    let hi = lot - (n - x);
    if (hypergeometricCdf(x, lot, hi, n) < tail) {
      while (hi - lo > 1) {
        const mid = Math.floor((lo + hi) / 2);
        if (hypergeometricCdf(x, lot, mid, n) >= tail) lo = mid;
        else hi = mid;
      }
      upperCount = lo;
    }
  }
  // Lower: P(X ≥ x | D) = 1 − P(X ≤ x − 1 | D) increases in D; smallest D with it ≥ tail.
  let lowerCount = x;
  if (sided !== 'upper' && x > 0) {
    let lo = x; // P(X ≥ x | D = x) may be tiny
    let hi = lot - (n - x); // P(X ≥ x) = 1 there
    if (1 - hypergeometricCdf(x - 1, lot, lo, n) < tail) {
      while (hi - lo > 1) {
        const mid = Math.floor((lo + hi) / 2);
        if (1 - hypergeometricCdf(x - 1, lot, mid, n) >= tail) hi = mid;
        else lo = mid;
      }
      lowerCount = hi;
    }
  }
  if (sided === 'upper') lowerCount = x;
  if (sided === 'lower') upperCount = lot - (n - x);
  return { estimate: x / n, lower: lowerCount / lot, upper: upperCount / lot, lowerCount, upperCount };
}
