/**
 * Design effect — how many times larger the variance of a cluster estimate is than if the same number of
 * entries had been independent, and what the entries are worth as independent observations.
 *
 * Source: Kish L (1965) Survey Sampling, Wiley, §8.2: deff = Var_design / Var_SRS, deff ≈ 1 + (m̄ − 1)ρ with
 * ρ the intraclass correlation; effective n = entries / deff. Treating quadrats on one transect as
 * independent is pseudoreplication (Hurlbert SH (1984) Ecol Monogr 54:187–211).
 * Preconditions: clusterVariance ≥ 0 (the variance of the cluster estimate, without finite population
 * correction), elementVariance > 0 (sample variance of all entries, divisor N − 1), entries ≥ 2,
 * meanSize ≥ 1.
 * Returns: deff, the effective number of independent entries, and ρ = (deff − 1)/(m̄ − 1) clipped to
 * [−1/(m̄ − 1), 1] (null when every primary unit holds one entry).
 * Validity: a ratio of two estimates, itself noisy with few primary units; ρ is the moment form, not a
 * variance-components fit.
 * @example designEffect({ clusterVariance: 0.3, elementVariance: 2, entries: 20, meanSize: 4 })
 *   // { deff: 3, effectiveN: 6.666…, rho: 0.666… }
 */
export interface DesignEffect {
  deff: number;
  /** Null when deff is 0 (no variation between primary units beyond what their sizes explain). */
  effectiveN: number | null;
  rho: number | null;
}

export function designEffect(args: {
  clusterVariance: number;
  elementVariance: number;
  entries: number;
  meanSize: number;
}): DesignEffect {
  const { clusterVariance, elementVariance, entries, meanSize } = args;
  if (!(clusterVariance >= 0)) throw new RangeError('designEffect requires clusterVariance >= 0');
  if (!(elementVariance > 0)) throw new RangeError('designEffect requires elementVariance > 0');
  if (!(entries >= 2)) throw new RangeError('designEffect requires entries >= 2');
  if (!(meanSize >= 1)) throw new RangeError('designEffect requires meanSize >= 1');
  const deff = clusterVariance / (elementVariance / entries);
  return {
    deff,
    effectiveN: deff > 0 ? entries / deff : null,
    rho: meanSize > 1 ? Math.min(1, Math.max(-1 / (meanSize - 1), (deff - 1) / (meanSize - 1))) : null,
  };
}
