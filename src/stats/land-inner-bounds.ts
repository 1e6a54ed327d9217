/**
 * An interval inside Land's exact interval, from a table of Land's factor at grid nodes — so that replay's
 * stop-only loop can settle a `keep going` without solving for H at every entry (each entry brings a new
 * n and s_y, and the standard rule's level moves with s_y).
 *
 * Source: Land (1971) via land-interval.ts. The limit offsets D_p(n, s) = s·H_p(n, s)/√(n − 1) (the limit is
 * exp(ȳ + s²/2 + D)) grow with p, and in s the upper offset (p > ½) grows and the lower one (p < ½) falls:
 * the interval widens with the spread (checked on a grid of n from 3 to 10⁵, s_y from 0.01 to 6 and p from
 * 1e-4 to 1 − 1e-4 in test/core/stats/replay-brackets.test.ts). So with s_lo ≤ s the node below s and
 * p_lo ≤ p ≤ p_hi the nodes around p (equal steps of the log-odds: no quantile to compute per entry),
 * D_upper(n, s_lo, p_lo) ≤ D_upper(n, s, p) and D_lower(n, s_lo, p_hi) ≥ D_lower(n, s, p). Each offset is
 * then moved a further 1e-7 of its size (at least of s/√(n − 1)) toward the centre, far beyond the 1e-10
 * to which H is solved.
 * Above n = 64 the upper offset falls and the lower one rises with n (tail probabilities ≤ 0.05), so n is
 * rounded up to a grid node as well.
 * Nodes are kept (a Map keyed by tier, n and the two grid indices) and shared by every sequence, so their
 * cost is paid once per node; tier 0 has steps of 2 % in s and 0.04 in log-odds, tier 1 of 0.4 % and
 * 0.008, tier 2 of 0.08 % and 0.0016.
 * Preconditions: integer n ≥ 3, 0.001 ≤ s_y ≤ 10, 0 < level < 1.
 * Returns: inner lower and upper limits (0 / +∞ on an open side), or null outside the table's range or
 * for a tier beyond the last (the caller computes the exact interval).
 * @example landInnerBounds(50, 0, 1, 0.95, 'two', 1) // lower ≥ landInterval(…).lower, upper ≤ its upper
 */
import type { Sided } from '../model/types.ts';
import { landH } from './land-interval.ts';

const STEPS = [0.02, 0.004, 0.0008];
/** Grid in n per tier (none at the last: the exact n). */
const N_SHIFTS = [5, 8];
/** A node at most this close (in log-odds) to the level's own probability is skipped for the next one out. */
const P_GUARD = 1e-6;
const MARGIN = 1e-7;
const MAX_NODES = 2_000_000;
const N_MAX = 1_000_000;

const nodes = new Map<number, number>();

/** D_p(n, s) at grid node (sIndex, tIndex) of a tier: s = e^{step·sIndex}, logit p = 2·step·tIndex. */
function nodeOffset(tier: number, n: number, sIndex: number, tIndex: number): number {
  const key = ((n * 16384 + sIndex + 8192) * 16384 + tIndex + 8192) * 4 + tier;
  const hit = nodes.get(key);
  if (hit !== undefined) return hit;
  const step = STEPS[tier] as number;
  const s = Math.exp(step * sIndex);
  const h = landH(n, s, 1 / (1 + Math.exp(-2 * step * tIndex)));
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
  // n on a grid too where the offsets are monotone in n (the interval narrows as n grows; checked for tail
  // probabilities up to 0.1 from n = 3): the node at or above n, a multiple of 2^(⌊log₂ n⌋ − 5) at tier 0
  // (steps of at most 3 %) and of 2^(⌊log₂ n⌋ − 8) at tier 1 — so a long sequence shares nodes too
  let nNode = n;
  const shift = N_SHIFTS[tier];
  if (shift !== undefined && n >= 64 && pLower <= 0.05 && pUpper >= 0.95) {
    const q = 2 ** (Math.floor(Math.log2(n)) - shift);
    nNode = Math.ceil(n / q) * q;
  }
  const sIndex = Math.floor(Math.log(logSd) / step);
  // s_lo = e^{step·sIndex} must not exceed s (rounding in log/exp): step down when too close
  const sLo = Math.exp(step * sIndex) <= logSd ? sIndex : sIndex - 1;
  const centre = logMean + (logSd * logSd) / 2;
  const k = logSd / Math.sqrt(n - 1);
  let upper = Number.POSITIVE_INFINITY;
  let lower = 0;
  if (sided !== 'lower') {
    const t = Math.log(pUpper / (1 - pUpper));
    let ti = Math.floor(t / (2 * step));
    if (t - ti * 2 * step < P_GUARD) ti--;
    const d = nodeOffset(tier, nNode, sLo, ti);
    upper = Math.exp(centre + d - MARGIN * Math.max(Math.abs(d), k));
  }
  if (sided !== 'upper') {
    const t = Math.log(pLower / (1 - pLower));
    let ti = Math.ceil(t / (2 * step));
    if (ti * 2 * step - t < P_GUARD) ti++;
    const d = nodeOffset(tier, nNode, sLo, ti);
    lower = Math.exp(centre + d + MARGIN * Math.max(Math.abs(d), k));
  }
  return { lower, upper };
}
