// The schema upgrade from version 1 to 2 (web/storage/SCHEMA-v2.md) against fake-indexeddb (an in-memory
// implementation of the W3C Indexed Database API): a database written by version 1 — the fixture
// e2e/fixtures/schema-v1.json, built by hand from web/storage/SCHEMA-v1.md — opens with every record, and
// its `byVoids` index is no longer unique. Expected behaviour of a unique index: W3C Indexed Database API
// 3.0, §5.5 "Object store storage operation" step 9 — an add that would give a unique index a second
// record with the same key fails with a ConstraintError (shown first on version 1, so the test can fail).
import 'fake-indexeddb/auto';
import { readFileSync } from 'node:fs';
import { IDBFactory } from 'fake-indexeddb';
import { beforeEach, describe, expect, it } from 'vitest';
import { getDb, resetDbForTests } from '../../web/storage/db.ts';
import { listObservations, voidEntry } from '../../web/storage/observations.ts';
import { DB_NAME, DB_VERSION } from '../../web/storage/schema.ts';

interface Fixture {
  database: string;
  version: number;
  stores: {
    name: string;
    keyPath: string | string[] | null;
    indexes: { name: string; keyPath: string | string[]; unique: boolean }[];
  }[];
  records: {
    studies: { id: string }[];
    observations: { id: string; studyId: string; seq: number; voids?: string; value?: number }[];
    exports: Record<string, unknown>[];
    meta: [string, unknown][];
  };
}

const fx = JSON.parse(
  readFileSync(new URL('../../e2e/fixtures/schema-v1.json', import.meta.url), 'utf8'),
) as Fixture;
const voidRecord = fx.records.observations.find((r) => r.voids !== undefined)!;
const studyId = fx.records.studies[0]!.id;

function request<T>(req: IDBRequest<T>): Promise<T> {
  return new Promise((resolve, reject) => {
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error);
  });
}

/** Writes the version-1 fixture with the raw API (as version 1 of the app left it) and closes it. */
async function writeV1(): Promise<void> {
  const open = indexedDB.open(fx.database, fx.version);
  open.onupgradeneeded = () => {
    for (const s of fx.stores) {
      const store = open.result.createObjectStore(
        s.name,
        s.keyPath === null ? undefined : { keyPath: s.keyPath },
      );
      for (const ix of s.indexes) store.createIndex(ix.name, ix.keyPath, { unique: ix.unique });
    }
  };
  const db = await request(open);
  const tx = db.transaction(['studies', 'observations', 'exports', 'meta'], 'readwrite');
  for (const r of fx.records.studies) tx.objectStore('studies').add(r);
  for (const r of fx.records.observations) tx.objectStore('observations').add(r);
  for (const r of fx.records.exports) tx.objectStore('exports').add(r);
  for (const [k, v] of fx.records.meta) tx.objectStore('meta').put(v, k);
  await new Promise<void>((resolve, reject) => {
    tx.oncomplete = () => resolve();
    tx.onerror = () => reject(tx.error);
  });
  db.close();
}

/** A second void of the entry the fixture's void withdraws, as another phone would record it. */
const secondVoid = {
  id: '5b0e0b1d-0000-4000-8000-000000000002',
  studyId,
  seq: fx.records.observations.length + 1,
  at: '2026-11-30T15:00:00+01:00',
  device: 'phone-B',
  voids: voidRecord.voids,
  reason: 'also withdrawn on the second phone',
};

beforeEach(() => {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
});

describe('schema version 1 → 2', () => {
  it('version 1 refuses a second void of one entry (unique byVoids): the behaviour version 2 removes', async () => {
    await writeV1();
    const db = await request(indexedDB.open(fx.database, fx.version));
    const tx = db.transaction('observations', 'readwrite');
    const add = tx.objectStore('observations').add(secondVoid);
    await expect(request(add)).rejects.toMatchObject({ name: 'ConstraintError' });
    db.close();
  });

  it('opens a version-1 database with every record, byVoids no longer unique, byStudySeq still unique', async () => {
    await writeV1();
    const db = await getDb();
    expect(DB_VERSION).toBe(4);
    expect(db.version).toBe(DB_VERSION);
    const tx = db.transaction('observations');
    expect(tx.store.index('byVoids').unique).toBe(false);
    expect(tx.store.index('byStudySeq').unique).toBe(true);
    await tx.done;
    for (const [store, records] of [
      ['studies', fx.records.studies],
      ['observations', fx.records.observations],
      ['exports', fx.records.exports],
    ] as const)
      expect(await db.getAll(store)).toEqual(
        [...records].sort((a, b) => ((a.id as string) < (b.id as string) ? -1 : 1)),
      );
    for (const [k, v] of fx.records.meta) expect(await db.get('meta', k as 'device')).toEqual(v);
    // the index was rebuilt over the existing void
    expect(await db.getAllKeysFromIndex('observations', 'byVoids', voidRecord.voids)).toEqual([
      voidRecord.id,
    ]);
  });

  it('after the upgrade a second phone’s void of the same entry is stored; this phone still cannot void it again', async () => {
    await writeV1();
    const db = await getDb();
    await db.add('observations', secondVoid);
    expect((await db.getAllKeysFromIndex('observations', 'byVoids', voidRecord.voids)).sort()).toEqual(
      [voidRecord.id, secondVoid.id].sort(),
    );
    await expect(voidEntry(studyId, voidRecord.voids!, 'again', 'phone-A')).rejects.toThrow(
      'that entry was already voided',
    );
    expect(await listObservations(studyId)).toHaveLength(fx.records.observations.length + 1);
  });

  it('a fresh database is created at version 2 with the same non-unique index', async () => {
    const db = await getDb();
    expect(db.version).toBe(DB_VERSION);
    expect(db.transaction('observations').store.index('byVoids').unique).toBe(false);
  });
});

// public/warm-db.js opens the database before the app's script runs (a cold start's longest wait) and must
// change nothing. W3C Indexed Database API 3.0, §5.8 "Aborting an upgrade transaction": the database's
// version reverts to its previous version, and a database created by that open is deleted.
describe('the start-up warm-up of the database (public/warm-db.js)', () => {
  const script = readFileSync(new URL('../../public/warm-db.js', import.meta.url), 'utf8');
  /** Runs the script and waits until its open has ended (opened and closed, or aborted). */
  async function warm(): Promise<void> {
    new Function(script)();
    // the script's own request is not reachable: wait until no open is pending (a blocked open would hang)
    for (let i = 0; i < 50; i++) await new Promise((r) => setTimeout(r, 5));
  }

  it('opens the app’s own database name and version', () => {
    expect(script).toContain(`indexedDB.open('${DB_NAME}', ${DB_VERSION})`);
  });
  it('creates nothing on a phone without the database', async () => {
    await warm();
    expect(await indexedDB.databases()).toEqual([]);
  });
  it('leaves an older database as it was; the app’s own open then upgrades it with every record', async () => {
    await writeV1();
    await warm();
    expect(await indexedDB.databases()).toEqual([{ name: fx.database, version: fx.version }]);
    const db = await getDb();
    expect(db.version).toBe(DB_VERSION);
    expect((await listObservations(studyId)).length).toBe(fx.records.observations.length);
  });
  it('at the current version it opens and closes again: the app’s open is not blocked', async () => {
    (await getDb()).close();
    resetDbForTests();
    await warm();
    const db = await getDb();
    expect(db.version).toBe(DB_VERSION);
  });
});
