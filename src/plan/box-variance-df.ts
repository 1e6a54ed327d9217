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

/**
 * The sample excess kurtosis with its small-sample bias removed, G₂ = ((n + 1)·g₂ + 6)·(n − 1)/((n − 2)(n − 3)):
 * g₂ = n·M4/M2² − 3 reads heavy tails far too light in a small sample, and the range of "how many more" built on
 * it missed high on skewed data (test/bench/calibration.md: +3 to +7 points of range held with G₂).
 * Source: Joanes DN, Gill CA (1998) Comparing measures of sample skewness and kurtosis, The Statistician
 * 47:183–189 (G₂, unbiased under normality; the estimator of SAS, SPSS and Excel's KURT).
 * Preconditions: n ≥ 4. Returns g₂ unchanged below four values.
 * @example adjustedExcessKurtosis(10, 2) // (11·2 + 6)·9/(8·7) = 4.5
 */
export function adjustedExcessKurtosis(n: number, g2: number): number {
  if (!(n >= 4)) return g2;
  return (((n + 1) * g2 + 6) * (n - 1)) / ((n - 2) * (n - 3));
}
