/**
 * Results below a reporting limit (non-detects): the Kaplan–Meier mean for left-censored data (Kaplan & Meier
 * 1958, flipped as in Helsel 2012, Statistics for Censored Environmental Data, ch. 6) with Student t on n − 1
 * df. Above half non-detects no mean is given: Helsel (2012) advises reporting the share of detects or
 * comparing results with the limit instead, as a mean then rests mostly on censored values. With `nonDetects: 'half-limit'` the non-detects were already replaced by half the reporting
 * limit (entries.ts) and this is a plain t on the results, labelled as substitution. Sorting the results is
 * the one O(n log n) step per entry of any design.
 */
import { kaplanMeierMean } from '../../design/kaplan-meier-mean.ts';
import type { AnalysisSetup, Sided } from '../../model/types.ts';
import type { EntryState } from '../entries.ts';
import { type Details, sidedWords } from '../estimator.ts';
import { type DesignBase, withEstimate, withoutEstimate } from './design-interval.ts';

/** Share of non-detects above which a mean is not supportable. */
export const MAX_NON_DETECT_SHARE = 0.5;

function pct(x: number): string {
  return `${Math.round(x * 100)} %`;
}

export function nonDetectsEstimator(state: EntryState, setup: AnalysisSetup) {
  void setup;
  const substituted = state.substituted > 0;
  const r = kaplanMeierMean(state.points);
  const details: Details = { nonDetects: r.nonDetects, nonDetectShare: r.share };
  const warnings: string[] = substituted
    ? []
    : [`${r.nonDetects} of ${r.n} results are non-detects (${pct(r.share)}).`];
  const base: DesignBase = {
    method: substituted ? 'half-limit-t' : 'kaplan-meier-t',
    label: (level: number, sided: Sided) =>
      substituted
        ? `Student t on the results with non-detects set to half the reporting limit (substitution, as chosen), ${sidedWords(level, sided)}`
        : `Kaplan–Meier mean for non-detects (Helsel 2012), Student t with n − 1 df, ${sidedWords(level, sided)}`,
    replicates: r.n,
    entriesPerReplicate: 1,
    n: state.n,
    details,
    warnings,
  };
  if (r.share > MAX_NON_DETECT_SHARE)
    return withoutEstimate(
      base,
      'not-supportable',
      `More than half the results are non-detects (${pct(r.share)}): a mean is not supportable. Report the share of detects, or compare the individual results with the limit.`,
    );
  if (r.status === 'too-few')
    return withoutEstimate(
      base,
      'below-minimum',
      'At least two detected results are needed for a Kaplan–Meier mean.',
    );
  details.kmSd = r.sd;
  details.sd = r.sdSample;
  return withEstimate(
    base,
    { estimate: r.mean, se: r.se, df: r.n - 1 },
    'All detected results are equal; no interval can be given.',
  );
}

/** Non-detects inside strata, primary units or composites: no estimate in this version. */
export function notSupportedEstimator(state: EntryState) {
  const km = kaplanMeierMean(state.points);
  const base: DesignBase = {
    method: 'not-supported',
    label: () => 'Non-detects within strata, primary units or composites',
    replicates: state.n,
    entriesPerReplicate: 1,
    n: state.n,
    details: { nonDetects: km.nonDetects, nonDetectShare: km.share },
    warnings: [],
  };
  return withoutEstimate(
    base,
    'not-supportable',
    'Non-detects inside strata, primary units or composites are not supported by this version: no estimate is given. The half-limit substitution (if a regulation prescribes it) or an analysis by a statistician are the alternatives.',
  );
}
