/**
 * The limit decision — Wald's sequential probability ratio test run after every entry, with a
 * three-zone verdict: `below limit`, `above limit`, `keep going`.
 *
 * For a field user: you set the limit's indifference zone (a value you can accept and a value you must
 * catch) and the two risks. After the minimum number of entries the app compares your running total with
 * two lines (sprt-boundaries.ts) and answers as soon as the evidence is strong enough either way. If the
 * planned maximum is reached first, it answers by which side of the middle line you are on, and says so.
 *
 * For an analyst: family by data kind — pass/fail → Bernoulli on the number of counted outcomes; count
 * → Poisson on the total, or negative binomial (Waters 1955) when planning.negBinomialK is given;
 * measurement → normal on ln x with σ = the log SD of all values so far (a pilot of `min` values
 * first) and θ the arithmetic means (μᵢ = ln θᵢ − σ²/2); the lines are spaced with the 90 % upper
 * confidence bound on σ, or normal on x itself when the study's method is `t`. Truncation at
 * maxN = sprt.maxN ?? setup.max ?? ⌈3 × the fixed-size equivalent⌉ (sprt-fixed-size.ts), deciding by
 * the midline Sₙ ≤ s·n → below (src/stop/README.md, "SPRT"). The reported interval is the data kind's
 * interval at the nominal level (descriptive).
 *
 * Preconditions: setup.sprt present (otherwise the verdict stays `keep going` with an explanation); the
 * shared guards have passed.
 * Returns: the three-zone verdict and the nominal interval.
 * Validity: exact Wald bounds on the error rates for the Bernoulli/Poisson/negative-binomial families when
 * the model holds; the measurement version is approximate (σ from the pilot), see the benchmark.
 *
 * @example sprtRule(ctx, { ...setup, rule: 'sprt', sprt: { alpha: 0.05, beta: 0.1, lowerBound: 0.01, upperBound: 0.06 } })
 */
import type { AnalysisSetup, VerdictStatus } from '../model/types.ts';
import { cachedChiSquareQuantile } from '../stats/quantile-cache.ts';
import { minimumBeforeVerdict } from './minimum.ts';
import { pilotStats } from './pilot-stats.ts';
import type { RuleContext, RuleDecision } from './rule-context.ts';
import { type SprtModel, sprtBoundaries } from './sprt-boundaries.ts';
import { sprtFixedSize } from './sprt-fixed-size.ts';

/** Builds the SPRT model of a study (σ from the pilot for measurements; null while it is missing). */
export function sprtModelOf(
  setup: AnalysisSetup,
  values: readonly number[],
  running?: { n: number; sd: number | null },
): SprtModel | null {
  const s = setup.sprt;
  if (!s) return null;
  const base = { theta0: s.lowerBound, theta1: s.upperBound, alpha: s.alpha, beta: s.beta };
  if (setup.kind === 'pass-fail') return { family: 'bernoulli', ...base };
  if (setup.kind === 'count') {
    const k = setup.planning?.negBinomialK;
    return k !== undefined ? { family: 'negative-binomial', k, ...base } : { family: 'poisson', ...base };
  }
  const m = Math.max(2, minimumBeforeVerdict(setup));
  if (values.length < m) return null;
  const log = setup.method !== 't';
  for (let i = 0; i < m; i++) if (log && !((values[i] as number) > 0)) return null;
  // σ from all values so far when the caller has it (the midline of a lognormal test depends on σ²,
  // and a 10-value pilot leaves it too uncertain), else from the pilot.
  const useRunning = running !== undefined && running.sd !== null && running.n >= m;
  const sigma = useRunning ? (running.sd as number) : pilotStats(values, m, log).sd;
  const df = (useRunning ? running.n : m) - 1;
  if (!(sigma > 0)) return null;
  // The lines are spaced with the one-sided 90 % upper confidence bound of σ,
  // s·√(df/χ²₍0.10, df₎): Wald's lines assume σ known, so a σ estimated from the pilot is inflated to keep
  // the error rates conservative (src/stop/README.md, "SPRT"; checked in test/bench/coverage.md).
  const sigmaForSpacing = sigma * Math.sqrt(df / cachedChiSquareQuantile(0.1, df));
  return { family: log ? 'lognormal' : 'normal', sigma, sigmaForSpacing, ...base };
}

/** Truncation point of the test. */
export function sprtMaxN(setup: AnalysisSetup, model: SprtModel): number {
  return (
    setup.sprt?.maxN ??
    setup.max ??
    Math.max(minimumBeforeVerdict(setup), Math.ceil(3 * sprtFixedSize(model)))
  );
}

export function sprtRule(ctx: RuleContext, setup: AnalysisSetup): RuleDecision {
  const label = "limit decision (Wald's sequential probability ratio test)";
  const nominal = () => ctx.intervalAt(setup.level, setup.sided);
  const log = setup.method !== 't';
  const model = sprtModelOf(setup, ctx.values, { n: ctx.n, sd: log ? ctx.stats.logSd : ctx.stats.sd });
  if (model === null)
    return {
      status: 'keep going',
      interval: nominal(),
      reportedLevel: setup.level,
      message: setup.sprt
        ? 'The limit decision on measurements needs a pilot of positive values with some spread.'
        : 'The limit decision needs the two risks and the indifference zone (setup).',
      ruleLabel: label,
    };
  if (model.family === 'lognormal' && ctx.stats.logMean === null)
    return {
      status: 'keep going',
      interval: nominal(),
      reportedLevel: setup.level,
      message: 'A value at or below zero: the log-scale limit decision cannot continue; use a t bound.',
      ruleLabel: label,
    };
  const lines = sprtBoundaries(model);
  const maxN = sprtMaxN(setup, model);
  const n = ctx.n;
  const S = model.family === 'lognormal' ? n * (ctx.stats.logMean as number) : ctx.stats.total;
  const acceptAt = -lines.h0 + lines.slope * n;
  const rejectAt = lines.h1 + lines.slope * n;
  let status: VerdictStatus = 'keep going';
  if (S <= acceptAt) status = 'below limit';
  else if (S >= rejectAt) status = 'above limit';
  else if (n >= maxN) status = S <= lines.slope * n ? 'below limit' : 'above limit';
  // replay's loop reads only the status of a `keep going` entry: no interval, no formatted message
  if (status === 'keep going' && ctx.stopOnly)
    return { status, interval: NO_INTERVAL, reportedLevel: setup.level, message: '', ruleLabel: label };
  let message: string;
  if (S <= acceptAt) message = 'The evidence says below the limit (lower decision line reached).';
  else if (S >= rejectAt) message = 'The evidence says above the limit (upper decision line reached).';
  else if (n >= maxN)
    message = `Planned maximum of ${maxN} reached: decided by the middle line (weaker evidence than a line crossing).`;
  else
    message = `Keep going: the running statistic ${S.toFixed(3)} lies between ${acceptAt.toFixed(3)} and ${rejectAt.toFixed(3)}.`;
  return { status, interval: nominal(), reportedLevel: setup.level, message, ruleLabel: label };
}

/** Placeholder interval of a stop-only `keep going` decision (never shown). */
const NO_INTERVAL = { estimate: Number.NaN, lower: Number.NaN, upper: Number.NaN };
