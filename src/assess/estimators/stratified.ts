/**
 * Stratified mean (Cochran 1977, Sampling Techniques, ch. 5: ȳ_st = Σ W_h ȳ_h, v = Σ W_h² s_h² (1 − f_h) / n_h)
 * with Satterthwaite degrees of freedom, and "where next" (the stratum where one more entry narrows the
 * interval most for its effort). When entries carry primary units, each stratum's units are its replicates
 * (ratio mean over units, Cochran ch. 9). Reads the running state: O(strata) per entry.
 */
import { type StratumSummary, stratifiedMean } from '../../design/stratified-mean.ts';
import { type WhereNextStratum, whereNext } from '../../design/where-next.ts';
import type { AnalysisSetup, Sided } from '../../model/types.ts';
import type { EntryState, StratumState } from '../entries.ts';
import type { Details } from '../estimator.ts';
import { sidedWords } from '../estimator.ts';
import { type DesignBase, withEstimate, withoutEstimate } from './design-interval.ts';

function checkStrata(setup: AnalysisSetup): void {
  const names = new Set<string>();
  for (const s of setup.strata ?? []) {
    if (s.name === '' || names.has(s.name))
      throw new RangeError('assess requires distinct, non-empty stratum names');
    if (!(s.weight > 0)) throw new RangeError('assess requires every stratum weight > 0');
    if (s.cost !== undefined && !(s.cost > 0)) throw new RangeError('assess requires every stratum cost > 0');
    names.add(s.name);
  }
}

/** A stratum's summary for the stratified mean: its entries, or its primary units when entries carry units. */
function summaryOf(s: StratumState, byUnits: boolean, population: number | undefined): StratumSummary {
  if (byUnits) {
    const units = s.units.moments.units;
    const r = s.units.ratio();
    return {
      name: s.name,
      weight: s.weight,
      n: units,
      mean: r.status === 'ok' ? r.mean : s.summary.mean,
      variance: r.status === 'ok' ? r.variance * units : 0,
    };
  }
  const out: StratumSummary = {
    name: s.name,
    weight: s.weight,
    n: s.summary.n,
    mean: s.summary.mean,
    variance: s.summary.variance,
  };
  if (population !== undefined && population >= out.n) out.population = population;
  return out;
}

export function stratifiedEstimator(state: EntryState, setup: AnalysisSetup) {
  checkStrata(setup);
  const declared = setup.strata ?? [];
  const details: Details = {};
  const warnings: string[] = [];
  const stray = state.stray;
  if (stray > 0)
    warnings.push(
      `${stray} entr${stray === 1 ? 'y has' : 'ies have'} no declared stratum and ${stray === 1 ? 'is' : 'are'} left out of the stratified estimate.`,
    );
  const byUnits = state.units.named > 0;
  const summaries: StratumSummary[] = [];
  let entries = 0;
  let units = 0;
  state.strata.forEach((s, i) => {
    const summary = summaryOf(s, byUnits, declared[i]?.population);
    const count = s.summary.n;
    entries += count;
    units += summary.n;
    summaries.push(summary);
    if (byUnits) details[`stratum.${s.name}.units`] = summary.n;
    details[`stratum.${s.name}.n`] = count;
    details[`stratum.${s.name}.mean`] = count > 0 ? summary.mean : null;
    details[`stratum.${s.name}.sd`] = summary.n > 1 ? Math.sqrt(summary.variance) : null;
  });
  const next = whereNext(
    declared.map((s, i) => {
      const w: WhereNextStratum = {
        name: s.name,
        weight: s.weight,
        n: summaries[i]!.n,
        sd: Math.sqrt(summaries[i]!.variance),
      };
      if (s.cost !== undefined) w.cost = s.cost;
      if (!byUnits && s.population !== undefined && s.population >= w.n) w.population = s.population;
      return w;
    }),
  );
  if (next.status === 'suggest') {
    details.whereNext = next.stratum;
    details.whereNextReason = next.reason;
    details.whereNextMessage = byUnits
      ? next.message.replace('one more entry', 'one more primary unit')
      : next.message;
  }
  details.strata = declared.length;
  const r = stratifiedMean(summaries);
  const unitWord = byUnits ? 'primary units' : 'entries';
  const base: DesignBase = {
    method: 'stratified-t',
    label: (level: number, sided: Sided) =>
      `Stratified mean (Cochran), Student t with Satterthwaite df${byUnits ? ', primary units as replicates' : ''}, ${sidedWords(level, sided)}`,
    replicates: units,
    entriesPerReplicate: units > 0 ? entries / units : 1,
    n: state.n,
    details,
    warnings,
  };
  if (r.status === 'too-few')
    return withoutEstimate(
      base,
      'below-minimum',
      `Every stratum needs at least two ${unitWord} before the stratified interval can be given; still short: ${r.strata.join(', ')}.`,
    );
  details.df = r.df;
  return withEstimate(
    base,
    { estimate: r.mean, se: r.se, df: r.df },
    'No stratum shows any spread yet; no interval can be given.',
  );
}
