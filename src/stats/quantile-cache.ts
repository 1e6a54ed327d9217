/**
 * Memoised quantiles — the same Student t, chi-square and normal quantiles as the jstat facade, cached by
 * (p, df) so the per-entry path (recompute after every observation, and `replay` over thousands of
 * sequences) pays a Map lookup instead of a numerical inversion.
 *
 * Source: the quantile functions of src/stats/distributions.ts (see its doc block and the accuracy
 * table in src/stats/README.md); this file adds only memoisation.
 * Preconditions: as the facade (0 < p < 1, df > 0); errors are the facade's RangeErrors.
 * Returns: the p-quantile (left-tail convention), identical to the facade's value.
 * Validity: the cache holds at most MAX_ENTRIES values per function and is emptied when full.
 * @example cachedStudentTQuantile(0.975, 9) // 2.2621571627…, computed once, then looked up
 */
import { chiSquareQuantile, normalQuantile, studentTQuantile } from './distributions.ts';

const MAX_ENTRIES = 200_000;

/** Numerical inversions done so far (cache misses), for tests that check the per-entry path's cost. */
let misses = 0;
/** Number of quantiles computed rather than looked up since the module was loaded. */
export function quantileCacheMisses(): number {
  return misses;
}

function memo2(fn: (p: number, df: number) => number): (p: number, df: number) => number {
  const byP = new Map<number, Map<number, number>>();
  let size = 0;
  return (p: number, df: number): number => {
    let byDf = byP.get(p);
    if (byDf === undefined) {
      byDf = new Map();
      byP.set(p, byDf);
    }
    const hit = byDf.get(df);
    if (hit !== undefined) return hit;
    const q = fn(p, df);
    misses++;
    if (size >= MAX_ENTRIES) {
      byP.clear();
      size = 0;
      byP.set(p, byDf);
      byDf.clear();
    }
    byDf.set(df, q);
    size++;
    return q;
  };
}

/** Student t p-quantile with df degrees of freedom, memoised. */
export const cachedStudentTQuantile = memo2(studentTQuantile);
/** Chi-square p-quantile with df degrees of freedom, memoised. */
export const cachedChiSquareQuantile = memo2(chiSquareQuantile);

const normalCache = new Map<number, number>();
/** Standard normal p-quantile, memoised. */
export function cachedNormalQuantile(p: number): number {
  const hit = normalCache.get(p);
  if (hit !== undefined) return hit;
  const q = normalQuantile(p);
  misses++;
  if (normalCache.size >= MAX_ENTRIES) normalCache.clear();
  normalCache.set(p, q);
  return q;
}
