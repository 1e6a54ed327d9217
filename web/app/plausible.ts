/**
 * Plausibility without blocking: before a value is saved, the pad may ask "keep it?" — never refuse it,
 * never change it. Two questions are asked:
 *
 * 1. Outside the study's expected range (setup `expectedRange`, in the entry's unit). When the setup
 *    names none, counts per plot expect 0 to 10,000 and measurements in percent 0 to 100; other
 *    measurements expect nothing.
 * 2. Far from what was seen so far, by the modified z-score of Iglewicz & Hoaglin (1993, "How to Detect
 *    and Handle Outliers", ASQC Basic References in Quality Control 16): M = 0.6745 (x − median) / MAD,
 *    with MAD the median absolute deviation of the earlier values; |M| > 3.5 is a potential outlier. The
 *    rule needs at least 5 earlier values and a MAD above zero (with most values equal it has no scale).
 *    Values below a reporting limit are left out: they are limits, not results.
 */
import type { StudySetup } from '../core.ts';
import { plain, valueUnit, withUnit } from '../core-light.ts';

/** Iglewicz & Hoaglin's recommended cut-off for |modified z|. */
export const OUTLIER_Z = 3.5;
/** Earlier values needed before the outlier rule speaks. */
export const OUTLIER_MIN_N = 5;
/** Default expected range of a count per plot. */
export const COUNT_RANGE = { low: 0, high: 10_000 } as const;

function median(sorted: readonly number[]): number {
  const m = sorted.length >> 1;
  return sorted.length % 2 ? (sorted[m] as number) : ((sorted[m - 1] as number) + (sorted[m] as number)) / 2;
}

function isSorted(xs: readonly number[]): boolean {
  for (let i = 1; i < xs.length; i++) if ((xs[i - 1] as number) > (xs[i] as number)) return false;
  return true;
}

/**
 * The MAD of ascending values around their median, without sorting: the deviations below the median
 * (walking down) and above it (walking up) are two ascending runs, merged only as far as their middle.
 * O(n) with no copy, so the field screen's tap path (the session keeps its values sorted) sorts nothing.
 */
function madOfSorted(sorted: readonly number[], med: number): number {
  const n = sorted.length;
  const m = n >> 1;
  // next value below the median (walking down) and above it (walking up); an odd count's middle value is
  // a deviation of 0, the smallest of all
  let lo = m - 1;
  let hi = n % 2 ? m + 1 : m;
  const out: number[] = n % 2 ? [0] : [];
  const need = m + 1; // enough of the smallest deviations to take their median
  while (out.length < need) {
    const down = lo >= 0 ? med - (sorted[lo] as number) : Number.POSITIVE_INFINITY;
    const up = hi < n ? (sorted[hi] as number) - med : Number.POSITIVE_INFINITY;
    if (down <= up) {
      out.push(down);
      lo--;
    } else {
      out.push(up);
      hi++;
    }
  }
  return n % 2 ? (out[m] as number) : ((out[m - 1] as number) + (out[m] as number)) / 2;
}

/**
 * The modified z-score of `x` against `earlier` (any order; ascending, as the field screen passes them,
 * needs no sort), or null when the rule does not apply (n < 5, MAD = 0).
 */
export function modifiedZ(x: number, earlier: readonly number[]): number | null {
  if (earlier.length < OUTLIER_MIN_N) return null;
  const sorted = isSorted(earlier) ? earlier : [...earlier].sort((a, b) => a - b);
  const med = median(sorted);
  const mad = madOfSorted(sorted, med);
  if (!(mad > 0)) return null;
  return (0.6745 * (x - med)) / mad;
}

/** The range a value is expected in: the setup's own, else the default for its kind and unit. */
export function expectedRange(setup: StudySetup): { low?: number; high?: number } {
  if (setup.expectedRange) return setup.expectedRange;
  if (setup.kind === 'count') return COUNT_RANGE;
  if (setup.kind === 'measurement' && setup.unit?.trim() === '%') return { low: 0, high: 100 };
  return {};
}

/** The question to ask before saving `x`, or null when nothing looks odd. */
export function plausibilityQuestion(
  x: number,
  setup: StudySetup,
  earlier: readonly number[],
  sep = '.',
): string | null {
  const unit = valueUnit(setup);
  const w = (v: number) => withUnit(plain(v, sep), unit);
  const r = expectedRange(setup);
  if (r.low !== undefined && x < r.low) return `${w(x)} is below the expected lowest value, ${w(r.low)}.`;
  if (r.high !== undefined && x > r.high) return `${w(x)} is above the expected highest value, ${w(r.high)}.`;
  const z = modifiedZ(x, earlier);
  if (z !== null && Math.abs(z) > OUTLIER_Z)
    return `${w(x)} is far ${z > 0 ? 'above' : 'below'} the ${earlier.length} values so far (more than ${plain(OUTLIER_Z, sep)} modified z-scores from their median).`;
  return null;
}
