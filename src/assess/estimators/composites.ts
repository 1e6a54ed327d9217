/**
 * Replicate composite (incremental) samples: each entry is one composite, and the upper bound on the mean
 * comes from the replicates (ITRC 2012, updated 2020, Incremental Sampling Methodology ISM-1, §4.2.2.2 and §4.3.4.1: Student t or Chebyshev
 * UCL from at least three replicates). O(replicates) per entry; replicates are few.
 */
import { compositeUcl } from '../../design/composite-ucl.ts';
import type { AnalysisSetup, Sided } from '../../model/types.ts';
import type { EntryState } from '../entries.ts';
import { type Details, sidedWords } from '../estimator.ts';
import { type DesignBase, withEstimate, withoutEstimate } from './design-interval.ts';

/** Replicate composites needed before a verdict (ITRC ISM: typically three), unless `min` is smaller. */
export const COMPOSITE_MIN = 3;

export function compositesEstimator(state: EntryState, setup: AnalysisSetup) {
  const values = state.pointValues;
  const r = compositeUcl(values, setup.level);
  const chebyshev = setup.method === 'chebyshev';
  const details: Details = { replicates: values.length };
  const warnings: string[] = [];
  if (setup.sided !== 'upper' && setup.target?.kind !== 'limit')
    warnings.push(
      'Replicate composites give an upper bound on the mean (incremental-sampling practice); the interval shown follows the chosen sidedness but rests on very few replicates.',
    );
  const base: DesignBase = {
    method: chebyshev ? 'composite-chebyshev' : 'composite-t',
    label: (level: number, sided: Sided) =>
      `${chebyshev ? 'Chebyshev' : 'Student t'} bound from ${values.length} replicate composite${values.length === 1 ? '' : 's'}, ${sidedWords(level, sided)}`,
    replicates: values.length,
    entriesPerReplicate: 1,
    n: state.n,
    min: Math.min(setup.min, COMPOSITE_MIN),
    chebyshev,
    details,
    warnings,
  };
  if (r.status === 'no-bound') return withoutEstimate(base, 'below-minimum', r.message, values[0] ?? null);
  details.tUcl = r.tUcl;
  details.chebyshevUcl = r.chebyshevUcl;
  return withEstimate(
    base,
    { estimate: r.mean, se: r.se, df: r.replicates - 1 },
    'The replicate composites agree exactly; no bound can be estimated from them.',
  );
}
