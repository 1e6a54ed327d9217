/**
 * The crew view of a study on this phone: the core's `crewView` (src/sync/crew-view.ts — the pooled order,
 * the one assessment, each phone's share, per-stratum progress) over this phone's own log and the events
 * pulled from the other phones, one copy per event id. Nothing here computes a figure.
 */
import type { CrewView, ObservationRecord } from '../core.ts';
import { loadCore } from '../core-loader.ts';
import { listCrewEvents } from '../storage/crew.ts';
import { listObservations } from '../storage/observations.ts';
import { getStudy } from '../storage/studies.ts';

/** Own log first: an event that reached this phone both by a bundle and from the server counts once. */
export function crewPool(
  own: readonly ObservationRecord[],
  crew: readonly ObservationRecord[],
): ObservationRecord[] {
  const seen = new Set(own.map((e) => e.id));
  return [...own, ...crew.filter((e) => !seen.has(e.id))];
}

export async function crewViewOf(studyId: string): Promise<CrewView | null> {
  const [core, study, own, crew] = await Promise.all([
    loadCore(),
    getStudy(studyId),
    listObservations(studyId),
    listCrewEvents(studyId),
  ]);
  if (!study) return null;
  return core.crewView(study, crewPool(own, crew));
}
