/**
 * Per-stratum progress for the field screen's strata panel: entries, primary units, mean and SD per declared
 * stratum, in the declared order, read from the same running state the estimate uses.
 */
import type { AnalysisSetup, Point } from '../model/types.ts';
import { EntryState } from './entries.ts';

export interface StratumProgress {
  name: string;
  /** Normalised weight (0..1). */
  weight: number;
  /** Entries (non-void) in the stratum. */
  n: number;
  /** Primary units seen in the stratum (0 when the entries carry none). */
  clusters: number;
  mean: number | null;
  sd: number | null;
  /** At least two entries (or two primary units) — its spread can be estimated. */
  ready: boolean;
}

export function strataProgress(points: readonly Point[], setup: AnalysisSetup): StratumProgress[] {
  const state = new EntryState(setup);
  for (const p of points) state.add(p);
  const total = state.strata.reduce((a, s) => a + s.weight, 0);
  return state.strata.map((s) => {
    const n = s.summary.n + s.summary.censored;
    const clusters = s.units.namedUnits;
    return {
      name: s.name,
      weight: s.weight / total,
      n,
      clusters,
      mean: s.summary.n > 0 ? s.summary.mean : null,
      sd: s.summary.n > 1 ? s.summary.sd : null,
      ready: clusters > 0 ? clusters >= 2 : n >= 2,
    };
  });
}
