/**
 * The pilot's mean and standard deviation — the first m observations (or their logarithms), which
 * two-stage rules and the SPRT on measurements fix once the pilot is complete.
 *
 * Source: the sample mean and SD with divisor m − 1 (any text), by Welford's (1962, Technometrics
 * 4:419–420) one-pass update over the first m values.
 * Preconditions: 2 ≤ m ≤ values.length; with log = true all pilot values must be > 0.
 * Returns mean and SD in the data's units (or log units). Cost O(m), independent of the study size.
 *
 * @example pilotStats([1, 2, 3, 4], 3) // { mean: 2, sd: 1 }
 */
export function pilotStats(values: readonly number[], m: number, log = false): { mean: number; sd: number } {
  if (!(m >= 2) || m > values.length) throw new RangeError('pilotStats requires 2 <= m <= values.length');
  let mean = 0;
  let m2 = 0;
  for (let i = 0; i < m; i++) {
    const v = values[i] as number;
    if (log && !(v > 0)) throw new RangeError('pilotStats requires positive values on the log scale');
    const x = log ? Math.log(v) : v;
    const d = x - mean;
    mean += d / (i + 1);
    m2 += d * (x - mean);
  }
  return { mean, sd: Math.sqrt(Math.max(0, m2) / (m - 1)) };
}
