/**
 * Each linked study's sync state, as the screens show it. Light (no network, no core): the field screen's
 * crew chip and the crew panel read it; web/sync/engine.ts sets it.
 */
import type { SyncStateWords } from '../core-light.ts';
import { store } from '../state/store.ts';

/** A study's sync state (the shape its words read: src/words/crew.ts). */
export type SyncStatus = SyncStateWords;

/** studyId → status, for studies linked to a crew server only. */
export const syncStatus = store<Readonly<Record<string, SyncStatus>>>({});

export function setStatus(studyId: string, s: SyncStatus | null): void {
  const next = { ...syncStatus.get() };
  if (s === null) delete next[studyId];
  else next[studyId] = s;
  syncStatus.set(next);
}
