/**
 * Kaplan–Meier mean and SD for data with non-detects — the mean and spread of concentrations when some
 * results are only known to lie below their reporting limit (`<RL`, each with its own limit).
 *
 * Source: Kaplan EL & Meier P (1958) JASA 53:457–481, applied to left-censored data by "flipping"
 * (Helsel DR (2012) Statistics for Censored Environmental Data Using Minitab and R, 2nd ed., Wiley, ch. 6;
 * USEPA (2009) Statistical Analysis of Groundwater Monitoring Data at RCRA Facilities — Unified Guidance,
 * EPA 530/R-09-007, §15.3 and Example 15-1). Working on the original scale, going down from the largest
 * detected value x₁ > x₂ > … > x_k: F(x₁) = 1 and F just below x_j = F(x_j)·(b_j − d_j)/b_j, where d_j is the
 * number of detects equal to x_j and b_j the number of results known to be ≤ x_j (detects ≤ x_j and
 * non-detects with RL ≤ x_j). The mass F(x_j) − F(x_{j+1}) sits at x_j. When the lowest results are
 * non-detects, the probability left below the smallest detect is placed at the smallest reporting limit
 * below it (the convention that reproduces the Unified Guidance Example 15-1 figures as recomputed by the
 * EnvStats reproduction of that chapter). Mean = Σ p_j x_j; SD (KM) = √Σ p_j (x_j − mean)² (divisor n, the
 * spread of the KM distribution, as in those figures); `sdSample` = SD·√(n/(n − 1)), which equals the
 * ordinary sample SD (divisor n − 1) when nothing is censored and is the one used for intervals.
 * Preconditions: points with finite values; a censored point's value is its reporting limit (> 0 for
 * concentrations, though not required here).
 * Returns: `ok` with n, detects, non-detects, their share, the mean, SD (divisor n), sdSample, se =
 * sdSample/√n (data units); `too-few` when fewer than two detects.
 * Validity: KM needs no distribution but cannot see below the smallest reporting limit (the mean is biased
 * high when the lowest results are non-detects); above 50 % non-detects a mean is not supportable
 * (this project's cut-off, following the cautions of Helsel 2012 and the Unified Guidance ch. 15);
 * non-detects with limits above every detect carry no information.
 * O(n log n) per call (sorting).
 * @example kaplanMeierMean([{ value: 1 }, { value: 2 }, { value: 3 }, { value: 4 }, { value: 7 }])
 *   // { status: 'ok', mean: 3.4, sd: 2.059…, sdSample: 2.302…, … }
 */
import type { Point } from '../model/types.ts';

export type KaplanMeierResult =
  | {
      status: 'ok';
      n: number;
      detects: number;
      nonDetects: number;
      /** Share of non-detects, 0..1. */
      share: number;
      mean: number;
      /** SD of the KM distribution (divisor n). */
      sd: number;
      /** SD scaled to divisor n − 1 (equals the sample SD without censoring). */
      sdSample: number;
      /** sdSample / √n. */
      se: number;
    }
  | { status: 'too-few'; n: number; detects: number; nonDetects: number; share: number };

export function kaplanMeierMean(points: readonly Point[]): KaplanMeierResult {
  const detects: number[] = [];
  const limits: number[] = [];
  for (const p of points) {
    if (!Number.isFinite(p.value)) throw new RangeError('kaplanMeierMean requires finite values');
    (p.censored ? limits : detects).push(p.value);
  }
  const n = points.length;
  const share = n === 0 ? 0 : limits.length / n;
  const base = { n, detects: detects.length, nonDetects: limits.length, share };
  if (detects.length < 2) return { status: 'too-few', ...base };
  detects.sort((a, b) => b - a);
  limits.sort((a, b) => b - a);
  // Count of results known to be ≤ x: detects ≤ x plus non-detects with RL ≤ x. Both lists descending.
  const values: number[] = [];
  const masses: number[] = [];
  let F = 1;
  let i = 0;
  let li = 0;
  while (i < detects.length) {
    const x = detects[i]!;
    let d = 0;
    while (i < detects.length && detects[i] === x) {
      d++;
      i++;
    }
    while (li < limits.length && limits[li]! > x) li++;
    const b = detects.length - i + d + (limits.length - li);
    const next = (F * (b - d)) / b;
    values.push(x);
    masses.push(F - next);
    F = next;
  }
  if (F > 0) {
    // Left below the smallest detect: at the smallest reporting limit at or below it.
    values.push(limits[limits.length - 1]!);
    masses.push(F);
  }
  let mean = 0;
  for (let k = 0; k < values.length; k++) mean += masses[k]! * values[k]!;
  let v = 0;
  for (let k = 0; k < values.length; k++) v += masses[k]! * (values[k]! - mean) ** 2;
  const sd = Math.sqrt(v);
  const sdSample = sd * Math.sqrt(n / (n - 1));
  return { status: 'ok', ...base, mean, sd, sdSample, se: sdSample / Math.sqrt(n) };
}
