/**
 * Kuno's fixed-precision stop line for counts — "have I counted enough plots for precision D?",
 * when the crew knows Iwao's patchiness regression for its organism.
 *
 * For a field user: keep a running total of the counts. After each plot, the line gives the total you
 * need to reach to stop. In the first plots there is no line at all (no number of insects would be
 * enough yet); the line then falls as you count more plots.
 *
 * Source: Kuno E (1969) A new method of sequential sampling to obtain the population estimates with a
 * fixed level of precision, Researches on Population Ecology 11:127–136; Iwao S (1968) Res. Popul. Ecol.
 * 10:1–20 (m* = α + β·m, i.e. s² = (α + 1)m + (β − 1)m²). With D = SE/mean:
 *   stop when Tₙ ≥ (α + 1) / (D² − (β − 1)/n),  defined only for n > (β − 1)/D² (Kuno 1969).
 *
 * Preconditions: α > −1, D > 0, n ≥ 1.
 * Returns: the stop total (Tₙ ≥ total), or null where the line is undefined (no stopping yet).
 * Validity: D is SE/mean. Realised precision is worse than D when stopping happens at small n or when
 * α, β come from other sites (validate by simulation, as Binns, Nyrop & van der Werf 2000 recommend;
 * this project's check is test/bench/coverage.md).
 *
 * @example kunoStopLine({ alpha: 0.5, beta: 1.3, D: 0.2 }, 20) // 60
 */
export function kunoStopLine(coef: { alpha: number; beta: number; D: number }, n: number): number | null {
  const { alpha, beta, D } = coef;
  if (!(alpha > -1) || !Number.isFinite(beta) || !(D > 0))
    throw new RangeError('kunoStopLine requires alpha > -1, a finite beta and D > 0');
  if (!(n >= 1)) throw new RangeError('kunoStopLine requires n >= 1');
  const denom = D * D - (beta - 1) / n;
  if (!(denom > 0)) return null;
  return (alpha + 1) / denom;
}
