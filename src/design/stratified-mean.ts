/**
 * Stratified mean — the mean over several strata (habitats, exposure units, building wings), each sampled
 * at random on its own, and how precisely it is known.
 *
 * Source: Cochran WG (1977) Sampling Techniques, 3rd ed., Wiley, ch. 5: ȳ_st = Σ W_h ȳ_h (§5.2, eq. 5.1)
 * and its estimated variance v(ȳ_st) = Σ W_h² s_h² (1 − f_h) / n_h with f_h = n_h / N_h (§5.3, Theorem 5.3
 * with s_h² in place of S_h²). Effective degrees of freedom by Satterthwaite (§5.4; see satterthwaite-df.ts).
 * Preconditions: at least one stratum; weights W_h > 0 (area shares or stratum sizes N_h — they are
 * rescaled to sum to 1); for each stratum n_h ≥ 0, variance s_h² ≥ 0 (divisor n_h − 1); optional stratum
 * size N_h ≥ n_h for the finite population correction.
 * Returns: `ok` with the mean, variance, standard error (data units) and effective df; or `too-few` naming
 * the strata with fewer than two entries (no within-stratum variance can be estimated from one value).
 * Validity: assumes simple random sampling inside each stratum and weights known without error.
 * @example stratifiedMean([{ name: 'a', weight: 0.5, n: 4, mean: 10, variance: 4 },
 *   { name: 'b', weight: 0.5, n: 4, mean: 20, variance: 16 }]) // { status: 'ok', mean: 15, variance: 1.25, … }
 */
import { satterthwaiteDf } from './satterthwaite-df.ts';

export interface StratumSummary {
  name: string;
  /** Stratum weight: area share or stratum size (rescaled so that the weights sum to 1). */
  weight: number;
  n: number;
  mean: number;
  /** Sample variance within the stratum (divisor n − 1); ignored when n < 2. */
  variance: number;
  /** Stratum size N_h (number of units), for the finite population correction. */
  population?: number;
}

export type StratifiedMeanResult =
  | {
      status: 'ok';
      mean: number;
      variance: number;
      se: number;
      /** Satterthwaite effective degrees of freedom; null when the variance is zero. */
      df: number | null;
      /** The normalised weights, in the order given. */
      weights: number[];
    }
  | { status: 'too-few'; strata: string[] };

export function stratifiedMean(strata: readonly StratumSummary[]): StratifiedMeanResult {
  if (strata.length === 0) throw new RangeError('stratifiedMean requires at least one stratum');
  let weightSum = 0;
  for (const s of strata) {
    if (!(Number.isFinite(s.weight) && s.weight > 0))
      throw new RangeError('stratifiedMean requires every weight > 0');
    if (!(Number.isInteger(s.n) && s.n >= 0)) throw new RangeError('stratifiedMean requires n >= 0');
    if (s.population !== undefined && !(s.population >= s.n))
      throw new RangeError('stratifiedMean requires population >= n in every stratum');
    weightSum += s.weight;
  }
  const tooFew = strata.filter((s) => s.n < 2).map((s) => s.name);
  if (tooFew.length > 0) return { status: 'too-few', strata: tooFew };
  const weights = strata.map((s) => s.weight / weightSum);
  let mean = 0;
  let variance = 0;
  const components: { v: number; df: number }[] = [];
  strata.forEach((s, i) => {
    if (!(s.variance >= 0)) throw new RangeError('stratifiedMean requires every variance >= 0');
    const w = weights[i]!;
    const fpc = s.population === undefined ? 1 : 1 - s.n / s.population;
    const v = (w * w * s.variance * fpc) / s.n;
    mean += w * s.mean;
    variance += v;
    components.push({ v, df: s.n - 1 });
  });
  return { status: 'ok', mean, variance, se: Math.sqrt(variance), df: satterthwaiteDf(components), weights };
}
