/**
 * The crew view — answers "where does the crew as a whole stand?"
 *
 * Computed on each phone from the crew's events (its own and those pulled from the crew server) by the
 * core itself: the events in the pooled order (src/bundle/pooled-order.ts, the order `merge` writes), the
 * counted entries as points, and the one assessment. So the crew view equals `sure-enough merge` of the
 * phones' bundles followed by `sure-enough assess` on the result, figure for figure, and any phone can
 * check what another shows.
 *
 * Cost: O(N log N) for the order plus the running assessment's O(N).
 */
import { assess } from '../assess/index.ts';
import { type StratumProgress, strataProgress } from '../assess/strata-progress.ts';
import { type CollectorShare, collectorShares, pointsOf } from '../bundle/events.ts';
import { pooledOrder } from '../bundle/pooled-order.ts';
import type { ObservationRecord, StudyRecord } from '../model/records.ts';
import type { Assessment } from '../model/types.ts';

export interface CrewView {
  /** The pooled assessment (null when no entry is counted yet). */
  assessment: Assessment | null;
  /** Counted entries in the pool. */
  n: number;
  /** Each phone's contribution, sorted by device. */
  phones: CollectorShare[];
  /** Per-stratum progress for stratified studies (empty otherwise); "where next" is in the assessment's details. */
  strata: StratumProgress[];
}

/** The crew view of `events` (every phone's, deduplicated by id) under `study`'s setup. */
export function crewView(study: StudyRecord, events: readonly ObservationRecord[]): CrewView {
  const ordered = pooledOrder(events).map((e, i) => ({ ...e, seq: i + 1 }));
  const points = pointsOf(ordered);
  const phones = collectorShares(ordered);
  if (points.length === 0) return { assessment: null, n: 0, phones, strata: [] };
  const strata = study.setup.strata !== undefined ? strataProgress(points, study.setup) : [];
  return { assessment: assess(points, study.setup), n: points.length, phones, strata };
}
