/**
 * Sample size for counts per plot — how many plots give a target precision of the mean count, under a
 * variance model: Poisson (Var = m), quasi-Poisson (φ·m), negative binomial (m + m²/k) or Taylor's
 * power law (a·m^b).
 *
 * Source: Krebs CJ (1999) Ecological Methodology, 2nd ed., ch. 7 (sample size for counts); Elliott JM (1977)
 * Some methods for the statistical analysis of samples of benthic invertebrates, FBA Sci. Publ. 25;
 * Karandinos MG (1976) Optimum sample size and comments on some published formulae, Bull Entomol Soc Am
 * 22:417–421 (Taylor form). With V the variance per plot: precision D = SE/mean → n = V/(m²D²)
 * (NB: (1/m + 1/k)/D²; Taylor: a·m^{b−2}/D²); relative half-width r → n = (z/r)²·V/m²; absolute half-width
 * d → n = z²·V/d². With a population of N plots, n = n₀/(1 + n₀/N) (Cochran 1977 ch. 2).
 * Preconditions: m > 0; k > 0; a > 0; 0 < p < 1 for the quantile; the target value > 0.
 * Returns: n (real; round up), ≤ N when given.
 * Validity: the variance model must fit the organism and habitat (k, a, b come from earlier surveys).
 * @example countSampleSize({ m: 2, variance: { kind: 'negative-binomial', k: 0.5 }, target: 'precision', value: 0.25 }) // 40
 */
export type CountVarianceModel =
  | { kind: 'poisson' }
  | { kind: 'quasi-poisson'; dispersion: number }
  | { kind: 'negative-binomial'; k: number }
  | { kind: 'taylor'; a: number; b: number };

/** Variance per plot at mean m under the model. */
export function countVariance(m: number, model: CountVarianceModel): number {
  switch (model.kind) {
    case 'poisson':
      return m;
    case 'quasi-poisson':
      return model.dispersion * m;
    case 'negative-binomial':
      if (!(model.k > 0)) throw new RangeError('countVariance requires k > 0');
      return m + (m * m) / model.k;
    case 'taylor':
      if (!(model.a > 0)) throw new RangeError('countVariance requires a > 0');
      return model.a * m ** model.b;
  }
}

export function countSampleSize(args: {
  m: number;
  variance: CountVarianceModel;
  target: 'precision' | 'relative' | 'margin';
  value: number;
  /** Quantile multiplier (z or t) for half-width targets; ignored for precision. */
  multiplier?: number;
  population?: number;
}): number {
  const { m, variance, target, value, population } = args;
  if (!(m > 0)) throw new RangeError('countSampleSize requires m > 0');
  if (!(value > 0)) throw new RangeError('countSampleSize requires a target value > 0');
  const v = countVariance(m, variance);
  const q = args.multiplier ?? 1.959963984540054;
  const n0 =
    target === 'precision'
      ? v / (m * m * value * value)
      : target === 'relative'
        ? ((q / value) ** 2 * v) / (m * m)
        : (q * q * v) / (value * value);
  return population === undefined ? n0 : n0 / (1 + n0 / population);
}
