/**
 * Stop-only prefilter shared by the rules that check one interval against the target (standard, naive):
 * "does an interval that the rule's own interval is sure to contain already fail the target?" If so, the
 * rule's interval fails too — a wider interval meets a ± target less and decides a limit less — and the
 * verdict is `keep going` without the exact interval (rule-context.ts, innerIntervalAt). Tiers are tried
 * from the coarsest; the first that settles it ends the search.
 *
 * Preconditions: ctx.stopOnly (replay's loop); `widen` is the rule's own monotone widening (the count
 * floor), applied to the inner interval as it would be to the exact one.
 * Returns: the inner interval that settled `keep going`; false when inner intervals were at hand but none
 * settled it; null when there were none (the rule may try its own prefilter).
 * @example innerKeepGoing(ctx, 0.96, 'two', (iv) => iv) // false: the exact interval is needed
 */
import type { Sided } from '../model/types.ts';
import type { Interval, RuleContext } from './rule-context.ts';
import { statusOf } from './status-of.ts';

export function innerKeepGoing(
  ctx: RuleContext,
  level: number,
  sided: Sided,
  widen: (interval: Interval) => Interval,
): Interval | false | null {
  const inner = ctx.innerIntervalAt;
  if (inner === undefined) return null;
  for (let tier = 0; ; tier++) {
    const iv = inner(level, sided, tier);
    if (iv === null) return tier === 0 ? null : false;
    const w = widen(iv);
    if (statusOf(ctx.check(w)) === 'keep going') return w;
  }
}
