/**
 * Neyman (optimum) allocation — how to share a total number of entries among strata so that the stratified
 * mean is as precise as possible, optionally for a given cost per entry in each stratum.
 *
 * Source: Neyman J (1934) On the two different aspects of the representative method, JRSS 97:558–625;
 * Cochran WG (1977) Sampling Techniques, 3rd ed., §5.5: n_h = n · (W_h S_h / √c_h) / Σ (W_k S_k / √c_k)
 * (eq. 5.24 with cost; with equal costs n_h ∝ W_h S_h, Theorem 5.6).
 * Preconditions: total > 0; weights W_h > 0 (rescaled to sum to 1); SDs S_h ≥ 0, not all zero; costs
 * c_h > 0 (default 1).
 * Returns: the allocation per stratum, unrounded (entries; round and keep ≥ 2 per stratum in the field).
 * Validity: minimises the variance for fixed total cost; the S_h are guesses from a pilot or earlier data,
 * and an allocation above a stratum's size N_h must be capped at N_h (Cochran §5.8).
 * @example neymanAllocation([{ weight: 0.5, sd: 1 }, { weight: 0.5, sd: 3 }], 20) // [5, 15]
 */
export interface AllocationStratum {
  weight: number;
  sd: number;
  cost?: number;
}

export function neymanAllocation(strata: readonly AllocationStratum[], total: number): number[] {
  if (strata.length === 0) throw new RangeError('neymanAllocation requires at least one stratum');
  if (!(Number.isFinite(total) && total > 0)) throw new RangeError('neymanAllocation requires total > 0');
  const scores = strata.map((s) => {
    if (!(s.weight > 0)) throw new RangeError('neymanAllocation requires every weight > 0');
    if (!(s.sd >= 0)) throw new RangeError('neymanAllocation requires every sd >= 0');
    const c = s.cost ?? 1;
    if (!(c > 0)) throw new RangeError('neymanAllocation requires every cost > 0');
    return (s.weight * s.sd) / Math.sqrt(c);
  });
  const sum = scores.reduce((a, b) => a + b, 0);
  if (!(sum > 0)) throw new RangeError('neymanAllocation requires at least one sd > 0');
  return scores.map((x) => (total * x) / sum);
}
