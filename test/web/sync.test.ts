/**
 * The phone's sync client (web/sync) against fake-indexeddb (an in-memory W3C IndexedDB) and an in-memory
 * crew server that follows src/sync/protocol.ts (test/web/sync-fake-server.ts). What is checked:
 * - pushes: only this phone's own events, oldest first, in batches of at most MAX_BATCH_EVENTS; what the
 *   server acknowledged is remembered, what it did not is sent again; a repeat is counted once
 *   (protocol.ts: the event id is the key);
 * - failures: retry after exponential backoff with equal jitter (Brooker, "Exponential Backoff And
 *   Jitter", AWS Architecture Blog, 2015: half the capped delay plus a random share of the other half),
 *   never sooner than Retry-After (RFC 9110 §10.2.3); a 409 or 400 stops syncing with the reason shown;
 * - pulls: pages after the server's cursor, the other phones' events apart from the own log;
 * - the crew view over the pooled events gives the published interval of the pooled data.
 */
import 'fake-indexeddb/auto';
import { IDBFactory } from 'fake-indexeddb';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { crewView, MAX_BATCH_EVENTS, type ObservationRecord, type StudySetup } from '../../src/index.ts';
import { syncLine } from '../../src/words/crew.ts';
import { getLink, listCrewEvents } from '../../web/storage/crew.ts';
import { resetDbForTests } from '../../web/storage/db.ts';
import { deviceId } from '../../web/storage/meta.ts';
import { addEntry, appendDemoEntries, listObservations } from '../../web/storage/observations.ts';
import { createStudy, getStudy } from '../../web/storage/studies.ts';
import { joinCrew, shareStudy } from '../../web/sync/crew-actions.ts';
import { deps, setSyncDeps } from '../../web/sync/deps.ts';
import { BACKOFF_CAP_MS, resetSyncForTests, resumeSync, syncStudy } from '../../web/sync/engine.ts';
import { syncStatus } from '../../web/sync/status.ts';
import { crewViewOf } from '../../web/sync/view.ts';
import zarr13 from '../fixtures/stats-zarr13.json';
import { FakeCrewServer } from './sync-fake-server.ts';

const setup: StudySetup = {
  kind: 'measurement',
  unit: 'W/m2',
  level: 0.95,
  sided: 'two',
  // the naive rule reports the plain interval at the chosen level, as the e-Handbook computes it
  rule: 'naive',
  min: 3,
  target: { kind: 'margin', value: 0.0001 },
};

const original = { ...deps };
let server: FakeCrewServer;
/** Retry timers the engine asked for: [delay, run]. */
let timers: { ms: number; run: () => void }[];

beforeEach(() => {
  resetDbForTests();
  resetSyncForTests();
  globalThis.indexedDB = new IDBFactory();
  server = new FakeCrewServer();
  timers = [];
  setSyncDeps({
    fetch: server.fetch,
    random: () => 1,
    setTimer: (run, ms) => {
      const t = { ms, run };
      timers.push(t);
      return t;
    },
    clearTimer: (t) => {
      timers = timers.filter((x) => x !== t);
    },
  });
});
afterEach(() => {
  resetSyncForTests();
  setSyncDeps(original);
});

/** A study of this phone with `n` entries of its own, shared and synced once; the server's log cleared. */
async function sharedStudy(n: number, values: (i: number) => number = (i) => 9 + i / 1000) {
  const s = await createStudy({ name: 'Heat flow', setup }, 'creator');
  const me = await deviceId();
  if (n > 0)
    await appendDemoEntries(
      s.id,
      Array.from({ length: n }, (_, i) => values(i)),
      1000,
      me,
    );
  const shared = await shareStudy(s.id);
  expect(shared.ok).toBe(true);
  // sharing starts a sync of its own: let it finish before the test counts requests
  await syncStudy(s.id, 'manual');
  server.log = [];
  return { id: s.id, me };
}

/** `k` new entries of this phone, not pushed yet. */
async function record(id: string, me: string, k: number): Promise<void> {
  await appendDemoEntries(
    id,
    Array.from({ length: k }, (_, i) => 9.2 + i / 100),
    1000,
    me,
  );
}

const pushes = () => server.log.filter((r) => r.method === 'POST' && r.path.endsWith('/events'));

describe('sharing', () => {
  it('a share whose answer was cut asks again with the same share key (the server can tell it is a retry)', async () => {
    const s = await createStudy({ name: 'Heat flow', setup }, 'creator');
    const keys: unknown[] = [];
    const fetchOf = server.fetch;
    setSyncDeps({
      fetch: (url, init) => {
        if (String(url).endsWith('/studies') && init?.method === 'POST')
          keys.push((JSON.parse(String(init.body)) as { shareKey: unknown }).shareKey);
        return fetchOf(url, init);
      },
    });
    server.faults.push({ kind: 'cut' });
    const first = await shareStudy(s.id);
    expect(first.ok).toBe(false);
    const second = await shareStudy(s.id);
    expect(second.ok).toBe(true);
    expect(keys).toHaveLength(2);
    expect(keys[0]).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(keys[1]).toBe(keys[0]);
  });
});

describe('push', () => {
  it('sends only its own events, oldest first, in batches of at most MAX_BATCH_EVENTS, and remembers the acknowledged seq', async () => {
    const s = await createStudy({ name: 'Heat flow', setup }, 'creator');
    const me = await deviceId();
    await appendDemoEntries(
      s.id,
      Array.from({ length: 450 }, (_, i) => 9 + i / 1000),
      1000,
      me,
    );
    // an entry that came from another phone's bundle is that phone's to push
    await addEntry(s.id, { value: 9.3 }, 'phone-from-a-bundle');
    await shareStudy(s.id);
    await syncStudy(s.id, 'manual');
    // sharing started the sync: one round pushed everything, in order
    expect(pushes().map((r) => r.events)).toEqual([MAX_BATCH_EVENTS, MAX_BATCH_EVENTS, 50]);
    expect(server.events).toHaveLength(450);
    expect(server.events.every((e) => e.device === me)).toBe(true);
    expect(server.events.map((e) => e.seq)).toEqual(Array.from({ length: 450 }, (_, i) => i + 1));
    expect((await getLink(s.id))?.pushedSeq).toBe(450);
    expect(syncStatus.get()[s.id]).toMatchObject({ waiting: 0, offline: false });
    expect(syncLine(syncStatus.get()[s.id]!)).toMatch(/^synced · last sync \d\d:\d\d$/);
    // nothing new: the next sync pushes nothing
    await syncStudy(s.id, 'manual');
    expect(pushes()).toHaveLength(3);
  });

  it('an answer lost mid-response: the batch is sent again and counted once', async () => {
    const { id, me } = await sharedStudy(0);
    await record(id, me, 5);
    server.faults.push({ kind: 'cut' });
    await syncStudy(id, 'manual');
    expect(server.events).toHaveLength(5); // the server stored it
    expect((await getLink(id))?.pushedSeq).toBe(0); // the phone never heard so
    expect(syncStatus.get()[id]).toMatchObject({ waiting: 5, offline: true });
    expect(timers).toHaveLength(1);
    timers.shift()!.run();
    await syncStudy(id, 'manual');
    expect(pushes().map((r) => r.events)).toEqual([5, 5]);
    expect(server.events).toHaveLength(5);
    expect((await getLink(id))?.pushedSeq).toBe(5);
  });

  it('the phone killed while a push waits: after a restart the unacknowledged events are sent again, stored once', async () => {
    const { id, me } = await sharedStudy(0);
    await record(id, me, 3);
    server.faults.push({ kind: 'hang' });
    void syncStudy(id, 'manual');
    await new Promise((r) => setTimeout(r, 50));
    expect(pushes()).toHaveLength(1);
    // the app is killed: memory is gone, the database stays
    resetSyncForTests();
    resetDbForTests();
    expect((await getLink(id))?.pushedSeq).toBe(0);
    await syncStudy(id, 'open');
    expect(pushes().map((r) => r.events)).toEqual([3, 3]);
    expect(server.events).toHaveLength(3);
    expect((await getLink(id))?.pushedSeq).toBe(3);
  });
});

describe('failures', () => {
  it('no connection: retries after 2 s, 4 s, 8 s … up to 5 min (random = 1: the whole delay)', async () => {
    const { id, me } = await sharedStudy(0);
    await record(id, me, 2);
    const delays: number[] = [];
    for (let i = 0; i < 10; i++) {
      server.faults.push({ kind: 'network' });
      if (i === 0) await syncStudy(id, 'manual');
      else
        await new Promise<void>((r) => {
          const t = timers.shift()!;
          delays.push(t.ms);
          t.run();
          setTimeout(r, 20);
        });
    }
    delays.push(timers[0]!.ms);
    expect(delays).toEqual([2000, 4000, 8000, 16000, 32000, 64000, 128000, 256000, 300000, 300000]);
    expect(BACKOFF_CAP_MS).toBe(300000);
    expect(syncLine(syncStatus.get()[id]!)).toMatch(/^offline — 2 waiting · last sync \d\d:\d\d$/);
  });

  it('jitter: with random = 0 the wait is half the delay; a save does not cut a wait short', async () => {
    setSyncDeps({ random: () => 0 });
    const { id, me } = await sharedStudy(0);
    await record(id, me, 2);
    server.faults.push({ kind: 'network' });
    await syncStudy(id, 'manual');
    expect(timers.map((t) => t.ms)).toEqual([1000]);
    await syncStudy(id, 'save');
    await syncStudy(id, 'tick');
    expect(pushes()).toHaveLength(1);
  });

  it('429 and 503 honour Retry-After (seconds, or an HTTP date)', async () => {
    const { id, me } = await sharedStudy(0);
    await record(id, me, 2);
    server.faults.push({ kind: 'status', status: 429, retryAfter: '120' });
    await syncStudy(id, 'manual');
    expect(timers.map((t) => t.ms)).toEqual([120_000]);
    const now = new Date('2026-05-04T10:00:00Z');
    setSyncDeps({ now: () => now });
    server.faults.push({ kind: 'status', status: 503, retryAfter: 'Mon, 04 May 2026 10:10:00 GMT' });
    timers.shift()!.run();
    await new Promise((r) => setTimeout(r, 20));
    await syncStudy(id, 'save');
    expect(timers.map((t) => t.ms)).toEqual([600_000]);
    expect((await getLink(id))?.stopped).toBeUndefined();
  });

  it('409 stops syncing with the reason shown, and sends nothing more until "Try again"', async () => {
    const { id, me } = await sharedStudy(0);
    await record(id, me, 2);
    server.faults.push({ kind: 'status', status: 409, error: 'event 1 is held with other content' });
    await syncStudy(id, 'manual');
    const stopped = (await getLink(id))?.stopped?.message;
    expect(stopped).toContain('Sync stopped');
    expect(stopped).toContain('event 1 is held with other content');
    expect(syncLine(syncStatus.get()[id]!)).toBe(stopped);
    expect(timers).toHaveLength(0); // no silent retry
    await syncStudy(id, 'save');
    await syncStudy(id, 'online');
    expect(pushes()).toHaveLength(1);
    await resumeSync(id);
    expect(pushes()).toHaveLength(2);
    expect(server.events).toHaveLength(2);
    expect((await getLink(id))?.stopped).toBeUndefined();
  });

  it('400 (the server refuses the batch as malformed) stops with the server’s words', async () => {
    const { id, me } = await sharedStudy(0);
    await record(id, me, 2);
    server.faults.push({ kind: 'status', status: 400, error: 'events[0].value: must be a number' });
    await syncStudy(id, 'manual');
    expect((await getLink(id))?.stopped?.message).toContain('events[0].value: must be a number');
    expect(timers).toHaveLength(0);
  });
});

describe('pull', () => {
  it('pages after the cursor; the other phones’ events stay out of the own log; the crew view is the core’s', async () => {
    // NIST/SEMATECH ZARR13 (test/fixtures/stats-zarr13.json): 195 heat flow readings, 95 % interval
    // (9.258242, 9.264679) as the e-Handbook §1.3.5.2 reports it. This phone took the first 40, phone B
    // the other 155, and this phone's own pushes are served back too.
    const values = zarr13.values as number[];
    const { id, me } = await sharedStudy(40, (i) => values[i]!);
    const b = server.addPhone('phone-B');
    const bEvents: ObservationRecord[] = values.slice(40).map((value, i) => ({
      id: crypto.randomUUID(),
      studyId: id,
      seq: i + 1,
      at: '2026-05-04T08:00:00+02:00',
      device: b.device,
      value,
    }));
    server.events.push(...bEvents.slice(0, 100));
    await syncStudy(id, 'manual');
    server.events.push(...bEvents.slice(100));
    await syncStudy(id, 'manual');
    // 140 then 195 held on the server, pages of at most 500: one page per sync, each after the last cursor
    const pulls = server.log.filter((r) => r.method === 'GET').map((r) => r.path);
    expect(pulls).toHaveLength(2);
    expect((await getLink(id))?.cursor).toBe('195');
    const own = await listObservations(id);
    expect(own).toHaveLength(40);
    expect(own.every((e) => e.device === me)).toBe(true);
    const crew = await listCrewEvents(id);
    expect(crew.map((e) => e.id).sort()).toEqual(bEvents.map((e) => e.id).sort());

    const view = await crewViewOf(id);
    const study = (await getStudy(id))!;
    expect(view).toEqual(crewView(study, [...own, ...bEvents]));
    expect(view?.n).toBe(195);
    expect(view?.phones.map((p) => [p.device, p.counted]).sort()).toEqual(
      [
        [me, 40],
        ['phone-B', 155],
      ].sort(),
    );
    expect(view?.assessment?.lower).toBeCloseTo(zarr13.expected95[0]!, 5);
    expect(view?.assessment?.upper).toBeCloseTo(zarr13.expected95[1]!, 5);
  });

  it('more than a page: follows `more` with the cursor in one sync', async () => {
    const { id } = await sharedStudy(1);
    const b = server.addPhone('phone-B');
    for (let i = 0; i < 1200; i++)
      server.events.push({
        id: crypto.randomUUID(),
        studyId: id,
        seq: i + 1,
        at: '2026-05-04T08:00:00+02:00',
        device: b.device,
        value: 9,
      });
    await syncStudy(id, 'manual');
    const pulls = server.log.filter((r) => r.method === 'GET');
    expect(pulls).toHaveLength(3); // 1201 events in pages of 500
    expect(await listCrewEvents(id)).toHaveLength(1200);
    expect((await getLink(id))?.cursor).toBe('1201');
  });

  it('an event this phone cannot read stops syncing, naming the problem; nothing of the page is kept', async () => {
    const { id } = await sharedStudy(1);
    server.events.push({
      id: crypto.randomUUID(),
      studyId: id,
      seq: 1,
      at: '2026-05-04T08:00:00+02:00',
      device: 'phone-B',
      value: '7,5' as unknown as number,
    });
    await syncStudy(id, 'manual');
    expect((await getLink(id))?.stopped?.message).toMatch(
      /cannot read \(event \d+ of a page: events\[0\]\.value/,
    );
    expect(await listCrewEvents(id)).toHaveLength(0);
  });
});

describe('join', () => {
  it('a code as typed (any case, spaces) joins: the study is created with the server’s id and opens synced', async () => {
    const { id } = await sharedStudy(3);
    // a second phone: a fresh database
    resetDbForTests();
    resetSyncForTests();
    globalThis.indexedDB = new IDBFactory();
    const r = await joinCrew('abcd efgh jkmn pqrs');
    expect(r).toMatchObject({ ok: true, value: { studyId: id } });
    expect((await getStudy(id))?.setup).toEqual(setup);
    expect((await getLink(id))?.creator).toBe(false);
    await syncStudy(id, 'manual');
    expect(await listCrewEvents(id)).toHaveLength(3);
    expect(await listObservations(id)).toHaveLength(0);
  });

  it('refuses what is not a crew code without asking the server, and a stopped code with a message', async () => {
    await sharedStudy(1);
    const before = server.log.length;
    const bad = await joinCrew('ABCD-EFGH-JKMN-PQR');
    expect(bad).toMatchObject({ ok: false });
    expect(!bad.ok && bad.message).toContain('not a crew code');
    expect(server.log.length).toBe(before);
    server.code = null;
    const stopped = await joinCrew('ABCD-EFGH-JKMN-PQRS');
    expect(!stopped.ok && stopped.message).toContain('no crew uses this code');
  });
});
