/**
 * The minimum number of entries before any verdict other than `keep going`: the larger of the setup's own
 * minimum (`min`) and the number of random entries that hit an area covering the study's hot-spot share
 * with 95 % probability (src/stats/hot-spot-detection.ts; 29 entries for the default share of 10 %).
 *
 * Why the larger: `min` guards against stopping on a lucky run of similar values; the hot-spot share guards
 * against stopping before a small area of much higher values could have shown up at all (a site with a hot
 * tenth said "enough" at the 10th value in a third of simulated studies). Either reason alone is enough to
 * wait. A setup without a hot-spot share (made before the field existed) gets the default share, so an old
 * study is judged by the same honest minimum as a new one. The same argument holds for pass/fail lots: a
 * share of defective items at least the hot-spot share is seen at least once with 95 % probability — the
 * zero-acceptance plan (c = 0) of attribute sampling.
 *
 * Preconditions: a setup that passed the setup validator. Returns a whole number ≥ 1.
 * @example minimumBeforeVerdict({ kind: 'measurement', level: 0.95, sided: 'two', rule: 'standard', min: 10 }) // 29
 */
import { SETUP_DEFAULTS } from '../model/setup-lists.ts';
import type { AnalysisSetup } from '../model/types.ts';
import { hotSpotDetection } from '../stats/hot-spot-detection.ts';

/** The detection probability the hot-spot minimum is planned for. */
export const HOT_SPOT_DETECTION = 0.95;

let lastShare = Number.NaN;
let lastEntries = 0;

export function minimumBeforeVerdict(setup: Pick<AnalysisSetup, 'min' | 'hotSpotShare'>): number {
  const share = setup.hotSpotShare ?? SETUP_DEFAULTS.hotSpotShare;
  // called on every entry of a replay: the logarithms once per share
  if (share !== lastShare) {
    lastEntries = hotSpotDetection.entriesFor(share, HOT_SPOT_DETECTION);
    lastShare = share;
  }
  return Math.max(setup.min, lastEntries);
}
