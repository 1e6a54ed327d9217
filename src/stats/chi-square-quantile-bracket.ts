/**
 * A cheap two-sided bracket on the chi-square quantile — "between which two numbers does χ²₍p, ν₎ lie?",
 * so that a per-entry check (replay's stop-only loop, the default count method's dispersion test) can settle
 * most comparisons without the numerical inversion, which costs O(ν) in jstat and is asked at a new ν after
 * every count entry.
 *
 * Source: Wilson EB, Hilferty MM (1931) The distribution of chi-square, PNAS 17:684–688 — the cube-root
 * normal approximation χ²₍p, ν₎ ≈ ν(1 − 2/(9ν) + z_p·√(2/(9ν)))³. Its error, measured on a grid of ν from
 * 1 to 4e6 and p from 1e-6 to 1 − 1e-6 against the facade's quantile (src/stats/distributions.ts: jstat
 * below 2e6 df) and against scipy.stats.chi2.ppf polished with mpmath at 40 digits, is at most
 * 0.037·(1 + |z_p|³)/√ν (largest near p = 0.3 at ν ≈ 20; test/core/stats/replay-brackets.test.ts). The
 * bracket is the approximation ± ERROR_BOUND·(1 + |z_p|³)/√ν with ERROR_BOUND = 0.1, nearly three times
 * the largest error measured.
 * Preconditions: 1e-6 ≤ p ≤ 1 − 1e-6 (null outside: the caller inverts), ν > 0.
 * Returns: { lo, hi } with lo ≤ χ²₍p, ν₎ ≤ hi; lo is never below 0.
 * @example chiSquareQuantileBracket(0.95, 99) // { lo: 123.21…, hi: 123.24… } around 123.2252
 */
import { normalQuantile } from './distributions.ts';

const ERROR_BOUND = 0.1;
const P_LOW = 1e-6;

// The last few probabilities asked and their normal quantiles: per count entry the dispersion test asks one
// fixed p and a two-sided exact Poisson interval p and 1 − p; a Map would fill with the standard rule's
// level, which moves with the data.
const SLOTS = 4;
const memoP = new Float64Array(SLOTS).fill(Number.NaN);
const memoZ = new Float64Array(SLOTS);
let next = 0;
function quantileOf(p: number): number {
  for (let i = 0; i < SLOTS; i++) if (memoP[i] === p) return memoZ[i] as number;
  const z = normalQuantile(p);
  memoP[next] = p;
  memoZ[next] = z;
  next = (next + 1) % SLOTS;
  return z;
}

export function chiSquareQuantileBracket(p: number, df: number): { lo: number; hi: number } | null {
  if (!(p >= P_LOW && p <= 1 - P_LOW) || !(df > 0)) return null;
  const z = quantileOf(p);
  const c = 2 / (9 * df);
  const w = 1 - c + z * Math.sqrt(c);
  const q = w > 0 ? df * w * w * w : 0;
  const a = Math.abs(z);
  const e = (ERROR_BOUND * (1 + a * a * a)) / Math.sqrt(df);
  return { lo: Math.max(0, q - e), hi: q + e };
}
