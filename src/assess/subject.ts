/**
 * Which estimator applies to the entries so far, and the Subject the pipeline assesses. The choice follows the
 * setup and the entries (an entry below a reporting limit, or one that names a primary unit, calls for a
 * design-based estimate from then on):
 *   non-detects still censored inside strata, primary units or composites → not supported (says so)
 *   composites → stratified (primary units as replicates when entries carry them) → primary units
 *   → non-detects (Kaplan–Meier, or the half-limit substitution when chosen) → the data kind's estimator.
 * Per-entry cost by estimator: data kinds O(1) (Land's method: a one-dimensional quadrature per new n and SD);
 * strata O(strata); primary units O(1); composites O(replicates); non-detects O(n log n) (sorting).
 */
import type { AnalysisSetup } from '../model/types.ts';
import type { EntryState } from './entries.ts';
import type { Estimator } from './estimator.ts';
import { compositesEstimator } from './estimators/composites.ts';
import { countEstimator } from './estimators/count.ts';
import { measurementEstimator } from './estimators/measurement.ts';
import { nonDetectsEstimator, notSupportedEstimator } from './estimators/non-detects.ts';
import { passFailEstimator } from './estimators/pass-fail.ts';
import { primaryUnitsEstimator } from './estimators/primary-units.ts';
import { stratifiedEstimator } from './estimators/stratified.ts';
import type { Subject } from './pipeline.ts';

/** The data kind's own estimator over a running summary (no design). */
export function kindEstimator(state: EntryState, setup: AnalysisSetup): Estimator {
  switch (setup.kind) {
    case 'measurement':
      return measurementEstimator(state.summary, setup);
    case 'count':
      return countEstimator(state.summary, setup);
    case 'pass-fail':
      return passFailEstimator(state.summary, setup);
  }
}

function designChoice(state: EntryState, setup: AnalysisSetup): Estimator {
  const hasStrata = state.strata.length > 0;
  const hasUnits = state.units.named > 0;
  const composite = setup.design === 'composite';
  if (state.censored > 0 && (hasStrata || hasUnits || composite)) return notSupportedEstimator(state);
  if (composite) return compositesEstimator(state, setup);
  if (hasStrata) return stratifiedEstimator(state, setup);
  if (hasUnits) return primaryUnitsEstimator(state, setup);
  return nonDetectsEstimator(state, setup);
}

/** Notes on the non-detects that hold whichever design estimator applies. */
function withNonDetectNotes(e: Estimator, state: EntryState, setup: AnalysisSetup): Estimator {
  if (state.censored === 0 && state.substituted === 0) return e;
  const notes: string[] = [];
  const extra: Record<string, number> = {};
  const high = state.censoredAtOrAboveLimit;
  const limit = setup.target?.kind === 'limit' ? setup.target.value : null;
  if (high > 0 && limit !== null)
    notes.push(
      `${high} non-detect${high === 1 ? ' has a reporting limit' : 's have reporting limits'} at or above the decision limit (${limit}): such results cannot show that the concentration is below the limit. Ask the laboratory for a lower reporting limit.`,
    );
  if (state.substituted > 0) {
    const k = state.substituted;
    extra.substituted = k;
    extra.nonDetectShare = k / state.n;
    notes.push(
      `SUBSTITUTION: ${k} non-detect${k === 1 ? ' was' : 's were'} replaced by half the reporting limit, as chosen for this study (use only where a regulation prescribes it; Kaplan–Meier is the default).`,
    );
    // the points already hold the substituted values: their running mean, not a pass over the log
    if (state.n >= 2) extra.substitutedMean = state.pointMoments.mean;
  }
  return {
    ...e,
    details: () => ({ ...extra, ...e.details() }),
    warnings: () => [...notes, ...e.warnings()],
  };
}

/** The entries so far, ready for the pipeline. */
export function subjectOf(state: EntryState, setup: AnalysisSetup): Subject {
  if (!state.design) {
    const s = state.summary;
    const n = s.n;
    return {
      estimator: kindEstimator(state, setup),
      n,
      stats: {
        total: s.total,
        mean: s.mean,
        sd: s.sd,
        logMean: s.positive === n && n >= 1 ? s.logMean : null,
        logSd: s.positive === n && n >= 2 ? s.logSd : null,
      },
      values: state.values,
      spreadJump: state.spreadJump,
    };
  }
  const chosen = designChoice(state, setup);
  const estimator = withNonDetectNotes(
    { ...chosen, details: () => ({ ...chosen.details(), design: chosen.method }) },
    state,
    setup,
  );
  const m = state.pointMoments;
  return {
    estimator,
    n: state.n,
    stats: {
      total: m.mean * m.n,
      mean: chosen.estimate ?? m.mean,
      sd: state.pointSd,
      logMean: null,
      logSd: null,
    },
    values: state.pointValues,
    spreadJump: state.spreadJump,
  };
}
