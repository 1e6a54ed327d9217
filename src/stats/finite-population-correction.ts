/**
 * Finite population correction — how much smaller the standard error of a mean is when n of N units are
 * drawn without replacement.
 *
 * Source: Cochran WG (1977) Sampling Techniques, 3rd ed., Wiley, ch. 2, eq. 2.12: SE(x̄) = (s/√n)·√(1 − n/N).
 * Preconditions: integers 1 ≤ n ≤ N (N = the population or lot size, sampling without replacement).
 * Returns: the factor √(1 − n/N) in [0, 1); 1 when N is undefined (infinite population).
 * Validity: 0 at n = N (the whole population is measured: no sampling error).
 * @example finitePopulationCorrection(50, 200) // 0.8660…
 */
export function finitePopulationCorrection(n: number, population: number | undefined): number {
  if (population === undefined) return 1;
  if (!(Number.isFinite(population) && population >= 1))
    throw new RangeError('finitePopulationCorrection requires population >= 1');
  if (!(n >= 0 && n <= population))
    throw new RangeError('finitePopulationCorrection requires 0 <= n <= population');
  return Math.sqrt(Math.max(0, 1 - n / population));
}
