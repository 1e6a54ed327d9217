/**
 * A study's link to a crew server and the other phones' events (schema version 4, SCHEMA-v4.md).
 *
 * - `crewLinks`: one record per shared or joined study. Every change is a read-modify-write in one
 *   `durability: 'strict'` transaction, so what the server acknowledged (`pushedSeq`) and where pulling
 *   stands (`cursor`) survive the phone being killed the moment after.
 * - `crewEvents`: the other phones' events, stored once by id, never changed or deleted. They stay out of
 *   `observations`: this phone's own log, verdict, exports and bundles are exactly this phone's.
 *
 * This module only reads and writes; the sync loop is web/sync/engine.ts.
 */
import type { ObservationRecord } from '../core.ts';
import { getDb, inTx, StorageError, withWrite } from './db.ts';
import type { CrewLink } from './schema.ts';

function after(studyId: string, seq: number): IDBKeyRange {
  return IDBKeyRange.bound([studyId, seq + 1], [studyId, Number.POSITIVE_INFINITY]);
}

export async function getLink(studyId: string): Promise<CrewLink | undefined> {
  return (await getDb()).get('crewLinks', studyId);
}

export async function listLinks(): Promise<CrewLink[]> {
  return (await getDb()).getAll('crewLinks');
}

/** Stores a new link (share or join); an existing link of the study is replaced (joined again). */
export function saveLink(link: CrewLink): Promise<CrewLink> {
  return withWrite(async (db) => {
    const tx = db.transaction('crewLinks', 'readwrite', { durability: 'strict' });
    return inTx(tx, async () => {
      await tx.store.put(structuredClone(link));
      return link;
    });
  });
}

/** Changes some fields of a study's link; resolves with the stored link once committed. */
export function updateLink(studyId: string, change: (link: CrewLink) => CrewLink): Promise<CrewLink> {
  return withWrite(async (db) => {
    const tx = db.transaction('crewLinks', 'readwrite', { durability: 'strict' });
    return inTx(tx, async () => {
      const link = await tx.store.get(studyId);
      if (!link) throw new StorageError('This study is not linked to a crew server.', 'NotFound');
      const next = change(link);
      await tx.store.put(next);
      return next;
    });
  });
}

/**
 * This phone's own events after `afterSeq`, oldest first, at most `limit`: the next push batch. Own
 * events are those recorded under `device`; events that reached the log from a bundle file carry another
 * phone's device id and are that phone's to push.
 */
export async function ownEventsAfter(
  studyId: string,
  device: string,
  afterSeq: number,
  limit: number,
): Promise<ObservationRecord[]> {
  const db = await getDb();
  const tx = db.transaction('observations');
  const out: ObservationRecord[] = [];
  let cursor = await tx.store.index('byStudySeq').openCursor(after(studyId, afterSeq));
  while (cursor && out.length < limit) {
    if (cursor.value.device === device) out.push(cursor.value);
    cursor = await cursor.continue();
  }
  await tx.done;
  return out;
}

/** How many of this phone's own events the server has not acknowledged yet. */
export async function ownWaiting(studyId: string, device: string, afterSeq: number): Promise<number> {
  const db = await getDb();
  const rest = await db.getAllFromIndex('observations', 'byStudySeq', after(studyId, afterSeq));
  return rest.filter((e) => e.device === device).length;
}

/**
 * Stores one pulled page: the events not held yet (by id) and the cursor after them, in one transaction,
 * so a page is either kept whole with its cursor or pulled again. Resolves with how many were new.
 */
export function storePulled(
  studyId: string,
  events: readonly ObservationRecord[],
  cursor: string,
): Promise<number> {
  return withWrite(async (db) => {
    const tx = db.transaction(['crewEvents', 'crewLinks'], 'readwrite', { durability: 'strict' });
    return inTx(tx, async () => {
      const store = tx.objectStore('crewEvents');
      let added = 0;
      for (const e of events) {
        if ((await store.getKey(e.id)) !== undefined) continue;
        await store.add(structuredClone(e));
        added++;
      }
      const links = tx.objectStore('crewLinks');
      const link = await links.get(studyId);
      if (!link) throw new StorageError('This study is not linked to a crew server.', 'NotFound');
      await links.put({ ...link, cursor });
      return added;
    });
  });
}

/** The other phones' events of a study (in no particular order: the crew view orders them). */
export async function listCrewEvents(studyId: string): Promise<ObservationRecord[]> {
  return (await getDb()).getAllFromIndex('crewEvents', 'byStudy', studyId);
}
