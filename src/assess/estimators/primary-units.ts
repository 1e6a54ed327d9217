/**
 * Entries in primary units (quadrats along transects, samples in rooms): the ratio mean over units with the
 * units as replicates (Cochran 1977, Sampling Techniques, ch. 9; Scheaffer, Mendenhall & Ott, Elementary
 * Survey Sampling, ch. 8), Student t with units − 1 df, and the design effect that shows how much treating the
 * entries as independent would understate the uncertainty (Kish 1965, Survey Sampling, §8.2). Reads the
 * running unit moments: O(1) per entry.
 */
import { designEffect } from '../../design/design-effect.ts';
import type { AnalysisSetup, Sided } from '../../model/types.ts';
import type { EntryState } from '../entries.ts';
import { type Details, sidedWords } from '../estimator.ts';
import { type DesignBase, withEstimate, withoutEstimate } from './design-interval.ts';

export function primaryUnitsEstimator(state: EntryState, setup: AnalysisSetup) {
  void setup;
  const details: Details = {};
  const warnings: string[] = [];
  const n = state.n;
  const loose = n - state.units.named;
  if (loose > 0)
    warnings.push(
      `${loose} entr${loose === 1 ? 'y has' : 'ies have'} no primary unit and ${loose === 1 ? 'counts' : 'count'} as a unit of ${loose === 1 ? 'its' : 'their'} own.`,
    );
  const units = state.units.moments.units;
  const r = state.units.ratio();
  const base: DesignBase = {
    method: 'cluster-ratio-t',
    label: (level: number, sided: Sided) =>
      `Ratio mean over primary units (Cochran ch. 9), Student t with units − 1 df, ${sidedWords(level, sided)}`,
    replicates: units,
    entriesPerReplicate: n / Math.max(1, units),
    n,
    details,
    warnings,
  };
  details.primaryUnits = units;
  if (r.status === 'too-few')
    return withoutEstimate(
      base,
      'below-minimum',
      'At least two primary units (transects, rooms) are needed: the units, not the entries, are the replicates.',
    );
  details.meanUnitSize = r.meanSize;
  const elementSd = state.pointSd;
  const elementVariance = elementSd * elementSd;
  if (elementVariance > 0 && n >= 2) {
    const d = designEffect({
      clusterVariance: r.variance,
      elementVariance,
      entries: n,
      meanSize: r.meanSize,
    });
    details.designEffect = d.deff;
    details.effectiveN = d.effectiveN;
    if (d.rho !== null) details.intraclassCorrelation = d.rho;
    if (d.deff > 1.05)
      warnings.push(
        `Entries on one primary unit are not independent: treating the ${n} entries as independent would understate the uncertainty (design effect ${d.deff.toFixed(2)}; they are worth about ${d.effectiveN === null ? '—' : d.effectiveN.toFixed(1)} independent entries). The interval uses the ${units} primary units as replicates.`,
      );
  }
  if (units < 10)
    warnings.push(
      `Only ${units} primary units: the ratio estimate and its variance are rough below about 20 units.`,
    );
  return withEstimate(
    base,
    { estimate: r.mean, se: r.se, df: r.df },
    'The primary units do not differ yet; no interval can be given.',
  );
}
