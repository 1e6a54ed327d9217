/**
 * "How many more": the estimator's raw projection of the total entries a target needs, turned into further
 * entries (likely, 10th–90th percentile range, 80 % assured when the estimator gives it), capped at the
 * population and smoothed one entry back.
 *
 * Before the minimum the figure is the entries still missing to it ("at least M more"), or the projection when
 * that reaches further. Smoothing: once n ≥ min, the likely total is clamped to 0.5–1.5 × the previous entry's raw (unclamped)
 * projected total, so one odd value does not make the figure jump by thousands. The previous entry's raw
 * total is carried as a typed `MoreMemory`; because the clamp looks at the previous raw figure only, the
 * result after n entries needs just the assessments at n − 1 and n, whatever n is.
 */
import type { AnalysisSetup, More, Sided } from '../model/types.ts';
import type { Details, Estimator } from './estimator.ts';

/** What the next entry's smoothing looks back to: the raw projected total after `n` entries. */
export interface MoreMemory {
  n: number;
  rawLikelyTotal: number;
}

const SMOOTH_FACTOR = 1.5;

export interface MoreOutcome {
  more: More | null;
  memory: MoreMemory | null;
}

function reachedWords(setup: AnalysisSetup): string {
  return setup.population !== undefined ? ` (the population has ${setup.population})` : '';
}

export function projectMore(
  estimator: Estimator,
  setup: AnalysisSetup,
  min: number,
  level: number,
  sided: Sided,
  n: number,
  details: Details,
  warnings: string[],
  memory: MoreMemory | null,
): MoreOutcome {
  const target = setup.target;
  if (target === undefined) return { more: null, memory: null };
  const cap = setup.population;
  const clampTotal = (x: number): number => (cap === undefined ? x : Math.min(x, cap));
  if (n < min) {
    // before the minimum: the minimum, or the projection when it already sees further (a crew plans with
    // "about 70 more", not "at least 19 more", when the spread so far asks for a hundred)
    const m = min - n;
    const early = n >= 2 ? estimator.project(target, level, sided) : null;
    const total = (x: number) => Math.max(min, clampTotal(Math.ceil(x - 1e-9)));
    if (early === null || !Number.isFinite(early.likely) || Math.ceil(early.likely - 1e-9) <= min) {
      // "at least M more", with the projection's upper end beside it when that reaches past the minimum:
      // a degenerate range M–M held the entries actually needed only when the rule stopped right at the
      // minimum (test/bench/calibration.md)
      const high = early === null ? m : Number.isFinite(early.high) ? total(early.high) - n : m;
      if (early !== null && high > m) details.moreBasis = early.basis;
      return { more: { likely: m, low: m, high: Math.max(m, high), atLeast: true }, memory: null };
    }
    details.moreBasis = early.basis;
    const more: More = {
      likely: total(early.likely) - n,
      low: total(early.low) - n,
      high: Number.isFinite(early.high) ? total(early.high) - n : Number.MAX_SAFE_INTEGER,
    };
    if (early.assured !== undefined && Number.isFinite(early.assured))
      more.assured = total(early.assured) - n;
    return { more, memory: null };
  }
  const raw = estimator.project(target, level, sided);
  if (raw === null) {
    details.moreUnavailable = 'no projection can be made from these values yet';
    return { more: null, memory: null };
  }
  details.moreBasis = raw.basis;
  let likelyTotal = clampTotal(Math.ceil(raw.likely - 1e-9));
  let lowTotal = clampTotal(Math.ceil(raw.low - 1e-9));
  let highTotal = clampTotal(Math.ceil(raw.high - 1e-9));
  if (!Number.isFinite(likelyTotal)) {
    details.moreUnavailable = 'the projection is unbounded (the estimate sits on the target)';
    return { more: null, memory: null };
  }
  const next: MoreMemory = { n, rawLikelyTotal: Math.max(n, likelyTotal) };
  if (memory !== null && memory.n < n && memory.n >= min) {
    const lo = Math.max(n, Math.floor(memory.rawLikelyTotal / SMOOTH_FACTOR));
    const hi = Math.ceil(memory.rawLikelyTotal * SMOOTH_FACTOR);
    const clamped = Math.min(hi, Math.max(lo, likelyTotal));
    if (clamped !== likelyTotal) {
      details.moreSmoothed = true;
      details.moreRawLikely = Math.max(0, likelyTotal - n);
      likelyTotal = clamped;
    }
  }
  lowTotal = Math.min(lowTotal, likelyTotal);
  highTotal = Math.max(highTotal, likelyTotal);
  const more: More = {
    likely: Math.max(0, likelyTotal - n),
    low: Math.max(0, lowTotal - n),
    high: Math.max(0, Number.isFinite(highTotal) ? highTotal - n : Number.MAX_SAFE_INTEGER),
  };
  if (raw.assured !== undefined && Number.isFinite(raw.assured))
    more.assured = Math.max(0, clampTotal(Math.ceil(raw.assured - 1e-9)) - n);
  // the projection may think the target is met while the rule (which checks a wider interval, or a limit
  // from the other side) has not stopped: never "keep going" with 0 more
  if (more.likely === 0 && (cap === undefined || n < cap)) {
    details.moreFloor =
      'the projection reaches the target now, but the rule has not stopped: at least one more';
    more.likely = 1;
    more.low = Math.max(1, more.low);
    more.high = Math.max(1, more.high);
    more.atLeast = true;
  }
  if (cap !== undefined && likelyTotal >= cap)
    warnings.push(`The projection reaches the whole population${reachedWords(setup)}.`);
  if (setup.max !== undefined && likelyTotal > setup.max)
    warnings.push(`The projected total (${likelyTotal}) is above the planned maximum of ${setup.max}.`);
  return { more, memory: next };
}
