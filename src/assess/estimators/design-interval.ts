/**
 * What the design estimators share: the interval estimate ± q·SE with the design's SE and degrees of freedom
 * (q = Student t, or Chebyshev's √(1/α − 1) for composites on request), and "how many more" by scaling the
 * SE as 1/√(replicates): the likely number of replicates is r·(h/d)², with the 10th–90th percentile range
 * from a χ² interval on the variance with the design's df, converted to entries (× entries per replicate).
 * Sources: Cochran WG (1977) Sampling Techniques, 3rd ed., §4.4 (sample size from the variance) and §5A.
 * (Satterthwaite df for strata); the χ² range as for the simple measurement projection (Kupper LL & Hafner
 * KB 1989, "How appropriate are popular sample size formulas?", The American Statistician 43(2):101–105).
 */
import type { Interval } from '../../model/interval.ts';
import type { Sided, Target } from '../../model/types.ts';
import { chiSquareQuantile, studentTQuantile } from '../../stats/distributions.ts';
import type { Details, Estimator, Guard, Projection } from '../estimator.ts';
import { halfWidth } from '../target.ts';

/** A design's estimate, SE and df, and the replicates its SE scales with. */
export interface DesignFigures {
  method: string;
  label: (level: number, sided: Sided) => string;
  estimate: number | null;
  se: number | null;
  df: number | null;
  /** Replicates the SE scales with (entries, primary units or composites). */
  replicates: number;
  entriesPerReplicate: number;
  /** Counted entries. */
  n: number;
  guard: Guard | null;
  chebyshev?: boolean;
  min?: number;
  details: Details;
  warnings: string[];
}

export function keepGoingGuard(reason: Guard['reason'], message: string): Guard {
  return { reason, message };
}

/** What every design estimate has before its figures: names, replicates, details and warnings. */
export type DesignBase = Omit<DesignFigures, 'estimate' | 'se' | 'df' | 'guard'>;

/** A design that cannot estimate yet: no interval, and why. */
export function withoutEstimate(
  base: DesignBase,
  reason: Guard['reason'],
  message: string,
  estimate: number | null = null,
): Estimator {
  return designEstimator({ ...base, estimate, se: null, df: null, guard: keepGoingGuard(reason, message) });
}

/** A design's estimate; a zero SE (or no df) keeps it from a verdict with `zeroSpread` as the reason. */
export function withEstimate(
  base: DesignBase,
  figures: { estimate: number; se: number; df: number | null },
  zeroSpread: string,
): Estimator {
  const flat = figures.df === null || figures.se === 0;
  return designEstimator({
    ...base,
    ...figures,
    guard: flat ? keepGoingGuard('zero-spread', zeroSpread) : null,
  });
}

function intervalOf(f: DesignFigures, level: number, sided: Sided): Interval {
  const est = f.estimate as number;
  const se = f.se as number;
  const alpha = 1 - level;
  const a = sided === 'two' ? alpha / 2 : alpha;
  const q = f.chebyshev ? Math.sqrt(1 / a - 1) : studentTQuantile(1 - a, f.df as number);
  const h = q * se;
  return {
    estimate: est,
    lower: sided === 'upper' ? Number.NEGATIVE_INFINITY : est - h,
    upper: sided === 'lower' ? Number.POSITIVE_INFINITY : est + h,
    se,
  };
}

function projectDesign(f: DesignFigures, target: Target, level: number, sided: Sided): Projection | null {
  if (f.df === null || f.se === null || f.estimate === null) return null;
  const h = halfWidth(intervalOf(f, level, sided), sided);
  let ratio: number;
  switch (target.kind) {
    case 'margin':
      ratio = (h / target.value) ** 2;
      break;
    case 'relative':
      if (!(f.estimate > 0)) return null;
      ratio = (h / (target.value * f.estimate)) ** 2;
      break;
    case 'precision':
      if (!(f.estimate > 0)) return null;
      ratio = (f.se / (target.value * f.estimate)) ** 2;
      break;
    case 'limit':
      return null;
  }
  if (!Number.isFinite(ratio)) return null;
  const df = Math.max(1, f.df);
  const total = (units: number) => f.n + (units - f.replicates) * f.entriesPerReplicate;
  const likelyUnits = f.replicates * ratio;
  return {
    likely: total(likelyUnits),
    low: total((likelyUnits * df) / chiSquareQuantile(0.9, df)),
    high: total((likelyUnits * df) / chiSquareQuantile(0.1, df)),
    basis: `SE scaled as 1/√(${f.entriesPerReplicate === 1 ? 'entries' : 'primary units'}); range from a χ² interval on the variance (${Math.round(df * 10) / 10} df)`,
  };
}

/** The Estimator seam over a design's figures. */
export function designEstimator(f: DesignFigures): Estimator {
  const ready = f.estimate !== null && f.se !== null && f.df !== null;
  const e: Estimator = {
    method: f.method,
    label: f.label,
    estimate: f.estimate,
    intervalAt: ready ? (level, sided) => intervalOf(f, level, sided) : null,
    guard: f.guard,
    details: () => ({ ...f.details }),
    warnings: () => [...f.warnings],
    project: (target, level, sided) => projectDesign(f, target, level, sided),
    sprtApplies: false,
  };
  if (f.min !== undefined) e.min = f.min;
  return e;
}
