/**
 * Crew words: a study's sync state and the crew's phones, as the field screen's crew button and the crew
 * panel say them. The state itself is kept by the phone (web/sync); only its shape is needed here.
 */

/** What the words need of a study's sync state. */
export interface SyncStateWords {
  /** This phone's own events the crew server has not acknowledged yet. */
  waiting: number;
  /** When a sync last went through (ISO 8601), if ever. */
  lastSyncAt?: string;
  /** The last attempt found no connection (or the server busy); a retry is scheduled. */
  offline: boolean;
  /** The server refused a request: syncing waits for the user (this says why). */
  stopped?: string;
  /** A sync is running now. */
  syncing: boolean;
}

/** "14:05" in the phone's own clock (the time a crew member last saw the server). */
export function clockTime(iso: string): string {
  const d = new Date(iso);
  return `${String(d.getHours()).padStart(2, '0')}:${String(d.getMinutes()).padStart(2, '0')}`;
}

/** The short status: "synced", "3 waiting", "offline — 3 waiting", or "sync stopped". */
export function syncWord(s: SyncStateWords): string {
  if (s.stopped !== undefined) return 'sync stopped';
  if (s.offline) return `offline — ${s.waiting} waiting`;
  if (s.waiting > 0) return `${s.waiting} waiting`;
  return s.lastSyncAt === undefined ? (s.syncing ? 'syncing…' : 'not synced yet') : 'synced';
}

/** The whole line: the short status and the last sync ("synced · last sync 14:05"), or the refusal. */
export function syncLine(s: SyncStateWords): string {
  if (s.stopped !== undefined) return s.stopped;
  const last = s.lastSyncAt === undefined ? '' : ` · last sync ${clockTime(s.lastSyncAt)}`;
  return `${syncWord(s)}${last}`;
}

/** A phone of the crew: "This phone", or "Phone 1a2b3c4d" (the start of its device id). */
export function phoneWords(device: string, ownDevice: string): string {
  return device === ownDevice ? 'This phone' : `Phone ${device.slice(0, 8)}`;
}

/** "n 16 from 2 phones". */
export function crewCountWords(n: number, phones: number): string {
  return `n ${n} from ${phones} ${phones === 1 ? 'phone' : 'phones'}`;
}
