/** The verdict's own words beside its status: how many more, and what a reached verdict allows. */
import type { Assessment } from '../model/types.ts';

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
