/**
 * Each linked study's sync state, as the screens show it. Light (no network, no core): the field screen's
 * crew chip and the crew panel read it; web/sync/engine.ts sets it.
 */
import { store } from '../state/store.ts';

export interface SyncStatus {
  /** This phone's own events the crew server has not acknowledged yet. */
  waiting: number;
  /** When a sync last went through (ISO 8601), if ever. */
  lastSyncAt?: string;
  /** The last attempt found no connection (or the server busy); a retry is scheduled. */
  offline: boolean;
  /** The server refused a request: syncing waits for the user (the message says why). */
  stopped?: string;
  /** A sync is running now. */
  syncing: boolean;
}

/** studyId → status, for studies linked to a crew server only. */
export const syncStatus = store<Readonly<Record<string, SyncStatus>>>({});

export function setStatus(studyId: string, s: SyncStatus | null): void {
  const next = { ...syncStatus.get() };
  if (s === null) delete next[studyId];
  else next[studyId] = s;
  syncStatus.set(next);
}

/** "14:05" in the phone's own clock (the time a crew member last saw the server). */
export function clockTime(iso: string): string {
  const d = new Date(iso);
  return `${String(d.getHours()).padStart(2, '0')}:${String(d.getMinutes()).padStart(2, '0')}`;
}

/** The short status: "synced", "3 waiting", "offline — 3 waiting", or "sync stopped". */
export function statusWord(s: SyncStatus): string {
  if (s.stopped !== undefined) return 'sync stopped';
  if (s.offline) return `offline — ${s.waiting} waiting`;
  if (s.waiting > 0) return `${s.waiting} waiting`;
  return s.lastSyncAt === undefined ? (s.syncing ? 'syncing…' : 'not synced yet') : 'synced';
}

/** The whole line: the short status and the last sync ("synced · last sync 14:05"), or the refusal. */
export function statusLine(s: SyncStatus): string {
  if (s.stopped !== undefined) return s.stopped;
  const last = s.lastSyncAt === undefined ? '' : ` · last sync ${clockTime(s.lastSyncAt)}`;
  return `${statusWord(s)}${last}`;
}
