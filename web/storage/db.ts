/**
 * Opening the database: cumulative `if (oldVersion < N)` upgrade steps (SCHEMA-v1.md, SCHEMA-v2.md,
 * SCHEMA-v3.md, SCHEMA-v4.md), and
 * the two connection hazards
 * a field phone meets — another tab upgrading the schema (`blocking`: we close and ask for a reload) and
 * the browser dropping the connection (`terminated`: the next call reopens).
 */
import { type IDBPDatabase, type IDBPTransaction, openDB, type StoreNames } from 'idb';
import { DB_NAME, DB_VERSION, type SureEnoughDB } from './schema.ts';

export type DB = IDBPDatabase<SureEnoughDB>;
export type ConnectionEvent = 'blocked' | 'blocking' | 'terminated';

let dbPromise: Promise<DB> | undefined;
/** Set once another tab needs a newer schema: this page must reload before it writes again. */
let closedForUpgrade = false;
const listeners = new Set<(e: ConnectionEvent) => void>();

export function onConnectionEvent(fn: (e: ConnectionEvent) => void): () => void {
  listeners.add(fn);
  return () => listeners.delete(fn);
}
function emit(e: ConnectionEvent): void {
  for (const fn of listeners) fn(e);
}

export class StorageError extends Error {
  constructor(
    message: string,
    readonly code: string,
  ) {
    super(message);
    this.name = 'StorageError';
  }
}

export function upgradeSteps(
  db: IDBPDatabase<SureEnoughDB>,
  oldVersion: number,
  tx: IDBPTransaction<SureEnoughDB, StoreNames<SureEnoughDB>[], 'versionchange'>,
): void {
  if (oldVersion < 1) {
    const studies = db.createObjectStore('studies', { keyPath: 'id' });
    studies.createIndex('byCreatedAt', 'createdAt');
    const obs = db.createObjectStore('observations', { keyPath: 'id' });
    obs.createIndex('byStudySeq', ['studyId', 'seq'], { unique: true });
    obs.createIndex('byVoids', 'voids', { unique: true });
    const exp = db.createObjectStore('exports', { keyPath: 'id' });
    exp.createIndex('byStudy', 'studyId');
    db.createObjectStore('meta');
  }
  if (oldVersion < 2) {
    // Two phones may each void the same entry; pooling keeps both voids (src/bundle/pool.ts), which a
    // unique index refused. The phone's own void path still refuses a second void (observations.ts).
    const obs = tx.objectStore('observations');
    obs.deleteIndex('byVoids');
    obs.createIndex('byVoids', 'voids', { unique: false });
  }
  if (oldVersion < 3) {
    // The field screen opens from a running snapshot instead of reassessing the whole log (snapshots.ts).
    // Nothing existing is touched; a study without a snapshot is rebuilt from its log, as before.
    db.createObjectStore('snapshots', { keyPath: 'studyId' });
  }
  if (oldVersion < 4) {
    // Syncing with a crew server (web/sync): how each shared study is linked, and the other phones'
    // events apart from this phone's own log. Nothing existing is touched.
    db.createObjectStore('crewLinks', { keyPath: 'studyId' });
    db.createObjectStore('crewEvents', { keyPath: 'id' }).createIndex('byStudy', 'studyId');
  }
}

export function getDb(): Promise<DB> {
  if (closedForUpgrade) {
    return Promise.reject(
      new StorageError(
        'A newer version of Sure Enough is open in another tab. Reload this page.',
        'blocking',
      ),
    );
  }
  if (!dbPromise) {
    const p = openDB<SureEnoughDB>(DB_NAME, DB_VERSION, {
      upgrade: (db, oldVersion, _newVersion, tx) => upgradeSteps(db, oldVersion, tx),
      blocked: () => emit('blocked'),
      blocking: () => {
        closedForUpgrade = true;
        void p.then((db) => db.close());
        dbPromise = undefined;
        emit('blocking');
      },
      terminated: () => {
        dbPromise = undefined;
        emit('terminated');
      },
    });
    dbPromise = p;
    p.catch(() => {
      if (dbPromise === p) dbPromise = undefined;
    });
  }
  return dbPromise;
}

/** For tests: forget the connection (after swapping the IndexedDB factory). */
export function resetDbForTests(): void {
  void dbPromise?.then((db) => db.close());
  dbPromise = undefined;
  closedForUpgrade = false;
}

/** Turns any failed write into a message a crew member can act on. Check by name (browsers differ). */
export function describeWriteError(err: unknown): StorageError {
  if (err instanceof StorageError) return err;
  const name = (err as { name?: string } | null)?.name ?? '';
  if (name === 'QuotaExceededError') {
    return new StorageError(
      'Not saved: the phone has no storage space left for this app. Free some space (or export and archive old studies), then save again.',
      name,
    );
  }
  if (name === 'ConstraintError') {
    return new StorageError('Not saved: another entry was saved at the same moment. Save again.', name);
  }
  return new StorageError(
    `Not saved: the phone's storage refused the write (${name || 'unknown error'}). Save again; if it keeps failing, reload the app.`,
    name || 'unknown',
  );
}

/**
 * Runs the body of a write transaction; if the body throws, aborts the transaction so that nothing of
 * it is committed (a half-done write must never reach the disk), then rethrows.
 */
export async function inTx<T>(
  tx: { abort(): void; done: Promise<void> },
  body: () => Promise<T>,
): Promise<T> {
  try {
    const out = await body();
    await tx.done;
    return out;
  } catch (err) {
    try {
      tx.abort();
    } catch {
      /* already finished */
    }
    tx.done.catch(() => undefined);
    throw err;
  }
}

/**
 * Runs a write once; if the connection was dropped (closed / terminated), reopens and tries once more.
 * Resolves only after the transaction has committed.
 */
export async function withWrite<T>(fn: (db: DB) => Promise<T>): Promise<T> {
  try {
    return await fn(await getDb());
  } catch (err) {
    const name = (err as { name?: string } | null)?.name;
    if (name === 'InvalidStateError' && !closedForUpgrade) {
      dbPromise = undefined;
      try {
        return await fn(await getDb());
      } catch (err2) {
        throw describeWriteError(err2);
      }
    }
    throw describeWriteError(err);
  }
}
