/**
 * Pass/fail items (1 = the counted outcome): Wilson by default; Wilson with continuity correction,
 * Jeffreys, Clopper–Pearson or Agresti–Coull on request; with none counted, the exact one-sided upper
 * bound 1 − α^{1/n} for upper bounds; with a finite lot, exact hypergeometric bounds. Glue.
 */
import type { AnalysisSetup, PassFailMethod, Sided, Target } from '../../model/types.ts';
import { projectLimitDecision } from '../../plan/limit-decision-projection.ts';
import { proportionSampleSize, zeroAcceptanceSampleSize } from '../../plan/proportion-sample-size.ts';
import { agrestiCoullInterval } from '../../stats/agresti-coull-interval.ts';
import { clopperPearsonInterval } from '../../stats/clopper-pearson-interval.ts';
import { betaQuantile } from '../../stats/distributions.ts';
import { hypergeometricBounds } from '../../stats/hypergeometric-bounds.ts';
import { jeffreysInterval } from '../../stats/jeffreys-interval.ts';
import { cachedNormalQuantile } from '../../stats/quantile-cache.ts';
import type { RunningSummary } from '../../stats/running-summary.ts';
import { wilsonCcInterval } from '../../stats/wilson-cc-interval.ts';
import { wilsonInterval } from '../../stats/wilson-interval.ts';
import type { Details, Estimator, Projection } from '../estimator.ts';
import { quantileProbability, sidedWords } from '../estimator.ts';

const LABELS: Record<PassFailMethod | 'hypergeometric', string> = {
  wilson: 'Wilson score',
  'wilson-cc': 'Wilson score with continuity correction',
  jeffreys: 'Jeffreys (equal-tailed)',
  'clopper-pearson': 'Clopper–Pearson (exact, conservative)',
  'agresti-coull': 'Agresti–Coull',
  hypergeometric: 'exact hypergeometric bounds for a finite lot',
};

const FNS = {
  wilson: wilsonInterval,
  'wilson-cc': wilsonCcInterval,
  jeffreys: jeffreysInterval,
  'clopper-pearson': clopperPearsonInterval,
  'agresti-coull': agrestiCoullInterval,
} as const;

export function passFailEstimator(summary: RunningSummary, setup: AnalysisSetup): Estimator {
  const n = summary.n;
  const x = Math.round(summary.total);
  const lot = setup.population;
  const requested = (setup.method ?? 'wilson') as PassFailMethod;
  const warnings: string[] = [];
  let method: PassFailMethod | 'hypergeometric' = requested;
  if (lot !== undefined) {
    method = 'hypergeometric';
    if (setup.method !== undefined && setup.method !== 'clopper-pearson')
      warnings.push(
        `With a lot size the exact hypergeometric bounds are used instead of ${LABELS[requested]}.`,
      );
  }
  /** The figures shown with the assessment — built on first read (replay and the benchmark never read them). */
  const buildDetails = (): Details => {
    const details: Details = { counted: x, items: n };
    if (lot !== undefined) details.lot = lot;
    if (n >= 1 && x === 0) {
      const alpha = 1 - setup.level;
      const exact = 1 - alpha ** (1 / n);
      details.zeroUpperBound = exact;
      details.ruleOfThree = `No counted outcome in ${n} items: the rate is likely below ${(exact * 100).toPrecision(3)} % (${Math.round(setup.level * 100)} % one-sided exact bound 1 − α^(1/n); the "rule of three" 3/n = ${((3 / n) * 100).toPrecision(3)} % approximates it at 95 %).`;
    }
    return details;
  };
  // one outcome only, bounded on the side away from it: the exact bound — 1 − α^{1/n} above nothing counted,
  // α^{1/n} below everything counted (= Clopper–Pearson one-sided, by the symmetry x → n − x)
  const zeroExact = (sided: Sided) =>
    lot === undefined && ((x === 0 && sided === 'upper') || (x === n && sided === 'lower'));
  let labelMethod = method;
  const fpc = lot === undefined ? 1 : Math.sqrt(Math.max(0, (lot - n) / Math.max(1, lot - 1)));
  // the SE (Agresti–Coull, two-sided at the level asked) depends only on the level: kept for the last level
  let seLevel = Number.NaN;
  let seAtLevel = 0;
  const intervalAt =
    n < 1
      ? null
      : (level: number, sided: Sided) => {
          let r: { estimate: number; lower: number; upper: number };
          if (method === 'hypergeometric') r = hypergeometricBounds(x, n, lot as number, level, sided);
          else if (zeroExact(sided)) r = clopperPearsonInterval(x, n, level, sided);
          else r = FNS[method](x, n, level, sided);
          if (level !== seLevel) {
            seAtLevel = agrestiCoullInterval(x, n, level, 'two').se * fpc;
            seLevel = level;
          }
          return { estimate: r.estimate, lower: r.lower, upper: r.upper, se: seAtLevel };
        };
  if (zeroExact(setup.sided) || (setup.target?.kind === 'limit' && (x === 0 || x === n) && lot === undefined))
    labelMethod = 'clopper-pearson';

  const project = (target: Target, level: number, sided: Sided): Projection | null => {
    if (n < 1) return null;
    const p = quantileProbability(level, target.kind === 'limit' ? 'upper' : sided);
    const z = cachedNormalQuantile(p);
    const withPop = lot === undefined ? {} : { population: lot };
    const band = wilsonInterval(x, n, 0.8, 'two'); // 10th–90th percentile of p
    const clampP = (q: number) => Math.min(1 - 1e-9, Math.max(1e-9, q));
    const at = (q: number): number => {
      const pp = clampP(q);
      if (target.kind === 'limit') {
        // Wilson's bound is the inversion of the score test, whose variance is the limit's L(1 − L): with a
        // rate that stays at q, the bound clears L exactly when n > z²·L(1 − L)/(q − L)² (Wilson 1927,
        // JASA 22:209–212). The Agresti–Coull centre used before pulls small counts toward ½ — and onto the
        // limit — which made one defect in 25 items project thousands more.
        const d = Math.abs(pp - target.value);
        if (!(d > 0)) return Number.POSITIVE_INFINITY;
        return proportionSampleSize({ p: target.value, target: 'margin', value: d, z, ...withPop });
      }
      return proportionSampleSize({ p: pp, target: target.kind, value: target.value, z, ...withPop });
    };
    if (target.kind === 'limit' && target.value > 0 && target.value < 1 && n >= 2) {
      // the predictive distribution of the rate after N items (src/plan/limit-decision-projection.ts): the
      // spread from the Jeffreys posterior mean (x + ½)/(n + 1), so that no counted outcome yet still leaves
      // room for one; the bound's spread is the limit's own √(L(1 − L)) (Wilson's score bound)
      const jeffreys = (x + 0.5) / (n + 1);
      const r = projectLimitDecision({
        n,
        distance: x / n - target.value,
        spread: Math.sqrt(jeffreys * (1 - jeffreys)),
        boundSpread: Math.sqrt(target.value * (1 - target.value)),
        multiplier: () => z,
        ...withPop,
      });
      if (x === 0) {
        // no counted outcome: the exact bound 1 − α^(1/n) decides at n = ln α / ln(1 − L) if none turns up,
        // the earliest a decision can come
        const n0 = zeroAcceptanceSampleSize(target.value, 1 - level);
        const nz = lot === undefined ? n0 : n0 / (1 + (n0 - 1) / lot);
        return {
          likely: Math.max(nz, r.likely),
          low: nz,
          high: Math.max(nz, r.high),
          assured: Math.max(nz, r.assured),
          basis:
            'zero-acceptance: n = ln α / ln(1 − L) if no counted outcome turns up; above it the predictive distribution of the rate',
        };
      }
      // the likely figure stays the plug-in one (the rate as observed): the predictive median, averaged over
      // every rate the first items allow, promised quick decisions that rates near the limit do not give
      // (test/bench/calibration.md)
      const plugIn = at(x / n);
      return {
        likely: Math.min(r.high, Math.max(r.low, plugIn)),
        low: r.low,
        high: r.high,
        assured: Math.max(r.assured, Math.min(r.high, plugIn)),
        basis:
          'n at which the one-sided Wilson bound clears the limit if the rate stays as observed, z²·L(1−L)/(p − L)²; range from the predictive distribution of the rate (10th–90th percentiles)',
      };
    }
    // a limit decision projects from the observed rate (the rate the decision is about); the other targets
    // from the median of the Jeffreys posterior Beta(x + ½, n − x + ½) (Jeffreys H (1961) Theory of
    // Probability, 3rd ed.; Brown, Cai & DasGupta (2001) Stat. Sci. 16:101–133). The Agresti–Coull centre
    // used before, (x + 2)/(n + 4), reads 0 in 10 as 14 %: it over-projected a margin on a rare outcome
    // 2–12-fold and under-projected a relative target 3–25-fold (test/bench/calibration.md)
    const likely = at(target.kind === 'limit' ? x / n : betaQuantile(0.5, x + 0.5, n - x + 0.5));
    const a = at(band.lower);
    const b = at(band.upper);
    let low = Math.min(likely, a, b);
    let high = Math.max(likely, a, b);
    if (target.kind === 'margin' && band.lower < 0.5 && band.upper > 0.5) high = Math.max(high, at(0.5));
    if (!Number.isFinite(low)) low = likely;
    return {
      likely,
      low,
      high,
      basis:
        target.kind === 'limit'
          ? 'n at which the one-sided Wilson bound clears the limit if the rate stays as observed, z²·L(1−L)/(p − L)²; range from the 80 % Wilson limits for p'
          : 'z²·p̃(1−p̃)/d² with p̃ the median of the Jeffreys posterior; range from the 80 % Wilson limits for p',
    };
  };

  // Never `enough` on one outcome only: with every item the same, a margin, relative or precision target
  // says little (Wilson's width at x = 0 shrinks like 1/n whatever the true rate); the decision against a
  // limit stays open — no defect in n items is the zero-acceptance demonstration (the exact bound
  // 1 − α^(1/n); Hanley & Lippman-Hand 1983, "If nothing goes wrong, is everything all right?", JAMA 249).
  let guard: Estimator['guard'] = null;
  if (n >= 1 && (x === 0 || x === n) && setup.target !== undefined && setup.target.kind !== 'limit')
    guard = {
      reason: 'one-distinct-value',
      message: `All ${n} items so far have the same outcome (${x === 0 ? 'none' : 'all'} counted), so the interval's width says little yet. To show that the counted outcome is rare, set a limit target (a zero-defect demonstration) instead.`,
    };

  return {
    method: labelMethod,
    label: (level, sided) =>
      zeroExact(sided)
        ? `exact one-sided bound with none counted (1 − α^(1/n)), ${sidedWords(level, sided)}`
        : `${LABELS[method]}, ${sidedWords(level, sided)}`,
    estimate: n >= 1 ? x / n : null,
    intervalAt,
    guard,
    details: buildDetails,
    warnings: () => warnings,
    project,
  };
}
