/**
 * Cluster (ratio) mean — the mean per quadrat (or per increment, per room) when the entries come in primary
 * units of unequal size (quadrats on transects, rooms in buildings), with the primary units as replicates.
 *
 * Source: Cochran WG (1977) Sampling Techniques, 3rd ed., ch. 9 (cluster sampling, units of unequal size) treated as
 * a ratio estimate (§6.2–6.3: v(R) = (1 − f) / (n X̄²) · Σ (y_i − R x_i)² / (n − 1)); the same estimator and
 * worked example in Scheaffer RL, Mendenhall W & Ott L, Elementary Survey Sampling, ch. 8 (eqs 8.1–8.2):
 * ȳ = Σ y_i / Σ m_i, v(ȳ) = (1 − n/N) / (n m̄²) · Σ (y_i − ȳ m_i)² / (n − 1), m̄ = Σ m_i / n.
 * Preconditions: clusters with total y_i (sum of the entries in the unit) and size m_i ≥ 1 (entries in the
 * unit); N = number of primary units in the population (optional, ≥ n) for the finite population correction.
 * Returns: `ok` with the mean per entry, its variance and standard error, df = n − 1 (n = primary units), the
 * number of entries and the mean cluster size; `too-few` with fewer than two primary units.
 * Validity: the ratio estimator is biased in small samples (bias → 0 as n grows; Scheaffer et al. advise
 * n ≥ 20 primary units for a good variance estimate); clusters are assumed drawn at random.
 * @example clusterRatioMean([{ total: 10, size: 2 }, { total: 30, size: 4 }, { total: 12, size: 3 }])
 *   // { status: 'ok', mean: 5.777…, … }
 */
export interface ClusterSummary {
  total: number;
  size: number;
}

export type ClusterRatioResult =
  | {
      status: 'ok';
      mean: number;
      variance: number;
      se: number;
      df: number;
      clusters: number;
      entries: number;
      meanSize: number;
    }
  | { status: 'too-few'; clusters: number };

export function clusterRatioMean(
  clusters: readonly ClusterSummary[],
  populationClusters?: number,
): ClusterRatioResult {
  const n = clusters.length;
  for (const c of clusters) {
    if (!Number.isFinite(c.total)) throw new RangeError('clusterRatioMean requires finite totals');
    if (!(Number.isInteger(c.size) && c.size >= 1))
      throw new RangeError('clusterRatioMean requires every size >= 1');
  }
  if (populationClusters !== undefined && !(populationClusters >= n))
    throw new RangeError('clusterRatioMean requires populationClusters >= number of clusters');
  if (n < 2) return { status: 'too-few', clusters: n };
  let sumY = 0;
  let sumM = 0;
  for (const c of clusters) {
    sumY += c.total;
    sumM += c.size;
  }
  const r = sumY / sumM;
  let ss = 0;
  for (const c of clusters) ss += (c.total - r * c.size) ** 2;
  return clusterRatioFromSums({ units: n, totalY: sumY, totalM: sumM, residualSS: ss }, populationClusters);
}

/**
 * The same estimate from running sums (the phone updates them per entry; see unit-moments.ts): number of
 * units n ≥ 2, Σy, Σm and the residual sum of squares Σ(yᵢ − R·mᵢ)².
 */
export function clusterRatioFromSums(
  sums: { units: number; totalY: number; totalM: number; residualSS: number },
  populationClusters?: number,
): ClusterRatioResult {
  const n = sums.units;
  if (n < 2) return { status: 'too-few', clusters: n };
  const r = sums.totalY / sums.totalM;
  const sr2 = sums.residualSS / (n - 1);
  const meanSize = sums.totalM / n;
  const fpc = populationClusters === undefined ? 1 : 1 - n / populationClusters;
  const variance = (fpc * sr2) / (n * meanSize * meanSize);
  return {
    status: 'ok',
    mean: r,
    variance,
    se: Math.sqrt(variance),
    df: n - 1,
    clusters: n,
    entries: sums.totalM,
    meanSize,
  };
}
