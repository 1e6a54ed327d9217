/**
 * Hot-spot detection by random entries — how many entries make it 95 % sure that an area covering a given
 * share of the site (or a group of items making up a given share of a lot) is hit at least once, and,
 * the other way round, the largest share that n entries could still have missed.
 *
 * Source: the zero-acceptance (c = 0) binomial argument. Each entry placed at random lands outside an area
 * covering a share p of the site with probability 1 − p, so n independent entries all miss it with
 * probability (1 − p)^n and hit it at least once with probability 1 − (1 − p)^n (Gilbert RO (1987)
 * Statistical Methods for Environmental Pollution Monitoring, Van Nostrand Reinhold, ch. 10 "Locating hot
 * spots", which treats the grid version; the random-sampling form is the same binomial probability as the
 * c = 0 acceptance plan of attribute sampling, e.g. Schilling EG, Neubauer DV (2009) Acceptance Sampling in
 * Quality Control, 2nd ed., ch. 4). Chapter numbers are given from memory.
 * - n entries for detection probability P: the least n with 1 − (1 − p)^n ≥ P,
 *   n = ⌈ln(1 − P) / ln(1 − p)⌉ (29 for p = 0.10 and P = 0.95);
 * - the share n entries could still have missed at that probability: the largest s with (1 − s)^n ≥ 1 − P,
 *   s = 1 − (1 − P)^(1/n) (about 10 % at n = 29, 26 % at n = 10).
 * Preconditions: 0 < share < 1, 0 < detection < 1, n ≥ 1 whole.
 * Validity: entries placed at random (or on a random start grid) over the whole site or lot; a hot area that
 * is not sampled at all (outside the sampled ground) is not covered by the argument.
 * @example hotSpotDetection.entriesFor(0.1) // 29
 * @example hotSpotDetection.unseenShare(29) // 0.0981
 */
export const hotSpotDetection = {
  entriesFor(share: number, detection = 0.95): number {
    if (!(share > 0 && share < 1)) throw new RangeError('hotSpotDetection.entriesFor requires 0 < share < 1');
    if (!(detection > 0 && detection < 1))
      throw new RangeError('hotSpotDetection.entriesFor requires 0 < detection < 1');
    // a ratio that is a whole number up to rounding (share = 1 − 0.05^(1/k)) must give k, not k + 1
    const x = Math.log1p(-detection) / Math.log1p(-share);
    return Math.max(1, Math.ceil(x - 1e-9 * x));
  },
  unseenShare(n: number, detection = 0.95): number {
    if (!(Number.isInteger(n) && n >= 1))
      throw new RangeError('hotSpotDetection.unseenShare requires n >= 1');
    if (!(detection > 0 && detection < 1))
      throw new RangeError('hotSpotDetection.unseenShare requires 0 < detection < 1');
    return -Math.expm1(Math.log1p(-detection) / n);
  },
};
