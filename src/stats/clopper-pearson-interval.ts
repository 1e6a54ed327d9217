/**
 * Clopper–Pearson ("exact") interval — the conservative interval that inverts the binomial test; its
 * coverage is never below the stated level. At x = 0 the one-sided upper bound is 1 − α^{1/n}.
 *
 * Source: Clopper CJ, Pearson ES (1934) The use of confidence or fiducial limits illustrated in the case of
 * the binomial, Biometrika 26:404–413; Newcombe (1998) method 5: L = Beta⁻¹(α/2; x, n−x+1),
 * U = Beta⁻¹(1−α/2; x+1, n−x); L = 0 at x = 0, U = 1 at x = n. One-sided bounds use α; at x = 0 the
 * one-sided upper bound is the closed form 1 − α^{1/n} (Hanley & Lippman-Hand 1983, JAMA 249:1743–1745,
 * whose "rule of three" 3/n approximates it at 95 %).
 * Preconditions: integers 0 ≤ x ≤ n, n ≥ 1; tail probability ≥ 1e-7.
 * Returns: estimate x/n, lower, upper in [0, 1].
 * Validity: all n; noticeably wider than Wilson.
 * @example clopperPearsonInterval(0, 20, 0.95, 'upper').upper // 0.1391 (= 1 − 0.05^{1/20})
 */
import type { Sided } from '../model/types.ts';
import { type BinomialInterval, binomialTail } from './binomial-args.ts';
import { betaQuantile } from './distributions.ts';

export function clopperPearsonInterval(x: number, n: number, level: number, sided: Sided): BinomialInterval {
  const tail = binomialTail('clopperPearsonInterval', x, n, level, sided);
  let upper: number;
  if (sided === 'lower' || x === n) upper = 1;
  else if (x === 0) upper = 1 - tail ** (1 / n);
  else upper = betaQuantile(1 - tail, x + 1, n - x);
  let lower: number;
  if (sided === 'upper' || x === 0) lower = 0;
  else if (x === n) lower = tail ** (1 / n);
  else lower = betaQuantile(tail, x, n - x + 1);
  return { estimate: x / n, lower, upper };
}
