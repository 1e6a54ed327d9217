/**
 * Naive rule — stop the first time the nominal-level interval meets the target.
 *
 * Question answered: "what happens if we simply recompute after every entry and stop when it looks good?"
 * Kept only for comparison (`replay --rule naive`, the coverage benchmark). Its realised coverage falls
 * short of the nominal level because stopping is triggered preferentially when the spread happens to be
 * low (Anscombe 1952, Proc. Camb. Phil. Soc. 48:600–607; Woodroofe 1977, Ann. Stat. 5:984–995). Measured in
 * test/bench/coverage.md: 76–79 % for a "95 %" raw-scale t interval on lognormal data with CV 2.
 *
 * Preconditions: the shared guards (minimum, zero spread, …) have passed upstream.
 * Returns: the verdict and the interval at the nominal level.
 * Validity: none beyond a fixed sample size — descriptive only.
 *
 * @example naiveRule(ctx, { ...setup, rule: 'naive' }).reportedLevel // = setup.level
 */
import type { AnalysisSetup } from '../model/types.ts';
import { innerKeepGoing } from './inner-keep-going.ts';
import type { RuleContext, RuleDecision } from './rule-context.ts';
import { decideOn } from './status-of.ts';

export function naiveRule(ctx: RuleContext, setup: AnalysisSetup): RuleDecision {
  const label = 'naive (no correction for looking after every entry)';
  // stop-only: an interval inside the rule's own that misses the target settles `keep going` (rule-context.ts)
  const inner = ctx.stopOnly ? innerKeepGoing(ctx, setup.level, setup.sided, (iv) => iv) : null;
  if (inner !== null && inner !== false)
    return {
      status: 'keep going',
      interval: inner,
      reportedLevel: setup.level,
      message: '',
      ruleLabel: label,
    };
  const interval = ctx.intervalAt(setup.level, setup.sided);
  return decideOn(ctx, interval, setup.level, label, {
    keepGoing: 'The interval does not meet the target yet.',
    met: 'The interval meets the target (no correction for looking after every entry).',
  });
}
