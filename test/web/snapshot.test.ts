// The field screen's start from a running snapshot (web/storage/snapshots.ts, web/state/use-study.ts)
// against fake-indexeddb (an in-memory implementation of the W3C Indexed Database API). The reference is
// the study opened from its whole log — the path every other screen uses — so each check compares the
// two; the snapshot must never change what the crew sees or lose an entry: a snapshot that does not match
// the log, or is damaged, is rebuilt from the log. The values are ZARR13 (NIST/SEMATECH e-Handbook heat
// flow meter data, test/fixtures/stats-zarr13.json).
import 'fake-indexeddb/auto';
import { IDBFactory } from 'fake-indexeddb';
import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type { StudySetup } from '../../src/index.ts';
import { loadCore } from '../../web/core-loader.ts';
import { type StudySession, TAIL } from '../../web/state/session.ts';
import { checkOpened, openSession } from '../../web/state/use-study.ts';
import { getDb, resetDbForTests, StorageError } from '../../web/storage/db.ts';
import { addEntry, listObservations, voidEntry } from '../../web/storage/observations.ts';
import { writeSnapshot } from '../../web/storage/snapshots.ts';
import { createStudy } from '../../web/storage/studies.ts';
import zarr13 from '../fixtures/stats-zarr13.json';

const heat = zarr13.values as number[];
const setup: StudySetup = {
  kind: 'measurement',
  unit: 'W/m2K',
  level: 0.95,
  sided: 'two',
  rule: 'standard',
  min: 10,
  target: { kind: 'margin', value: 0.004 },
};
const DEV = 'phone-A';

beforeAll(async () => {
  await loadCore();
});
beforeEach(() => {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
});

async function open(id: string, from: 'log' | 'snapshot'): Promise<StudySession> {
  const o = await openSession(id, from);
  if (o.missing) throw new Error('study missing');
  return o.session;
}

/** A study of `n` entries saved the app's way, and its snapshot written after the last save. */
async function studyWith(n: number): Promise<string> {
  const s = await createStudy({ name: 'Heat flow', setup }, DEV);
  for (const value of heat.slice(0, n)) await addEntry(s.id, { value }, DEV);
  await writeSnapshot((await open(s.id, 'log')).snapshot());
  return s.id;
}

/** What the field screen shows and uses, for comparing two sessions. */
function seen(s: StudySession) {
  return {
    n: s.n,
    assessment: s.assessment,
    series: s.series,
    pace: s.pace.medianMs,
    lastSeq: s.lastSeq,
    logCount: s.logCount,
    lastCounted: s.lastCounted(),
    values: s.countedValues(),
  };
}

async function dump() {
  const db = await getDb();
  return Promise.all(
    (['studies', 'observations', 'exports', 'meta', 'snapshots'] as const).map((st) => db.getAll(st)),
  );
}

describe('start from the running snapshot', () => {
  it('opens from the snapshot (not the log) with exactly what the log gives', async () => {
    const id = await studyWith(120);
    const fromSnap = await open(id, 'snapshot');
    expect(fromSnap.complete).toBe(false);
    expect(fromSnap.records.length).toBe(TAIL);
    expect(seen(fromSnap)).toEqual(seen(await open(id, 'log')));
  });

  it('writes nothing at start', async () => {
    const id = await studyWith(30);
    const before = await dump();
    await open(id, 'snapshot');
    expect(await dump()).toEqual(before);
  });

  it('rebuilds from the log when another tab appended an entry after the snapshot', async () => {
    const id = await studyWith(40);
    await addEntry(id, { value: heat[40] as number }, 'phone-B');
    const s = await open(id, 'snapshot');
    expect(s.complete).toBe(true);
    expect(s.n).toBe(41);
    expect(seen(s)).toEqual(seen(await open(id, 'log')));
  });

  it('rebuilds when the last record differs though the count matches', async () => {
    const id = await studyWith(40);
    const db = await getDb();
    const snap = await db.get('snapshots', id);
    await db.put('snapshots', { ...snap!, lastId: crypto.randomUUID() });
    expect((await open(id, 'snapshot')).complete).toBe(true);
  });

  const damages: [string, (x: Record<string, unknown>) => unknown][] = [
    ['an older format', (x) => ({ ...x, version: 0 })],
    ['running figures cut short', (x) => ({ ...x, running: { ...(x.running as object), values: [1, 2] } })],
    [
      'running figures of another setup',
      (x) => ({ ...x, running: { ...(x.running as object), setup: '{}' } }),
    ],
    ['a pace that is not one', (x) => ({ ...x, pace: { low: 'x' } })],
    ['no records kept', (x) => ({ ...x, tail: 'none' })],
  ];
  it.each(damages)('rebuilds from the log when the snapshot has %s', async (_, damage) => {
    const id = await studyWith(40);
    const db = await getDb();
    const snap = (await db.get('snapshots', id)) as unknown as Record<string, unknown>;
    await db.put('snapshots', damage(snap) as never);
    const s = await open(id, 'snapshot');
    expect(s.complete).toBe(true);
    expect(seen(s)).toEqual(seen(await open(id, 'log')));
  });
});

describe('a cold start: the first frame from the snapshot, the remaining checks right after', () => {
  // openSession(…, true) is the path of a start without the statistics core: the session is drawn once the
  // snapshot's last record matches the log's; checkOpened then compares the log's count and runs the core's
  // check, and false means the screen rebuilds from the log (web/state/use-study.ts)
  it('a sound snapshot passes both checks and shows exactly what the log gives', async () => {
    const id = await studyWith(60);
    const o = await openSession(id, 'snapshot', true);
    if (o.missing) throw new Error('study missing');
    expect(o.session.complete).toBe(false);
    expect(await checkOpened(o.session)).toBe(true);
    expect(seen(o.session)).toEqual(seen(await open(id, 'log')));
  });

  it('a record added before the last one (same last record, one more in the count) fails the count check', async () => {
    const id = await studyWith(40);
    const db = await getDb();
    const extra = {
      id: crypto.randomUUID(),
      studyId: id,
      seq: 0,
      at: '2026-12-01T10:00:00+00:00',
      device: 'phone-B',
      value: heat[40] as number,
    };
    await db.add('observations', extra);
    const o = await openSession(id, 'snapshot', true);
    if (o.missing) throw new Error('study missing');
    expect(await checkOpened(o.session)).toBe(false);
    // the rebuild from the log has it
    expect((await open(id, 'log')).n).toBe(41);
  });

  it('running figures damaged beyond what the first frame reads fail the core’s check', async () => {
    const id = await studyWith(40);
    const db = await getDb();
    const snap = (await db.get('snapshots', id)) as unknown as { running: Record<string, unknown> };
    await db.put('snapshots', {
      ...snap,
      running: { ...snap.running, marks: [[5, 'yes', null, null]] },
    } as never);
    const o = await openSession(id, 'snapshot', true);
    if (o.missing) throw new Error('study missing');
    expect(await checkOpened(o.session)).toBe(false);
  });
});

describe('nothing is lost', () => {
  it('saves, undos past the kept records and voids on a snapshot session reach the log and the next start', async () => {
    const id = await studyWith(60);
    const s = await open(id, 'snapshot');
    // a new entry: one add with the session's seq
    const rec = await addEntry(id, { value: heat[60] as number }, DEV, {
      seq: s.lastSeq + 1,
      lock: !s.locked,
    });
    s.apply(rec);
    // void an entry the snapshot does not keep (entry #3, long before the last 40 records)
    const log = await listObservations(id);
    const v = await voidEntry(id, (log[2] as { id: string }).id, 'wrong plot', DEV);
    s.apply(v);
    const rebuilt = await open(id, 'log');
    expect(seen(s)).toEqual(seen(rebuilt));
    expect(rebuilt.n).toBe(60);
    await writeSnapshot(s.snapshot());
    const next = await open(id, 'snapshot');
    expect(next.complete).toBe(false);
    expect(seen(next)).toEqual(seen(rebuilt));
    expect((await listObservations(id)).length).toBe(62);
  });

  it('undoing every kept entry asks for the whole log (so "undo last" always has the true last entry)', async () => {
    const id = await studyWith(50);
    const s = await open(id, 'snapshot');
    for (let i = 0; i < TAIL && !s.needsLog; i++) {
      const last = s.lastCounted();
      if (!last) break;
      s.apply(await voidEntry(id, last.id, 'undo', DEV));
    }
    expect(s.needsLog).toBe(true);
    expect(s.n).toBe((await open(id, 'log')).n);
  });

  it('a save on a seq another tab took is refused with a ConstraintError and writes nothing', async () => {
    const id = await studyWith(12);
    const s = await open(id, 'snapshot');
    await addEntry(id, { value: 9.3 }, 'phone-B'); // the other tab takes seq 13
    const before = await listObservations(id);
    const err = await addEntry(id, { value: 9.2 }, DEV, { seq: s.lastSeq + 1, lock: false }).catch((e) => e);
    expect(err).toBeInstanceOf(StorageError);
    expect((err as StorageError).code).toBe('ConstraintError');
    expect(await listObservations(id)).toEqual(before);
  });

  it('the first entry locks the study in the same transaction as the add', async () => {
    const st = await createStudy({ name: 'New', setup }, DEV);
    const s = await open(st.id, 'snapshot');
    expect(s.locked).toBe(false);
    await addEntry(st.id, { value: 9.2 }, DEV, { seq: 1, lock: true });
    expect((await (await getDb()).get('studies', st.id))?.lockedAt).toBeDefined();
  });
});
