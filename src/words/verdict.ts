/** The verdict's own words beside its status: how many more, what a reached verdict allows, the decision. */
import type { StudySetup } from '../model/records.ts';
import type { Assessment } from '../model/types.ts';
import { plain } from './numbers.ts';
import { outcomeWords, valueUnit, withUnit } from './study.ts';

/**
 * "about 12 more (likely 8–15)" while the verdict is "keep going" and a projection exists; null otherwise.
 * `atPace` turns a number of entries into a duration at the crew's pace ("40 min"), when known.
 */
export function moreWords(a: Assessment, atPace?: (entries: number) => string): string | null {
  const m = a.more;
  if (a.verdict.status !== 'keep going' || !m) return null;
  if (m.atLeast) return `at least ${m.likely} more before a verdict`;
  const range = m.low === m.high ? '' : ` (likely ${m.low}–${m.high})`;
  if (m.likely === 0)
    return `the next entries may settle it${range ? ` (likely ${m.low}–${m.high} more)` : ''}`;
  const pace = atPace ? `, about ${atPace(m.likely)} at your pace` : '';
  return `about ${m.likely} more${range}${pace}`;
}

/** What a reached verdict allows, or null while it is "keep going". */
export function doneWords(a: Assessment): string | null {
  if (a.verdict.status === 'keep going') return null;
  return a.verdict.status === 'enough'
    ? 'The target is met at this confidence: you may stop.'
    : 'The decision is reached at this confidence: you may stop.';
}

/** The limit with its unit: "50 mg/kg", "10 % loose fitting"; null without a limit target. */
function limitWords(setup: StudySetup, sep: string): string | null {
  const t = setup.target;
  if (t?.kind !== 'limit') return null;
  return setup.kind === 'pass-fail'
    ? `${plain(t.value * 100, sep)} % ${outcomeWords(setup)}`
    : withUnit(plain(t.value, sep), valueUnit(setup));
}

/**
 * The verdict as a field worker reads it at a glance, in plain words and worded as a decision against a
 * limit ("below the limit of 10 % loose fitting — decided"). The rule's own sentence (crossing lines,
 * running statistics, its technical name) stays in the core's message, which the screens keep in a fold.
 */
export function decisionWords(a: Assessment, setup: StudySetup, sep = '.'): string {
  const limit = limitWords(setup, sep);
  const v = a.verdict;
  if (v.status === 'below limit') return `Below the limit${limit ? ` of ${limit}` : ''} — decided.`;
  if (v.status === 'above limit') return `Above the limit${limit ? ` of ${limit}` : ''} — decided.`;
  if (v.status === 'enough') return 'The interval meets the target — enough.';
  if (v.reason === 'undecided')
    return `Not decided yet: the data do not yet show which side of the limit${limit ? ` of ${limit}` : ''} it is.`;
  if (v.reason === 'target-not-met') return 'The interval is still wider than the target.';
  return v.message;
}
