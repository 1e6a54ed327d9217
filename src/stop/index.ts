/**
 * The stopping rules (src/stop/), behind one seam: `decide(ctx, setup)`, called by assess() once the
 * shared guards (minimum n, zero spread, one distinct value, all-zero counts) have passed.
 *
 * - standard (default): the data kind's interval at a calibrated inflated level (standard.ts)
 * - strict: Stein two-stage / confidence sequence (strict.ts)
 * - sprt: Wald's sequential probability ratio test against a limit (sprt.ts)
 * - naive: no correction (comparison only, naive.ts)
 *
 * The setup screen's figures come from sprtBoundaries, sprtOperatingCharacteristic, strictCost,
 * standardLevel and ruleWarnings, re-exported here. See README.md in this folder.
 */
import type { AnalysisSetup } from '../model/types.ts';
import { naiveRule } from './naive.ts';
import type { RuleContext, RuleDecision } from './rule-context.ts';
import { sprtRule } from './sprt.ts';
import { standardRule } from './standard.ts';
import { strictRule } from './strict.ts';

export { betaBinomialConfidenceSequence } from './beta-binomial-confidence-sequence.ts';
export { greenStopLine } from './green-stop-line.ts';
export { kunoStopLine } from './kuno-stop-line.ts';
export { HOT_SPOT_DETECTION, minimumBeforeVerdict } from './minimum.ts';
export type { Interval, RuleContext, RuleDecision, TargetCheck } from './rule-context.ts';
export { ruleWarnings } from './rule-warnings.ts';
export { sprtMaxN, sprtModelOf } from './sprt.ts';
export { type SprtFamily, type SprtLines, type SprtModel, sprtBoundaries } from './sprt-boundaries.ts';
export { sprtFixedSize } from './sprt-fixed-size.ts';
export { sprtOperatingCharacteristic } from './sprt-operating-characteristic.ts';
export { standardLevel } from './standard-level.ts';
export { steinTwoStage } from './stein-two-stage.ts';
export { twoStagePlan } from './strict.ts';
export { strictCost } from './strict-cost.ts';

export function decide(ctx: RuleContext, setup: AnalysisSetup): RuleDecision {
  switch (setup.rule) {
    case 'naive':
      return naiveRule(ctx, setup);
    case 'standard':
      return standardRule(ctx, setup);
    case 'strict':
      return strictRule(ctx, setup);
    case 'sprt':
      return sprtRule(ctx, setup);
  }
}
