/**
 * Half-limit substitution — the mean and SD after replacing each non-detect by half its reporting limit.
 * Offered ONLY as an explicit, labelled option where a regulation prescribes it.
 *
 * Source: the substitution practice described (and advised against for estimation) in Helsel DR (2012)
 * Statistics for Censored Environmental Data Using Minitab and R, 2nd ed., ch. 1 and 6; USEPA (2009)
 * Unified Guidance §15.2 (simple substitution, acceptable only for few non-detects).
 * Preconditions: points with finite values; a censored point's value is its reporting limit.
 * Returns: `ok` with n, the number substituted, mean and SD (divisor n − 1) of the substituted data, se =
 * SD/√n; `too-few` with fewer than two points.
 * Validity: invents values; biased, with an SD that depends on the arbitrary factor ½. Never the default.
 * @example halfLimitSubstitution([{ value: 1, censored: true }, { value: 2 }, { value: 3 }]) // mean 1.833…
 */
import type { Point } from '../model/types.ts';
import { RunningMoments } from '../stats/running-moments.ts';

export type SubstitutionResult =
  | { status: 'ok'; n: number; substituted: number; mean: number; sd: number; se: number }
  | { status: 'too-few'; n: number };

export function halfLimitSubstitution(points: readonly Point[]): SubstitutionResult {
  const xs = points.map((p) => {
    if (!Number.isFinite(p.value)) throw new RangeError('halfLimitSubstitution requires finite values');
    return p.censored ? p.value / 2 : p.value;
  });
  const n = xs.length;
  if (n < 2) return { status: 'too-few', n };
  const { mean, m2 } = RunningMoments.of(xs);
  const sd = Math.sqrt(m2 / (n - 1));
  return {
    status: 'ok',
    n,
    substituted: points.filter((p) => p.censored).length,
    mean,
    sd,
    se: sd / Math.sqrt(n),
  };
}
