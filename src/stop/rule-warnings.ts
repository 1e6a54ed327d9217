/**
 * Plain warnings for regimes where a stopping rule is known (from the coverage benchmark) not to keep
 * its promise — shown in the setup and beside the verdict.
 *
 * Source: test/bench/coverage.md (this project's Monte Carlo benchmark of the stopping rules, summarised in
 * src/stop/README.md, "Measured coverage"). Each warning names the shortfall measured there.
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
  if (kind === 'measurement' && rule === 'standard' && (method === 'cox' || method === 'land'))
    w.push(
      'Very skewed values (spread about twice the mean) with a loose target: when only about 25 values are needed, the interval at the stop held the mean in about 93.7 % of simulated studies instead of 95 %.',
    );
  if (kind === 'measurement' && (rule === 'standard' || rule === 'naive') && method === 't')
    w.push(
      'Student t is fixed for this study. If the values are skewed (most small, a few large — typical of concentrations), let the data choose the interval (automatic): on the raw scale the stopped interval covers the mean only about 80 % of the time when the spread is as large as the mean twice over (CV 2).',
    );
  if (kind === 'count' && (rule === 'standard' || rule === 'naive')) {
    const k = setup.planning?.negBinomialK;
    if (k === undefined || k <= 2)
      w.push(
        "Clumped counts (many empty plots and a few crowded ones, negative-binomial k of 2 or less) with a loose target: when only about 25 plots are needed, the '95 %' interval at the stop held the mean in about 93 % of simulated surveys (92.7 % at k = 0.5). Set a larger minimum (20–30) for such organisms, or give Taylor's or Iwao's coefficients and a precision target to use a stop line.",
      );
  }
  if (kind === 'pass-fail' && target !== undefined && target.kind !== 'limit')
    w.push(
      'No “enough” is given while every item so far has the same outcome, so with a rare outcome (about 2 %) the study runs on until the first one turns up: in simulations it took about 1.4 times the planned number of items. To show that an outcome is rare, decide against a limit instead (no counted outcome in enough items is a valid answer).',
    );
  if (kind === 'pass-fail' && min < 20 && (rule === 'standard' || rule === 'naive'))
    w.push(
      'For rare outcomes (under about 5 %), a minimum of 20–30 items is recommended before any verdict.',
    );
  if (rule === 'strict' && kind !== 'pass-fail') {
    if (target?.kind === 'limit')
      w.push(
        'The strict rule does not decide against a limit for measurements or counts; choose the limit decision.',
      );
    else if (target?.kind !== 'margin' || kind === 'count' || method === 'cox')
      w.push(
        'The strict two-stage plan is exact only for near-normal measurements with a ± margin; for this target or data kind its guarantee is approximate (see the coverage benchmark).',
      );
  }
  if (rule === 'sprt' && kind === 'measurement')
    w.push(
      'The limit decision on measurements uses the spread estimated from the values so far as if it were known; in simulations with 5 % and 10 % chosen risks it realised 1.7 % and 10.7 %, so the second risk can be slightly exceeded.',
    );
  if (rule === 'sprt' && kind === 'count' && setup.planning?.negBinomialK === undefined)
    w.push(
      'The limit decision on counts assumes random (Poisson) counts unless you give the negative-binomial k; with clumped counts and no k its error rates are much larger than chosen.',
    );
  return w;
}
