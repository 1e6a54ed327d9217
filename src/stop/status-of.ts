/**
 * Verdict status from a target check — the one mapping every rule uses.
 *
 * Question answered: "which of the four verdicts does this target check mean?" (met → enough,
 * below → below limit, above → above limit, anything else → keep going). Source: the verdict vocabulary of
 * src/model/types.ts (src/cli/README.md, "Output": `keep going`, `enough`, `below limit`, `above limit`).
 *
 * `decideOn` is the rules' common last step: check one interval against the target and word the result.
 *
 * @example statusOf('met') // 'enough'
 */
import type { VerdictStatus } from '../model/types.ts';
import type { Interval, RuleContext, RuleDecision, TargetCheck } from './rule-context.ts';

export function statusOf(check: TargetCheck): VerdictStatus {
  switch (check) {
    case 'met':
      return 'enough';
    case 'below':
      return 'below limit';
    case 'above':
      return 'above limit';
    default:
      return 'keep going';
  }
}

/** The words of a decision: not met yet; met (or decided); a one-sided verdict on a limit, when it differs. */
export interface DecisionWords {
  keepGoing: string;
  met: string;
  limit?: string;
}

/** The rule's decision on one interval: its verdict from the target check, worded by `words`. */
export function decideOn(
  ctx: RuleContext,
  interval: Interval,
  reportedLevel: number,
  ruleLabel: string,
  words: DecisionWords,
): RuleDecision {
  const status = statusOf(ctx.check(interval));
  const message =
    status === 'keep going'
      ? words.keepGoing
      : status === 'enough' || words.limit === undefined
        ? words.met
        : words.limit;
  return { status, interval, reportedLevel, message, ruleLabel };
}
