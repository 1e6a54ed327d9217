/**
 * The append-only observation log. Every write is one `durability: 'strict'` transaction and resolves
 * only after it has committed (`await tx.done`) — the only moment the app may say "saved". Nothing here
 * puts over or deletes a record: undo and correct are void events that name the entry they withdraw.
 */
import type { ObservationRecord, Position } from '../core.ts';
import { type DB, getDb, inTx, StorageError, withWrite } from './db.ts';
import { logWritten } from './log-events.ts';
import { isoWithOffset } from './time.ts';

export interface NewEntry {
  value: number;
  censored?: boolean;
  stratum?: string;
  cluster?: string;
  position?: Position;
  note?: string;
  label?: string;
}

function studyRange(studyId: string): IDBKeyRange {
  return IDBKeyRange.bound([studyId, 0], [studyId, Number.POSITIVE_INFINITY]);
}

type WriteTx = ReturnType<typeof openWrite>;

async function nextSeq(tx: WriteTx, studyId: string): Promise<number> {
  const cursor = await tx
    .objectStore('observations')
    .index('byStudySeq')
    .openCursor(studyRange(studyId), 'prev');
  return (cursor?.value.seq ?? 0) + 1;
}

function openWrite(db: DB) {
  return db.transaction(['observations', 'studies'], 'readwrite', { durability: 'strict' });
}

/** The tap path's transaction: the log only (the study is already locked). */
function openAdd(db: DB) {
  return db.transaction(['observations'], 'readwrite', { durability: 'strict' });
}

function clean(entry: NewEntry): Omit<ObservationRecord, 'id' | 'studyId' | 'seq' | 'at' | 'device'> {
  const out: Omit<ObservationRecord, 'id' | 'studyId' | 'seq' | 'at' | 'device'> = { value: entry.value };
  if (entry.censored) out.censored = true;
  if (entry.stratum) out.stratum = entry.stratum;
  if (entry.cluster) out.cluster = entry.cluster;
  if (entry.position) out.position = { ...entry.position };
  if (entry.note) out.note = entry.note;
  if (entry.label) out.label = entry.label;
  return out;
}

async function lockStudy(tx: WriteTx, studyId: string, at: string): Promise<void> {
  const store = tx.objectStore('studies');
  const study = await store.get(studyId);
  if (!study) throw new StorageError('Not saved: this study no longer exists on this phone.', 'NotFound');
  if (study.archivedAt) throw new StorageError('Not saved: this study is archived.', 'Archived');
  if (!study.lockedAt) await store.put({ ...study, lockedAt: at });
}

/**
 * Where the next entry goes, as the open session knows it: its seq (the log's last seq + 1) and whether
 * the study still has to be locked (its first entry). With it, saving is one `add()`.
 */
export interface NextSlot {
  seq: number;
  lock: boolean;
}

/**
 * Appends one entry; resolves with the stored record once the transaction has committed. With `slot`
 * (the tap path) the write is a single `add()` — plus the study's lock on its first entry — and the
 * unique [studyId, seq] index is what guards it: if another tab took that seq meanwhile, the add fails
 * with a ConstraintError (StorageError code 'ConstraintError') and nothing is written; the caller reloads
 * the log and tries once more. Without `slot` the seq is read from the log in the same transaction.
 */
export function addEntry(
  studyId: string,
  entry: NewEntry,
  device: string,
  slot?: NextSlot,
): Promise<ObservationRecord> {
  return withWrite(async (db) => {
    const tx = slot && !slot.lock ? openAdd(db) : openWrite(db);
    return inTx(tx, async () => {
      const at = isoWithOffset();
      const seq = slot ? slot.seq : await nextSeq(tx as WriteTx, studyId);
      const rec: ObservationRecord = { id: crypto.randomUUID(), studyId, seq, at, device, ...clean(entry) };
      const added = tx.objectStore('observations').add(rec);
      // when the lock below refuses, the abort rejects the add as well: that rejection is expected
      added.catch(() => undefined);
      if (!slot || slot.lock) {
        try {
          await lockStudy(tx as WriteTx, studyId, at);
        } catch (err) {
          // a refused add (another tab took this seq: ConstraintError) aborts the transaction, and the
          // lock's request then fails with AbortError: report the add's own error, which the caller retries
          throw await added.then(
            () => err,
            (addErr: unknown) => addErr,
          );
        }
      }
      await added;
      return rec;
    });
  }).then(told(studyId));
}

/** Tells the log's listeners (log-events.ts) once the write committed, and passes its result on. */
function told<T>(studyId: string): (out: T) => T {
  return (out) => {
    logWritten(studyId);
    return out;
  };
}

async function checkVoidable(tx: WriteTx, studyId: string, targetId: string): Promise<void> {
  const store = tx.objectStore('observations');
  const target = await store.get(targetId);
  if (!target || target.studyId !== studyId || target.value === undefined) {
    throw new StorageError('Not saved: that entry is not in this study.', 'NotFound');
  }
  // From schema version 2 the byVoids index is not unique (two phones' voids of one entry are both kept
  // on import), so this check is what stops this phone voiding an entry twice. It runs in the same
  // readwrite transaction as the add, and IndexedDB runs readwrite transactions on a store one at a time,
  // so a second tab cannot slip a void in between.
  if ((await store.index('byVoids').getKey(targetId)) !== undefined) {
    throw new StorageError('Not saved: that entry was already voided.', 'AlreadyVoided');
  }
}

/** Withdraws an entry: appends a void event with its reason. The entry itself stays untouched. */
export function voidEntry(
  studyId: string,
  targetId: string,
  reason: string,
  device: string,
): Promise<ObservationRecord> {
  return withWrite(async (db) => {
    const tx = openWrite(db);
    return inTx(tx, async () => {
      await checkVoidable(tx, studyId, targetId);
      const seq = await nextSeq(tx, studyId);
      const rec: ObservationRecord = {
        id: crypto.randomUUID(),
        studyId,
        seq,
        at: isoWithOffset(),
        device,
        voids: targetId,
        reason,
      };
      await tx.objectStore('observations').add(rec);
      return rec;
    });
  }).then(told(studyId));
}

/** Correct = void the old entry (with the reason) + append the new value, in one atomic transaction. */
export function correctEntry(
  studyId: string,
  targetId: string,
  reason: string,
  entry: NewEntry,
  device: string,
): Promise<[ObservationRecord, ObservationRecord]> {
  return withWrite(async (db) => {
    const tx = openWrite(db);
    return inTx(tx, async (): Promise<[ObservationRecord, ObservationRecord]> => {
      await checkVoidable(tx, studyId, targetId);
      const seq = await nextSeq(tx, studyId);
      const at = isoWithOffset();
      const v: ObservationRecord = {
        id: crypto.randomUUID(),
        studyId,
        seq,
        at,
        device,
        voids: targetId,
        reason,
      };
      const e: ObservationRecord = {
        id: crypto.randomUUID(),
        studyId,
        seq: seq + 1,
        at,
        device,
        ...clean(entry),
        corrects: targetId,
      };
      const store = tx.objectStore('observations');
      await store.add(v);
      await store.add(e);
      return [v, e];
    });
  }).then(told(studyId));
}

/** The study's whole log (entries and voids) in seq order. */
export async function listObservations(studyId: string): Promise<ObservationRecord[]> {
  const db = await getDb();
  return db.getAllFromIndex('observations', 'byStudySeq', studyRange(studyId));
}

/** How many records (entries and voids) the study has, and the last seq. */
export async function countObservations(studyId: string): Promise<{ count: number; lastSeq: number }> {
  const db = await getDb();
  const tx = db.transaction('observations');
  const idx = tx.store.index('byStudySeq');
  const count = await idx.count(studyRange(studyId));
  const last = await idx.openCursor(studyRange(studyId), 'prev');
  return { count, lastSeq: last?.value.seq ?? 0 };
}

/**
 * Demo only: appends invented entries with invented, evenly spaced times ending now, in one transaction.
 * The study is marked `demo` and every screen labels it as invented.
 */
export function appendDemoEntries(
  studyId: string,
  values: readonly number[],
  gapMs: number,
  device: string,
): Promise<void> {
  return withWrite(async (db) => {
    const tx = openWrite(db);
    await inTx(tx, async () => {
      const start = Date.now() - gapMs * values.length;
      let seq = await nextSeq(tx, studyId);
      await lockStudy(tx, studyId, isoWithOffset());
      const store = tx.objectStore('observations');
      for (const [i, value] of values.entries()) {
        const at = isoWithOffset(new Date(start + gapMs * i));
        await store.add({ id: crypto.randomUUID(), studyId, seq: seq++, at, device, value });
      }
    });
  }).then(told(studyId));
}
