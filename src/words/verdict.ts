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
  if (m.atLeast)
    return `at least ${m.likely} more before a verdict${m.high > m.likely ? ` (likely ${m.low}–${m.high})` : ''}`;
  const range = m.low === m.high ? '' : ` (likely ${m.low}–${m.high})`;
  if (m.likely === 0)
    return `the next entries may settle it${range ? ` (likely ${m.low}–${m.high} more)` : ''}`;
  const pace = atPace ? `, about ${atPace(m.likely)} at your pace` : '';
  return `about ${m.likely} more${range}${pace}`;
}

/** A share for reading: whole percents from 5 % up, two significant digits below ("about 10 %", "2.9 %"). */
function shareWords(s: number, sep: string): string {
  return s >= 0.05 ? `${Math.round(s * 100)} %` : `${plain(Number((s * 100).toPrecision(2)), sep)} %`;
}

/**
 * What the entries so far could still have missed: the largest share of the site (or of the lot's items)
 * that every one of n random entries misses with probability 5 % or more (details.unseenShare, from
 * src/stats/hot-spot-detection.ts). Null when the assessment has no such figure (composites, no entries).
 */
export function unseenWords(a: Assessment, sep = '.'): string | null {
  const s = a.details.unseenShare;
  if (typeof s !== 'number') return null;
  const share = shareWords(s, sep);
  return a.kind === 'pass-fail'
    ? `A group of up to about ${share} of the lot’s items could still be unseen: ${a.n} random items all miss a group that size 1 time in 20.`
    : `An area of up to about ${share} of the site could still be unseen: ${a.n} random entries all miss an area that size 1 time in 20.`;
}

/**
 * The minimum before a verdict and where it comes from: "29 entries (10 % of the site must not go unseen;
 * your minimum is 10)". From details.minimum and details.hotSpotShare (src/stop/minimum.ts).
 */
export function minimumWords(a: Assessment, setup: StudySetup, sep = '.'): string {
  const min = typeof a.details.minimum === 'number' ? a.details.minimum : setup.min;
  const share = a.details.hotSpotShare;
  const what = setup.kind === 'pass-fail' ? 'of the lot’s items' : 'of the site';
  if (typeof share !== 'number' || min <= setup.min) return `${min} entries`;
  return `${min} entries (an area of ${plain(share * 100, sep)} % ${what} must not go unseen: ${min} random entries find it with 95 % probability; your own minimum is ${setup.min})`;
}

/** The spread-jump flag (details.spreadJumpEntry, src/assess/entries.ts) in plain words, or null. */
export function spreadJumpWords(a: Assessment, sep = '.'): string | null {
  const at = a.details.spreadJumpEntry;
  const v = a.details.spreadJumpValue;
  if (typeof at !== 'number' || typeof v !== 'number') return null;
  return `Possible hot spot: entry ${at} (${plain(v, sep)}) more than doubled the spread of the values before it. Look at where it was taken; more entries or strata may be needed there.`;
}

/**
 * What a reached verdict allows, or null while it is "keep going"; with what could still be unseen and the
 * hot-spot flag, since stopping is when they matter.
 */
export function doneWords(a: Assessment, sep = '.'): string | null {
  if (a.verdict.status === 'keep going') return null;
  const done =
    a.verdict.status === 'enough'
      ? 'The target is met at this confidence: you may stop.'
      : 'The decision is reached at this confidence: you may stop.';
  return [done, unseenWords(a, sep), spreadJumpWords(a, sep)].filter((w) => w !== null).join(' ');
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
  const jump = spreadJumpWords(a, sep);
  const flagged = (w: string) => (jump === null ? w : `${w} ${jump}`);
  if (v.reason === 'undecided')
    return flagged(
      `Not decided yet: the data do not yet show which side of the limit${limit ? ` of ${limit}` : ''} it is.`,
    );
  if (v.reason === 'target-not-met') return flagged('The interval is still wider than the target.');
  return flagged(v.message);
}
