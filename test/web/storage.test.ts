// Storage against fake-indexeddb (an in-memory implementation of the W3C IndexedDB API): append-only
// log, voids and corrections, strict durability, and a failed write that leaves nothing behind.
import 'fake-indexeddb/auto';
import { IDBFactory } from 'fake-indexeddb';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { StudySetup } from '../../src/index.ts';
import { resetDbForTests, StorageError } from '../../web/storage/db.ts';
import { exportedUpTo, recordExport } from '../../web/storage/exports.ts';
import { deviceId, ensurePersistence } from '../../web/storage/meta.ts';
import {
  addEntry,
  correctEntry,
  countObservations,
  listObservations,
  voidEntry,
} from '../../web/storage/observations.ts';
import { createStudy, getStudy, listStudies, setArchived } from '../../web/storage/studies.ts';

const setup: StudySetup = {
  kind: 'measurement',
  unit: 'mg/L',
  level: 0.95,
  sided: 'two',
  rule: 'standard',
  min: 10,
  target: { kind: 'margin', value: 0.5 },
};
const DEV = 'device-test';
/** RFC 3339 date-time with a numeric UTC offset (never a bare "Z"-less local time). */
const ISO_WITH_OFFSET = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}[+-]\d{2}:\d{2}$/;
const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;

beforeEach(() => {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
});
afterEach(() => {
  vi.restoreAllMocks();
});

describe('studies', () => {
  it('creates, lists, links a changed setup to the old one, archives without deleting', async () => {
    const a = await createStudy({ name: 'Site A', setup }, DEV);
    expect(a.id).toMatch(UUID);
    expect(a.createdAt).toMatch(ISO_WITH_OFFSET);
    expect(a.version).toBe(1);
    const b = await createStudy({ name: 'Site A', setup, supersedes: a.id }, DEV);
    expect(b.version).toBe(2);
    expect(b.supersedes).toBe(a.id);
    await setArchived(a.id, true);
    const all = await listStudies();
    expect(all.map((s) => s.id).sort()).toEqual([a.id, b.id].sort());
    expect((await getStudy(a.id))?.archivedAt).toMatch(ISO_WITH_OFFSET);
    expect((await getStudy(a.id))?.setup).toEqual(setup);
  });

  it('locks the setup when the first observation is saved', async () => {
    const s = await createStudy({ name: 'Site', setup }, DEV);
    expect((await getStudy(s.id))?.lockedAt).toBeUndefined();
    await addEntry(s.id, { value: 1.5 }, DEV);
    expect((await getStudy(s.id))?.lockedAt).toMatch(ISO_WITH_OFFSET);
  });
});

describe('observations: append-only', () => {
  it('numbers entries 1, 2, 3 per study with UUIDs, offset times and the device', async () => {
    const s = await createStudy({ name: 'S', setup }, DEV);
    const other = await createStudy({ name: 'T', setup }, DEV);
    await addEntry(other.id, { value: 9 }, DEV);
    const recs = [];
    for (const v of [1.25, 2.5, 3.75]) recs.push(await addEntry(s.id, { value: v, note: `v${v}` }, DEV));
    expect(recs.map((r) => r.seq)).toEqual([1, 2, 3]);
    for (const r of recs) {
      expect(r.id).toMatch(UUID);
      expect(r.at).toMatch(ISO_WITH_OFFSET);
      expect(r.device).toBe(DEV);
    }
    const listed = await listObservations(s.id);
    expect(listed).toEqual(recs);
    expect(await countObservations(s.id)).toEqual({ count: 3, lastSeq: 3 });
  });

  it('undo is a void record; the original stays byte-for-byte; a second void of it is refused', async () => {
    const s = await createStudy({ name: 'S', setup }, DEV);
    const e1 = await addEntry(s.id, { value: 4 }, DEV);
    const e2 = await addEntry(s.id, { value: 5, position: { lat: 46.1, lon: 7.2, accuracyM: 8 } }, DEV);
    const v = await voidEntry(s.id, e2.id, 'wrong key', DEV);
    expect(v).toMatchObject({ seq: 3, voids: e2.id, reason: 'wrong key', studyId: s.id });
    expect(v.value).toBeUndefined();
    const log = await listObservations(s.id);
    expect(log).toEqual([e1, e2, v]);
    await expect(voidEntry(s.id, e2.id, 'again', DEV)).rejects.toMatchObject({ code: 'AlreadyVoided' });
    await expect(voidEntry(s.id, v.id, 'void a void', DEV)).rejects.toMatchObject({ code: 'NotFound' });
    expect(await listObservations(s.id)).toHaveLength(3);
  });

  it('correct = void + new entry in one transaction, original kept', async () => {
    const s = await createStudy({ name: 'S', setup }, DEV);
    const e1 = await addEntry(s.id, { value: 12.5, note: 'near the gate' }, DEV);
    const [v, e] = await correctEntry(
      s.id,
      e1.id,
      'wrong digit',
      { value: 1.25, note: 'near the gate' },
      DEV,
    );
    expect(v).toMatchObject({ seq: 2, voids: e1.id, reason: 'wrong digit' });
    expect(e).toMatchObject({ seq: 3, value: 1.25, note: 'near the gate', corrects: e1.id });
    expect(await listObservations(s.id)).toEqual([e1, v, e]);
  });

  it('never calls put, delete or clear on the observations store', async () => {
    const proto = globalThis.IDBObjectStore.prototype;
    const put = vi.spyOn(proto, 'put');
    const del = vi.spyOn(proto, 'delete');
    const clear = vi.spyOn(proto, 'clear');
    const s = await createStudy({ name: 'S', setup }, DEV);
    const e1 = await addEntry(s.id, { value: 1 }, DEV);
    await addEntry(s.id, { value: 2 }, DEV);
    await voidEntry(s.id, e1.id, 'r', DEV);
    await correctEntry(s.id, (await addEntry(s.id, { value: 3 }, DEV)).id, 'r', { value: 4 }, DEV);
    const storesPut = put.mock.contexts.map((c) => (c as IDBObjectStore).name);
    expect(storesPut.every((n) => n !== 'observations')).toBe(true);
    expect(del).not.toHaveBeenCalled();
    expect(clear).not.toHaveBeenCalled();
  });

  it('opens every write transaction with durability "strict"', async () => {
    const spy = vi.spyOn(globalThis.IDBDatabase.prototype, 'transaction');
    const s = await createStudy({ name: 'S', setup }, DEV);
    const e = await addEntry(s.id, { value: 1 }, DEV);
    await voidEntry(s.id, e.id, 'r', DEV);
    await correctEntry(s.id, (await addEntry(s.id, { value: 2 }, DEV)).id, 'r', { value: 3 }, DEV);
    await setArchived(s.id, true);
    await recordExport(s.id, 3, 'csv');
    const writes = spy.mock.calls.filter((c) => c[1] === 'readwrite');
    expect(writes.length).toBeGreaterThanOrEqual(6);
    for (const c of writes) expect(c[2]).toEqual({ durability: 'strict' });
  });

  it('a write that fails with QuotaExceededError rejects with a clear message and leaves nothing behind', async () => {
    const s = await createStudy({ name: 'S', setup }, DEV);
    await addEntry(s.id, { value: 1 }, DEV);
    const before = await getStudy(s.id);
    vi.spyOn(globalThis.IDBObjectStore.prototype, 'add').mockImplementation(() => {
      throw new DOMException('The quota has been exceeded.', 'QuotaExceededError');
    });
    const err = await addEntry(s.id, { value: 2 }, DEV).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(StorageError);
    expect((err as StorageError).code).toBe('QuotaExceededError');
    expect((err as StorageError).message).toMatch(/^Not saved: .*no storage space/);
    vi.restoreAllMocks();
    expect(await listObservations(s.id)).toHaveLength(1);
    expect(await getStudy(s.id)).toEqual(before);
  });

  it('an archived study refuses new entries', async () => {
    const s = await createStudy({ name: 'S', setup }, DEV);
    await setArchived(s.id, true);
    await expect(addEntry(s.id, { value: 1 }, DEV)).rejects.toMatchObject({ code: 'Archived' });
  });
});

describe('meta and exports', () => {
  it('keeps one device id, records the persistence answer, tracks the exported seq', async () => {
    const id = await deviceId();
    expect(id).toMatch(UUID);
    expect(await deviceId()).toBe(id);
    const p = await ensurePersistence();
    expect(p.firstRun).toBe(true);
    expect(['granted', 'refused', 'unsupported']).toContain(p.answer);
    expect((await ensurePersistence()).firstRun).toBe(false);
    const s = await createStudy({ name: 'S', setup }, DEV);
    expect(await exportedUpTo(s.id)).toBe(0);
    await recordExport(s.id, 4, 'csv');
    await recordExport(s.id, 2, 'csv');
    expect(await exportedUpTo(s.id)).toBe(4);
  });
});
