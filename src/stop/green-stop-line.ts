/**
 * Green's fixed-precision stop line for counts — "have I counted enough plots for precision D?",
 * when the crew knows Taylor's power law for its organism.
 *
 * For a field user: add up the counts as you go (the running total). The line tells you, for each number
 * of plots, the total at which you may stop. With the usual clumped organisms (b < 2) the line falls as
 * you count more plots: stop once your total reaches it. When b > 2 the direction reverses: stop once
 * your total is at or below the line.
 *
 * Source: Green RH (1970) On fixed precision level sequential sampling, Researches on Population
 * Ecology 12:249–251; Taylor LR (1961) Aggregation, variance and the mean, Nature 189:732–735
 * (s² = a·m^b). With D = SE/mean, n·m² D² = a·m^b gives the line
 *   ln Tₙ = ln(D²/a)/(b − 2) + ((b − 1)/(b − 2))·ln n,  i.e.  Tₙ = (D²/a)^{1/(b−2)} · n^{(b−1)/(b−2)}.
 * b = 2 has no line: the fixed size n = a/D² (Green 1970).
 *
 * Preconditions: a > 0, b > 0, D > 0, n ≥ 1.
 * Returns: the stop total (counts, summed over n plots) and the direction of the stopping inequality;
 * for b = 2 the total is +∞ (below a/D² plots) or 0 (at or beyond), direction 'at-least'.
 * Validity: D is SE/mean, not a confidence half-width (r = z·D). The line is only as good as a and b for
 * this site; realised precision is worse when stopping happens at small n (validate by simulation, as
 * Binns MR, Nyrop JP, van der Werf W (2000) Sampling and Monitoring in Crop Protection, CABI, recommend;
 * this project's check is test/bench/coverage.md).
 *
 * @example greenStopLine({ a: 2, b: 1.5, D: 0.25 }, 10) // { total: 102.4, stopWhen: 'at-least' }
 */
export interface StopLinePoint {
  /** The running total at which the line is crossed. */
  total: number;
  /** 'at-least': stop when Tₙ ≥ total; 'at-most': stop when Tₙ ≤ total (Taylor's b > 2). */
  stopWhen: 'at-least' | 'at-most';
}

export function greenStopLine(coef: { a: number; b: number; D: number }, n: number): StopLinePoint {
  const { a, b, D } = coef;
  if (!(a > 0) || !(b > 0) || !(D > 0)) throw new RangeError('greenStopLine requires a > 0, b > 0 and D > 0');
  if (!(n >= 1)) throw new RangeError('greenStopLine requires n >= 1');
  if (b === 2) return { total: n >= a / (D * D) ? 0 : Number.POSITIVE_INFINITY, stopWhen: 'at-least' };
  const total = Math.exp(Math.log((D * D) / a) / (b - 2) + ((b - 1) / (b - 2)) * Math.log(n));
  return { total, stopWhen: b < 2 ? 'at-least' : 'at-most' };
}
