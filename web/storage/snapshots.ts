/**
 * The running snapshot of a study (schema version 3, SCHEMA-v3.md): what the field screen needs to open
 * without reading and reassessing the whole log — the core's running assessment as data, the pace, and the
 * last records. It is a cache, never the record: it names the log it was taken from (record count and last
 * record id) and the app uses it only when the log still has exactly that count and that last record;
 * otherwise the study is rebuilt from the log (web/state/use-study.ts). It is written after a save has
 * committed, never at start, and with relaxed durability: losing it costs one rebuild, nothing else.
 */
import type { ObservationRecord, RunningSnapshot } from '../core.ts';
import { getDb, inTx, withWrite } from './db.ts';
import type { StoredStudy } from './schema.ts';

/** Raised when the shape of the stored snapshot (this wrapper, or the session's parts) changes. */
export const SESSION_SNAPSHOT_VERSION = 1;

export interface StoredSnapshot {
  studyId: string;
  version: number;
  /** The log it was taken from: how many records (entries and voids) and the last one's id. */
  count: number;
  lastId: string | null;
  running: RunningSnapshot;
  /** The pace's running median, as web/state/pace.ts stores it. */
  pace: unknown;
  /** The last records of the log (entries and voids), oldest first: "undo last" and the recent entries. */
  tail: ObservationRecord[];
}

function studyRange(studyId: string): IDBKeyRange {
  return IDBKeyRange.bound([studyId, 0], [studyId, Number.POSITIVE_INFINITY]);
}

export interface StartRead {
  study: StoredStudy | undefined;
  snapshot: StoredSnapshot | undefined;
  /** The log's last record now. */
  last: ObservationRecord | undefined;
  /**
   * The log's record count now. Answered after the rest: counting walks the study's whole index (tens of
   * milliseconds at 5,000 entries), so a screen may draw from a snapshot whose last record matches and
   * check the count right after (web/state/use-study.ts).
   */
  count: Promise<number>;
}

/**
 * One read-only transaction for the start of the field screen: the study, its snapshot, the log's last
 * record (a one-step cursor) and its count (an index count) — the log itself is not read.
 */
export async function readStart(studyId: string): Promise<StartRead> {
  const db = await getDb();
  const tx = db.transaction(['studies', 'snapshots', 'observations']);
  const idx = tx.objectStore('observations').index('byStudySeq');
  const first = Promise.all([
    tx.objectStore('studies').get(studyId),
    tx.objectStore('snapshots').get(studyId),
    idx.openCursor(studyRange(studyId), 'prev'),
  ]);
  // asked last: a transaction answers its requests in order, and the count is the slow one
  const count = idx.count(studyRange(studyId));
  count.catch(() => undefined);
  // read-only: the answers are final once each request has succeeded; waiting for the transaction's
  // complete event as well would only delay the first frame (a failed request rejects)
  tx.done.catch(() => undefined);
  const [study, snapshot, cursor] = await first;
  return { study, snapshot, last: cursor?.value, count };
}

/**
 * True when the snapshot is of this version and was taken at the log's last record (same id; its kept
 * records end there). The log's count must match the snapshot's as well: web/state/use-study.ts checks it.
 */
export function matchesLast(s: StoredSnapshot | undefined, last: ObservationRecord | undefined) {
  return (
    s !== undefined &&
    s.version === SESSION_SNAPSHOT_VERSION &&
    s.lastId === (last?.id ?? null) &&
    Array.isArray(s.tail) &&
    (s.tail.at(-1)?.id ?? null) === s.lastId
  );
}

/** Stores (replaces) the study's snapshot. Relaxed durability: it is a cache, rebuilt when lost. */
export function writeSnapshot(s: StoredSnapshot): Promise<void> {
  return withWrite(async (db) => {
    const tx = db.transaction('snapshots', 'readwrite', { durability: 'relaxed' });
    await inTx(tx, async () => {
      await tx.store.put(s);
    });
  });
}
