/**
 * Degrees of freedom of a sample variance under non-normal data — how much less a variance from n values
 * tells about σ² when the data have heavy tails.
 *
 * Source: Box GEP (1953) Non-normality and tests on variances, Biometrika 40:318–335: Var(s²/σ²) =
 * 2/(n − 1) + γ₂/n with γ₂ the excess kurtosis, so s²/σ² is approximated by χ²_ν/ν with
 * ν = 2/(2/(n − 1) + γ₂/n) (the chi-square matched in its first two moments; ν = n − 1 for normal data).
 * Preconditions: n ≥ 2; γ₂ a finite number (the sample's g₂ may stand in). Light tails (γ₂ < 0) are not
 * credited: the result is at most n − 1, so a range only ever widens.
 * Returns: ν in (0, n − 1].
 * Validity: a two-moment approximation; g₂ from a small sample underestimates heavy tails.
 * @example boxVarianceDf(30, 6) // 2/(2/29 + 6/30) = 7.44
 */
export function boxVarianceDf(n: number, excessKurtosis: number): number {
  if (!(n >= 2)) throw new RangeError('boxVarianceDf requires n >= 2');
  if (!Number.isFinite(excessKurtosis)) throw new RangeError('boxVarianceDf requires a finite kurtosis');
  return 2 / (2 / (n - 1) + Math.max(0, excessKurtosis) / n);
}
