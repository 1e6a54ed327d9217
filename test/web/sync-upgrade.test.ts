// The schema upgrade from version 3 to 4 (web/storage/SCHEMA-v4.md) against fake-indexeddb (an in-memory
// implementation of the W3C Indexed Database API): a database written in version 3's documented shape
// (web/storage/SCHEMA-v3.md; the records of e2e/fixtures/schema-v1.json, which version 3 kept unchanged,
// plus a snapshot) opens at version 4 with every record as it was, and the two new stores empty.
import 'fake-indexeddb/auto';
import { readFileSync } from 'node:fs';
import { IDBFactory } from 'fake-indexeddb';
import { beforeEach, expect, it } from 'vitest';
import { getDb, resetDbForTests } from '../../web/storage/db.ts';

interface Fixture {
  database: string;
  records: {
    studies: { id: string }[];
    observations: { id: string; studyId: string }[];
    exports: { id: string }[];
    meta: [string, unknown][];
  };
}
const fx = JSON.parse(
  readFileSync(new URL('../../e2e/fixtures/schema-v1.json', import.meta.url), 'utf8'),
) as Fixture;
const snapshot = {
  studyId: fx.records.studies[0]!.id,
  version: 1,
  count: 1,
  lastId: null,
  running: {},
  pace: {},
  tail: [],
};

function request<T>(req: IDBRequest<T>): Promise<T> {
  return new Promise((resolve, reject) => {
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error);
  });
}

/** Version 3 as SCHEMA-v3.md describes it, written with the raw API. */
async function writeV3(): Promise<void> {
  const open = indexedDB.open(fx.database, 3);
  open.onupgradeneeded = () => {
    const db = open.result;
    db.createObjectStore('studies', { keyPath: 'id' }).createIndex('byCreatedAt', 'createdAt');
    const obs = db.createObjectStore('observations', { keyPath: 'id' });
    obs.createIndex('byStudySeq', ['studyId', 'seq'], { unique: true });
    obs.createIndex('byVoids', 'voids', { unique: false });
    db.createObjectStore('exports', { keyPath: 'id' }).createIndex('byStudy', 'studyId');
    db.createObjectStore('meta');
    db.createObjectStore('snapshots', { keyPath: 'studyId' });
  };
  const db = await request(open);
  const tx = db.transaction(['studies', 'observations', 'exports', 'meta', 'snapshots'], 'readwrite');
  for (const r of fx.records.studies) tx.objectStore('studies').add(r);
  for (const r of fx.records.observations) tx.objectStore('observations').add(r);
  for (const r of fx.records.exports) tx.objectStore('exports').add(r);
  for (const [k, v] of fx.records.meta) tx.objectStore('meta').put(v, k);
  tx.objectStore('snapshots').add(snapshot);
  await new Promise<void>((resolve, reject) => {
    tx.oncomplete = () => resolve();
    tx.onerror = () => reject(tx.error);
  });
  db.close();
}

beforeEach(() => {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
});

const byId = <T extends { id: string }>(rs: T[]) => [...rs].sort((a, b) => (a.id < b.id ? -1 : 1));

it('a version-3 database opens at version 4 with every record; crewLinks and crewEvents are new and empty', async () => {
  await writeV3();
  const db = await getDb();
  expect(db.version).toBe(4);
  expect(await db.getAll('studies')).toEqual(byId(fx.records.studies));
  expect(await db.getAll('observations')).toEqual(byId(fx.records.observations));
  expect(await db.getAll('exports')).toEqual(byId(fx.records.exports));
  for (const [k, v] of fx.records.meta) expect(await db.get('meta', k as 'device')).toEqual(v);
  expect(await db.getAll('snapshots')).toEqual([snapshot]);
  expect(await db.getAll('crewLinks')).toEqual([]);
  expect(await db.getAll('crewEvents')).toEqual([]);
  expect([...db.transaction('crewEvents').store.indexNames]).toEqual(['byStudy']);
});
