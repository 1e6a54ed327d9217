/**
 * The standard stopping rule (default) — "is the interval narrow enough yet?", asked after every entry
 * in a way that keeps its promise.
 *
 * For a field user: the shared checks come first (no verdict before the minimum number of observations,
 * none while all values are equal or all counts are zero). Then the app computes the interval that suits
 * your data — Wilson's interval for pass/fail items, the log-scale (Cox) interval for skewed positive
 * measurements when the study uses it, the count interval with a one-count safety margin for counts — at a
 * slightly higher confidence than you asked for, and says "enough" when that interval meets your target.
 * The interval it shows is that wider one, so what you see is what was checked. The extra width is the
 * price of looking after every entry; it was measured by simulation (test/bench/coverage.md). For counts
 * with known Taylor or Iwao coefficients and a precision target, Green's or Kuno's stop line decides.
 *
 * For an analyst:
 *   level_int = 1 − ρ·(1 − level), ρ per data kind (shrinking with the log spread for log-scale
 *   measurements and with the dispersion index for counts; standard-level.ts, calibrated)
 *   stop at the first n ≥ m (guards passed) with I_n(level_int) meeting the target, where for counts
 *   the interval is widened about its estimate by √(1 + c/(n·s²)), c = 1 count unit — the Chow & Robbins
 *   (1965, Ann. Math. Stat. 36:457–462) floor s² + c/n, which prevents a stop on near-constant low counts.
 *   Counts with target `precision` and planning coefficients: Green (1970) line when Taylor's a, b are
 *   given, else Kuno (1969) line when Iwao's α, β are given (green-stop-line.ts, kuno-stop-line.ts).
 *
 * Preconditions: the shared guards have passed (assess applies them).
 * Returns: the verdict and the interval at level_int (reportedLevel).
 * Validity: coverage ≥ nominal − 1 pp in the benchmark cells with n* ≥ 25 except the regimes listed by
 * ruleWarnings (rule-warnings.ts) and in test/bench/coverage.md.
 *
 * @example standardRule(ctx, setup).reportedLevel // 0.96 for a 95 % measurement study
 */
import type { AnalysisSetup, VerdictStatus } from '../model/types.ts';
import { greenStopLine } from './green-stop-line.ts';
import { innerKeepGoing } from './inner-keep-going.ts';
import { kunoStopLine } from './kuno-stop-line.ts';
import type { Interval, RuleContext, RuleDecision } from './rule-context.ts';
import {
  CHOICE_ALPHA_FACTOR,
  LIMIT_ALPHA_FACTOR,
  STANDARD_ALPHA_RATIO,
  standardGroup,
  standardLevel,
} from './standard-level.ts';
import { decideOn, statusOf } from './status-of.ts';

/** Chow–Robbins count-unit floor c (squared count units per plot). */
export const COUNT_UNIT_FLOOR = 1;

function withCountFloor(interval: Interval, n: number, sd: number): Interval {
  const v = sd * sd;
  const f = v > 0 ? Math.sqrt(1 + COUNT_UNIT_FLOOR / (n * v)) : Number.POSITIVE_INFINITY;
  const e = interval.estimate;
  const lower = Number.isFinite(interval.lower) ? Math.max(0, e - (e - interval.lower) * f) : interval.lower;
  const upper = Number.isFinite(interval.upper) ? e + (interval.upper - e) * f : interval.upper;
  const out: Interval = { estimate: e, lower, upper };
  if (interval.se !== undefined) out.se = interval.se * f;
  return out;
}

/**
 * Stop-only prefilter (replay's loop, the benchmark): the internal level of counts and log-scale measurements
 * moves with the data, so its quantile is a fresh numerical inversion per entry. Every level the rule can
 * use is at least 1 − ρ_max·α (ρ ≤ the group's ρ), and a wider interval can only meet a target less
 * (margin, relative, precision) or decide a limit less, so when the interval at a level just below that
 * floor (a cached quantile) does not meet the target, neither does the rule's own interval: keep going.
 * The floor is lowered by a relative 1e-6 of α so that rounding in the quantile functions cannot turn the
 * comparison. First, when the data kind's interval can be bounded from inside without an inversion
 * (ctx.innerIntervalAt: exact Poisson counts, Land), that inner interval at the rule's own level settles every
 * `keep going` it does not meet. Returns null when the prefilter cannot settle the verdict.
 */
function quickKeepGoing(ctx: RuleContext, setup: AnalysisSetup, level: number): Interval | null {
  // the count floor widens about the estimate and is monotone in each bound, so it keeps the containment
  const inner = innerKeepGoing(ctx, level, setup.sided, (iv) =>
    ctx.kind === 'count' ? withCountFloor(iv, ctx.n, ctx.stats.sd) : iv,
  );
  if (inner !== null) return inner === false ? null : inner; // tried: the floor below would not do better
  const group = standardGroup(setup);
  if (group !== 'count' && group !== 'measurement-log') return null;
  // the limit factor is at most 1 (standard-level.ts), so it only lowers the largest ρ
  const rhoMax =
    STANDARD_ALPHA_RATIO[group] *
    (setup.target?.kind === 'limit' ? LIMIT_ALPHA_FACTOR.limit : 1) *
    (ctx.methodChosen === true ? CHOICE_ALPHA_FACTOR.choice : 1);
  const floorLevel = 1 - rhoMax * (1 - setup.level);
  if (level === floorLevel) return null; // already the cached quantile
  const below = 1 - rhoMax * (1 - setup.level) * (1 + 1e-6);
  let interval = ctx.intervalAt(below, setup.sided);
  if (ctx.kind === 'count') interval = withCountFloor(interval, ctx.n, ctx.stats.sd);
  return statusOf(ctx.check(interval)) === 'keep going' ? interval : null;
}

export function standardRule(ctx: RuleContext, setup: AnalysisSetup): RuleDecision {
  const dispersion = ctx.kind === 'count' && ctx.stats.mean > 0 ? ctx.stats.sd ** 2 / ctx.stats.mean : null;
  const level = standardLevel(setup, ctx.stats.logSd, dispersion, ctx.n, ctx.methodChosen === true);
  const stopLine = ctx.kind === 'count' && setup.target?.kind === 'precision' && setup.planning !== undefined;
  if (ctx.stopOnly && !stopLine) {
    const quick = quickKeepGoing(ctx, setup, level);
    if (quick !== null)
      return {
        status: 'keep going',
        interval: quick,
        reportedLevel: level,
        message: 'The interval does not meet the target yet.',
        ruleLabel: 'standard',
      };
  }
  let interval = ctx.intervalAt(level, setup.sided);
  if (ctx.kind === 'count') interval = withCountFloor(interval, ctx.n, ctx.stats.sd);
  const label = `standard (checked and shown at ${(level * 100).toFixed(1)} % to allow for looking after every entry)`;
  const p = setup.planning;
  const target = setup.target;
  if (ctx.kind === 'count' && target?.kind === 'precision' && p) {
    const D = target.value;
    const T = ctx.stats.total;
    let status: VerdictStatus | null = null;
    let message = '';
    if (p.taylorA !== undefined && p.taylorB !== undefined) {
      const line = greenStopLine({ a: p.taylorA, b: p.taylorB, D }, ctx.n);
      const crossed = line.stopWhen === 'at-least' ? T >= line.total : T <= line.total;
      status = crossed ? 'enough' : 'keep going';
      message = crossed
        ? `The running total ${T} has crossed Green's stop line (${line.total.toFixed(1)}).`
        : `Green's stop line is at a total of ${line.total.toFixed(1)}; the running total is ${T}.`;
    } else if (p.iwaoAlpha !== undefined && p.iwaoBeta !== undefined) {
      const line = kunoStopLine({ alpha: p.iwaoAlpha, beta: p.iwaoBeta, D }, ctx.n);
      const crossed = line !== null && T >= line;
      status = crossed ? 'enough' : 'keep going';
      message =
        line === null
          ? "Kuno's stop line is not defined yet at this number of plots; keep counting."
          : crossed
            ? `The running total ${T} has reached Kuno's stop line (${line.toFixed(1)}).`
            : `Kuno's stop line is at a total of ${line.toFixed(1)}; the running total is ${T}.`;
    }
    if (status !== null)
      return {
        status,
        interval,
        reportedLevel: level,
        message,
        ruleLabel: `${label}, fixed-precision stop line`,
      };
  }
  return decideOn(ctx, interval, level, label, {
    keepGoing: 'The interval does not meet the target yet.',
    met: 'The interval meets the target.',
    limit: 'The bound is on one side of the limit (descriptive: use the limit decision for a tested answer).',
  });
}
