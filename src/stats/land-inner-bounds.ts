/**
 * An interval inside Land's exact interval, from a table of Land's factor at grid nodes — so that replay's
 * stop-only loop can settle a `keep going` without solving for H at every entry (each entry brings a new
 * n and s_y, and the standard rule's level moves with s_y).
 *
 * Source: Land (1971) via land-interval.ts. The limit offsets D_p(n, s) = s·H_p(n, s)/√(n − 1) (the limit is
 * exp(ȳ + s²/2 + D)) grow with p, and in s the upper offset (p > ½) grows and the lower one (p < ½) falls:
 * the interval widens with the spread (checked on a grid of n from 3 to 10⁵, s_y from 0.01 to 6 and p from
 * 1e-4 to 1 − 1e-4 in test/core/stats/land-inner-bounds.test.ts). So with s_lo ≤ s the node below s and
 * p_lo ≤ p ≤ p_hi the nodes around p (equal steps of the normal quantile), D_upper(n, s_lo, p_lo) ≤
 * D_upper(n, s, p) and D_lower(n, s_lo, p_hi) ≥ D_lower(n, s, p). Each offset is then moved a further
 * 1e-7 of its size (at least of s/√(n − 1)) toward the centre, far beyond the 1e-10 to which H is solved.
 * Nodes are kept (a Map keyed by tier, n and the two grid indices) and shared by every sequence, so their
 * cost is paid once per node; tier 0 has steps of 2 % in s and 0.02 in z, tier 1 of 0.2 % and 0.002.
 * Preconditions: integer n ≥ 3, 0.001 ≤ s_y ≤ 10, 0 < level < 1.
 * Returns: inner lower and upper limits (0 / +∞ on an open side), or null outside the table's range or
 * for a tier beyond the last (the caller computes the exact interval).
 * @example landInnerBounds(50, 0, 1, 0.95, 'two', 1) // lower ≥ landInterval(…).lower, upper ≤ its upper
 */
import type { Sided } from '../model/types.ts';
import { normalCdf, normalQuantile } from './distributions.ts';
import { landH } from './land-interval.ts';

const STEPS = [0.02, 0.004, 0.0008];
/** A node at most this close (in z) to the level's own quantile is skipped for the next one out. */
const Z_GUARD = 1e-4;
const MARGIN = 1e-7;
const MAX_NODES = 2_000_000;
const N_MAX = 1_000_000;

const nodes = new Map<number, number>();

// the last two probabilities asked and their normal quantiles (a two-sided interval asks p and 1 − p; the
// naive rule asks the same ones at every entry, the standard rule new ones as its level moves)
let p1 = Number.NaN;
let z1 = 0;
let p2 = Number.NaN;
let z2 = 0;
function quantileOf(p: number): number {
  if (p === p1) return z1;
  if (p === p2) return z2;
  const z = normalQuantile(p);
  p2 = p1;
  z2 = z1;
  p1 = p;
  z1 = z;
  return z;
}

/** D_p(n, s) at grid node (sIndex, zIndex) of a tier: s = e^{step·sIndex}, p = Φ(step·zIndex). */
function nodeOffset(tier: number, n: number, sIndex: number, zIndex: number): number {
  const key = ((n * 16384 + sIndex + 8192) * 16384 + zIndex + 8192) * 2 + tier;
  const hit = nodes.get(key);
  if (hit !== undefined) return hit;
  const step = STEPS[tier] as number;
  const s = Math.exp(step * sIndex);
  const h = landH(n, s, normalCdf(step * zIndex));
  const d = (s * h) / Math.sqrt(n - 1);
  if (nodes.size >= MAX_NODES) nodes.clear();
  nodes.set(key, d);
  return d;
}

export function landInnerBounds(
  n: number,
  logMean: number,
  logSd: number,
  level: number,
  sided: Sided,
  tier: number,
): { lower: number; upper: number } | null {
  const step = STEPS[tier];
  if (step === undefined || !(n >= 3 && n < N_MAX) || !(logSd >= 0.001 && logSd <= 10)) return null;
  const alpha = 1 - level;
  const pUpper = sided === 'two' ? 1 - alpha / 2 : level;
  const pLower = sided === 'two' ? alpha / 2 : alpha;
  if (!(pLower >= 1e-5 && pUpper <= 1 - 1e-5)) return null;
  const sIndex = Math.floor(Math.log(logSd) / step);
  // s_lo = e^{step·sIndex} must not exceed s (rounding in log/exp): step down when too close
  const sLo = Math.exp(step * sIndex) <= logSd ? sIndex : sIndex - 1;
  const centre = logMean + (logSd * logSd) / 2;
  const k = logSd / Math.sqrt(n - 1);
  let upper = Number.POSITIVE_INFINITY;
  let lower = 0;
  if (sided !== 'lower') {
    const z = quantileOf(pUpper);
    let zi = Math.floor(z / step);
    if (z - zi * step < Z_GUARD) zi--;
    const d = nodeOffset(tier, n, sLo, zi);
    upper = Math.exp(centre + d - MARGIN * Math.max(Math.abs(d), k));
  }
  if (sided !== 'upper') {
    const z = quantileOf(pLower);
    let zi = Math.ceil(z / step);
    if (zi * step - z < Z_GUARD) zi++;
    const d = nodeOffset(tier, n, sLo, zi);
    lower = Math.exp(centre + d + MARGIN * Math.max(Math.abs(d), k));
  }
  return { lower, upper };
}
