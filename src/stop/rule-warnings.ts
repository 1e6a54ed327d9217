/**
 * Plain warnings for regimes where a stopping rule is known (from the coverage benchmark) not to keep
 * its promise — shown in the setup and beside the verdict.
 *
 * Source: test/bench/coverage.md (this project's Monte Carlo benchmark of the stopping rules, run of 2026-12-02,
 * R = 10,000 per cell, summarised in src/stop/README.md, "Measured coverage"). Each warning names the shortfall
 * measured there: every cell where the default standard rule covered less than 94 % (beyond the Monte Carlo
 * margin) is named here for its data kind and target, before the study starts.
 *
 * Preconditions: none. Returns a list of plain-language sentences (empty when nothing to warn about).
 *
 * @example ruleWarnings({ kind: 'measurement', level: 0.95, sided: 'two', rule: 'naive', min: 10 })[0]
 * // "The naive rule …"
 */
import type { AnalysisSetup } from '../model/types.ts';
import { minimumBeforeVerdict } from './minimum.ts';

export function ruleWarnings(setup: AnalysisSetup): string[] {
  const w: string[] = [];
  const { kind, rule, method, target } = setup;
  const min = minimumBeforeVerdict(setup);
  if (rule === 'naive')
    w.push(
      'The naive rule stops the first time the interval looks narrow enough; its "95 %" interval then holds the true value less often (as low as 77 % for very skewed data, 19 % for rare pass/fail outcomes). Use it only for comparison.',
    );
  if (min < 10 && rule !== 'sprt')
    w.push(
      'A minimum below 10 observations (the larger of the minimum and what the hot-spot share asks for) makes early stops on a lucky run likely; 10 or more is recommended.',
    );
  if (
    kind === 'measurement' &&
    (rule === 'standard' || rule === 'naive') &&
    (method === 'cox' || method === 'land')
  )
    w.push(
      'The log-scale method is fixed for this study. It assumes lognormal-like values: on gamma-shaped values (their logarithms skewed to the left) the stopped interval held the mean in as few as 0–25 % of simulated studies. Let the data choose the interval (automatic) unless you know the values are lognormal.',
    );
  if (kind === 'measurement' && (rule === 'standard' || rule === 'naive') && method === 't')
    w.push(
      'Student t is fixed for this study. If the values are skewed (most small, a few large — typical of concentrations), let the data choose the interval (automatic): on the raw scale the stopped interval held the mean in as few as 76 % of simulated studies on strongly skewed values (CV 3).',
    );
  const defaultMeasurement = kind === 'measurement' && (method === undefined || method === 'auto');
  if (defaultMeasurement && rule === 'standard') {
    w.push(
      'A small area of much higher values (a hot area of 5–15 % of the site at ten times the rest) is not something more random entries fix: with one, the interval at the stop held the mean in only 74–91 % of simulated studies. Watch for the “possible hot spot” note, and search or stratify such an area instead.',
    );
    if (target?.kind === 'relative')
      w.push(
        'Very skewed values (spread about three times the mean) with a tight relative target: the interval at the stop held the mean in about 91 % of simulated studies instead of 95 %.',
      );
  }
  if (kind === 'count' && (rule === 'standard' || rule === 'naive')) {
    const k = setup.planning?.negBinomialK;
    if (k === undefined || k <= 2)
      w.push(
        "Clumped counts (many empty plots and a few crowded ones, negative-binomial k of 2 or less) with a margin or a limit: the '95 %' interval at the stop held the mean in 91.5–93.4 % of simulated surveys. Give Taylor's or Iwao's coefficients and a precision target to use a stop line, or a relative target (95 % there).",
      );
  }
  if (kind === 'pass-fail' && rule === 'standard' && target?.kind === 'relative')
    w.push(
      'A relative target on a rare outcome (5 % or less of the items): the interval at the stop held the rate in 91.5–93.4 % of simulated lots instead of 95 %. A margin in percentage points, or a decision against a limit, keeps its promise there.',
    );
  if (kind === 'pass-fail' && rule === 'standard' && target?.kind === 'limit')
    w.push(
      'A decision against a limit on a common outcome (near half of the items) with a limit close to it: the bound at the decision held the rate in about 93 % of simulated lots instead of 95 %.',
    );
  if (rule === 'standard' && target !== undefined)
    w.push(
      `The price of these promises: no verdict before ${min} entries, and decisions against a limit checked at a stricter level. In simulations a loose target (one that about 25 entries would meet) took on average 1.3–2 times the entries the target alone needs, a decision against a limit 1.2–2.6 times; a tighter target 10–40 % more.`,
    );
  if (kind === 'pass-fail' && target !== undefined && target.kind !== 'limit')
    w.push(
      'No “enough” is given while every item so far has the same outcome, so with a rare outcome (about 2 %) the study runs on until the first one turns up: in simulations it took about 1.4 times the planned number of items. To show that an outcome is rare, decide against a limit instead (no counted outcome in enough items is a valid answer).',
    );
  if (kind === 'pass-fail' && min < 20 && (rule === 'standard' || rule === 'naive'))
    w.push(
      'For rare outcomes (under about 5 %), a minimum of 20–30 items is recommended before any verdict.',
    );
  const projection = projectionCaution(setup);
  if (projection !== null) w.push(projection);
  if (rule === 'strict' && kind !== 'pass-fail')
    w.push(
      target?.kind === 'limit'
        ? 'The strict rule does not decide against a limit for measurements or counts; choose the limit decision.'
        : 'The strict rule is not offered for measurements and counts (the New study form offers it for pass/fail only): its two-stage plan is exact only for evenly spread values, and in simulations of skewed values and clumped counts it held the mean in as few as 88 % of studies (73 % with a small hot area).',
    );
  if (rule === 'sprt' && kind === 'measurement')
    w.push(
      'The limit decision on measurements uses the spread estimated from the values so far as if it were known; in simulations (lognormal values, CV 1) with 5 % and 10 % chosen risks it realised 1.6 % and 6.3 %.',
    );
  if (rule === 'sprt' && kind === 'count' && setup.planning?.negBinomialK === undefined)
    w.push(
      'The limit decision on counts assumes random (Poisson) counts unless you give the negative-binomial k; with clumped counts and no k its error rates are much larger than chosen.',
    );
  return w;
}

/**
 * Where "how many more" plans worst, from test/bench/calibration.md (run of 2026-12-02, R = 2,000 per cell, at 10
 * and 20 entries; its 10th–90th percentile range is meant to hold the entries the rule then needs about 80 % of
 * the time). One sentence for the study's kind and target, or null under the other rules (they project nothing).
 */
function projectionCaution(setup: AnalysisSetup): string | null {
  const { kind, rule, target } = setup;
  if (rule !== 'standard' || target === undefined || target.kind === 'precision') return null;
  const lead = '“How many more” is a planning figure, not a promise:';
  if (target.kind === 'limit') {
    const distance = `before a decision against a limit it depends on how close the true ${kind === 'pass-fail' ? 'rate' : 'value'} sits to the limit, which the first ${kind === 'pass-fail' ? 'items' : 'entries'} hardly tell, so its range is wide.`;
    if (kind === 'pass-fail')
      return `${lead} ${distance} With a rare outcome (5 % of the items or fewer) its likely figure was as low as a fifth of the items actually needed in simulated lots.`;
    if (kind === 'measurement')
      return `${lead} ${distance} On skewed values (most small, a few large) it still held the entries then needed in only 64–91 % of simulated studies, and its likely figure was as low as a third of them.`;
    return `${lead} ${distance}`;
  }
  if (kind === 'measurement')
    return `${lead} on skewed values (most small, a few large) or with a small area of much higher values its range held the entries actually needed in as few as 41–46 % of simulated studies (about 80 % intended), mostly because more were needed.`;
  if (kind === 'count')
    return `${lead} on clumped counts (many empty plots and a few crowded ones) its range held the plots actually needed in as few as 31–44 % of simulated surveys (about 80 % intended).`;
  return `${lead} with a rare outcome (5 % of the items or fewer) its likely figure was between a third and twice the items then needed in simulated lots, until the first counted items show the rate.`;
}
