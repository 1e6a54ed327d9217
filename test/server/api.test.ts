/**
 * The crew server's API against its contract (src/sync/protocol.ts), in process, on PGlite and — when
 * DATABASE_URL is set — on real PostgreSQL: sharing, joining, pushing and pulling; every refusal of
 * issue 16 ("a malformed, oversized, replayed or foreign-study request gets a clear error status and
 * message and changes nothing"); who gets in (tokens, codes, revocation, the join limit).
 *
 * Outside references: HTTP status semantics RFC 9110 §15 (400, 401, 403, 404, 409, 413, 415, 429 from
 * RFC 6585 §4 with Retry-After); bearer tokens RFC 6750 §2.1 and §3 (WWW-Authenticate); SHA-256 as
 * FIPS 180-4, computed here by node:crypto, not by the server's code.
 */
import { createHash } from 'node:crypto';
import type { Hono } from 'hono';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ObservationRecord, StudyRecord } from '../../src/model/records.ts';
import { createApp } from '../../src/server/app.ts';
import type { Db } from '../../src/server/db.ts';
import { formatCrewCode } from '../../src/sync/crew-code.ts';
import { MAX_BODY_BYTES, type ShareResponse } from '../../src/sync/protocol.ts';
import { backends, client, entriesOf, newShareKey, newStudy, testAddress, voidOf } from './harness.ts';

const sha256 = (text: string) => createHash('sha256').update(text).digest('hex');

describe.each(backends())('crew server API on $name', (backend) => {
  let db: Db;
  let app: Hono;
  beforeAll(async () => {
    db = await backend.open();
    app = createApp(db, { clientAddress: testAddress, logError: () => {} });
  }, 60_000);
  afterAll(async () => {
    await db?.close();
    await backend.drop();
  });

  async function sharedStudy(st: StudyRecord = newStudy()) {
    const request = client(app);
    const shared = await request<ShareResponse>('POST', '/studies', {
      json: { study: st, device: 'phone-A', shareKey: newShareKey() },
    });
    expect(shared.status).toBe(201);
    const joined = await request('POST', '/join', {
      json: { code: shared.body.crewCode, device: 'phone-B' },
    });
    expect(joined.status).toBe(200);
    return {
      st,
      request,
      a: shared.body,
      b: joined.body as { token: string; phoneId: string },
      code: shared.body.crewCode,
    };
  }
  const countEvents = async (studyId: string) =>
    Number(
      (
        await db.query<{ n: string }>('select count(*)::text as n from events where study_id = $1', [studyId])
      )[0]!.n,
    );

  it('migrations: applied once, a second run (or two at once) applies nothing', async () => {
    const { migrate, MIGRATIONS } = await import('../../src/server/migrations.ts');
    expect(await Promise.all([migrate(db), migrate(db)])).toEqual([[], []]);
    const rows = await db.query<{ version: number }>('select version from schema_migrations');
    expect(rows.map((r) => Number(r.version))).toEqual(MIGRATIONS.map((m) => m.version));
  });

  it('share, join, push, pull: both phones read every event, in the order stored', async () => {
    const { st, request, a, b } = await sharedStudy();
    const joined = await request('POST', '/join', {
      json: { code: formatCrewCode(a.crewCode).toLowerCase(), device: 'phone-C' },
    });
    expect(joined.status).toBe(200);
    expect(joined.body.study).toEqual(st);
    const evA = entriesOf(st, 'phone-A', [10.1, 10.2, 10.3]);
    const evB = entriesOf(st, 'phone-B', [9.9, 10.0]);
    expect(
      (await request('POST', `/studies/${st.id}/events`, { token: a.token, json: { events: evA } })).body,
    ).toEqual({ stored: 3, alreadyPresent: 0 });
    expect(
      (await request('POST', `/studies/${st.id}/events`, { token: b.token, json: { events: evB } })).body,
    ).toEqual({ stored: 2, alreadyPresent: 0 });
    const page1 = await request('GET', `/studies/${st.id}/events?limit=4`, { token: b.token });
    expect(page1.status).toBe(200);
    expect(page1.body.more).toBe(true);
    const page2 = await request('GET', `/studies/${st.id}/events?after=${page1.body.cursor}`, {
      token: a.token,
    });
    expect(page2.body.more).toBe(false);
    expect([...page1.body.events, ...page2.body.events]).toEqual([...evA, ...evB]);
    const empty = await request('GET', `/studies/${st.id}/events?after=${page2.body.cursor}`, {
      token: a.token,
    });
    expect(empty.body).toEqual({ events: [], cursor: page2.body.cursor, more: false });
    const crew = await request('GET', `/studies/${st.id}`, { token: b.token });
    expect(crew.body.you).toBe(b.phoneId);
    expect(crew.body.study).toEqual(st);
    expect(crew.body.phones.map((p: { device: string; creator: boolean }) => [p.device, p.creator])).toEqual([
      ['phone-A', true],
      ['phone-B', false],
      ['phone-C', false],
    ]);
    expect(crew.body.phones[0].joinedAt).toMatch(/^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\dZ$/);
  });

  it('a repeated push is a no-op, also when the phone renumbered its seq (the pooling rule ignores seq)', async () => {
    const { st, request, a } = await sharedStudy();
    const ev = entriesOf(st, 'phone-A', [1, 2, 3, 4]);
    const path = `/studies/${st.id}/events`;
    expect((await request('POST', path, { token: a.token, json: { events: ev } })).body).toEqual({
      stored: 4,
      alreadyPresent: 0,
    });
    expect((await request('POST', path, { token: a.token, json: { events: ev } })).body).toEqual({
      stored: 0,
      alreadyPresent: 4,
    });
    const more = [
      ...ev.slice(2).map((e) => ({ ...e, seq: e.seq + 10 })),
      ...entriesOf(st, 'phone-A', [5], 5),
    ];
    expect((await request('POST', path, { token: a.token, json: { events: more } })).body).toEqual({
      stored: 1,
      alreadyPresent: 2,
    });
    expect(await countEvents(st.id)).toBe(5);
  });

  it('an event id stored with other content: 409 naming it, and nothing of the batch is stored', async () => {
    const { st, request, a } = await sharedStudy();
    const ev = entriesOf(st, 'phone-A', [1, 2]);
    const path = `/studies/${st.id}/events`;
    await request('POST', path, { token: a.token, json: { events: ev } });
    const fresh = entriesOf(st, 'phone-A', [3], 3);
    const altered = { ...ev[1]!, value: 2.5 };
    const r = await request('POST', path, { token: a.token, json: { events: [fresh[0], altered] } });
    expect(r.status).toBe(409);
    expect(r.body.problems).toEqual([expect.stringContaining(altered.id)]);
    expect(await countEvents(st.id)).toBe(2);
    // the same id under another study is another event's content too
    const other = await sharedStudy();
    const stolen = { ...ev[0]!, studyId: other.st.id };
    const r2 = await other.request('POST', `/studies/${other.st.id}/events`, {
      token: other.a.token,
      json: { events: [stolen] },
    });
    expect(r2.status).toBe(409);
    expect(await countEvents(other.st.id)).toBe(0);
  });

  it('bodies: over the size limit 413, not JSON 400, not sent as JSON 415 — each changing nothing', async () => {
    const { st, request, a } = await sharedStudy();
    const path = `/studies/${st.id}/events`;
    const big = `{"events":[${' '.repeat(MAX_BODY_BYTES)}]}`;
    const r413 = await request('POST', path, { token: a.token, raw: big });
    expect(r413.status).toBe(413);
    expect(r413.body.error).toMatch(/over 262144 bytes/);
    const r400 = await request('POST', path, { token: a.token, raw: '{"events": [' });
    expect(r400.status).toBe(400);
    expect(r400.body.error).toMatch(/not valid JSON/);
    const r415 = await request('POST', path, { token: a.token, raw: '{"events":[]}', type: 'text/plain' });
    expect(r415.status).toBe(415);
    const share413 = await request('POST', '/studies', { raw: big });
    expect(share413.status).toBe(413);
    expect(await countEvents(st.id)).toBe(0);
  });

  it('invalid events: 400 with problems naming the field; nothing stored', async () => {
    const { st, request, a } = await sharedStudy();
    const [good, bad] = entriesOf(st, 'phone-A', [1, 2]);
    const path = `/studies/${st.id}/events`;
    const cases: [unknown, RegExp][] = [
      [{ events: [good, { ...bad, value: '7,5' }] }, /^events\[1\]\.value: must be a number/],
      [{ events: [good, { ...bad, at: 'yesterday' }] }, /^events\[1\]\.at: not an ISO 8601 time/],
      [{ events: [{ ...good, device: 'phone-B' }] }, /^events\[0\]\.device: .*not this phone/],
      [{ events: [{ ...good, studyId: newStudy().id }] }, /^events\[0\]\.studyId: /],
      [{ events: [good, { ...bad, id: good!.id }] }, /^events\[1\]\.id: same id as events\[0\]/],
      [{ events: [] }, /^events: empty/],
      [{ events: [good], extra: 1 }, /^extra: unknown field/],
      [
        { events: [voidOf(st, { ...good!, id: newStudy().id }, 'phone-A', 1)] },
        /^events\[0\]\.voids: no event/,
      ],
    ];
    for (const [json, problem] of cases) {
      const r = await request('POST', path, { token: a.token, json });
      expect(r.status, JSON.stringify(json).slice(0, 80)).toBe(400);
      expect(
        r.body.problems.some((p: string) => problem.test(p)),
        r.body.problems.join('\n'),
      ).toBe(true);
    }
    expect(await countEvents(st.id)).toBe(0);
    const pull = await request('GET', `/studies/${st.id}/events?after=x1&limit=0`, { token: a.token });
    expect(pull.status).toBe(400);
    expect(pull.body.problems).toEqual([
      expect.stringMatching(/^after: /),
      expect.stringMatching(/^limit: /),
    ]);
    const share = await request('POST', '/studies', {
      json: { study: { ...newStudy(), setup: { kind: 'weight' } }, device: 'x', shareKey: newShareKey() },
    });
    expect(share.status).toBe(400);
    expect(share.body.problems.some((p: string) => p.startsWith('study.setup.kind'))).toBe(true);
  });

  it('tokens: none or unknown 401 (RFC 6750 challenge), another study 403, creator-only requests 403', async () => {
    const one = await sharedStudy();
    const two = await sharedStudy();
    const path = `/studies/${one.st.id}/events`;
    const none = await one.request('GET', path);
    expect(none.status).toBe(401);
    expect(none.headers.get('www-authenticate')).toMatch(/^Bearer /);
    expect((await one.request('GET', path, { token: 'x'.repeat(43) })).status).toBe(401);
    const foreign = await one.request('POST', path, {
      token: two.a.token,
      json: { events: entriesOf(one.st, 'phone-A', [1]) },
    });
    expect(foreign.status).toBe(403);
    expect((await one.request('GET', `/studies/${one.st.id}`, { token: two.b.token })).status).toBe(403);
    expect((await one.request('POST', `/studies/${one.st.id}/code`, { token: one.b.token })).status).toBe(
      403,
    );
    expect(
      (await one.request('DELETE', `/studies/${one.st.id}/phones/${one.a.phoneId}`, { token: one.b.token }))
        .status,
    ).toBe(403);
    expect(await countEvents(one.st.id)).toBe(0);
  });

  it('a revoked phone gets 401 and stores nothing; the others go on', async () => {
    const { st, request, a, b } = await sharedStudy();
    const r = await request('DELETE', `/studies/${st.id}/phones/${b.phoneId}`, { token: a.token });
    expect(r.status).toBe(204);
    const pushed = await request('POST', `/studies/${st.id}/events`, {
      token: b.token,
      json: { events: entriesOf(st, 'phone-B', [1]) },
    });
    expect(pushed.status).toBe(401);
    expect(pushed.body.error).toMatch(/revoked/);
    expect((await request('GET', `/studies/${st.id}/events`, { token: b.token })).status).toBe(401);
    expect((await request('GET', `/studies/${st.id}/events`, { token: a.token })).status).toBe(200);
    expect(
      (await request('DELETE', `/studies/${st.id}/phones/${a.phoneId}`, { token: a.token })).status,
    ).toBe(400);
    expect(
      (await request('DELETE', `/studies/${st.id}/phones/${newStudy().id}`, { token: a.token })).status,
    ).toBe(404);
    expect(await countEvents(st.id)).toBe(0);
  });

  it('a replaced or withdrawn crew code no longer opens the study (404); the new one does', async () => {
    const { st, request, a, code } = await sharedStudy();
    const replaced = await request('POST', `/studies/${st.id}/code`, { token: a.token });
    expect(replaced.status).toBe(200);
    expect(replaced.body.crewCode).not.toBe(code);
    expect((await request('POST', '/join', { json: { code, device: 'late' } })).status).toBe(404);
    expect(
      (await request('POST', '/join', { json: { code: replaced.body.crewCode, device: 'late' } })).status,
    ).toBe(200);
    expect((await request('DELETE', `/studies/${st.id}/code`, { token: a.token })).status).toBe(204);
    const after = await request('POST', '/join', { json: { code: replaced.body.crewCode, device: 'later' } });
    expect(after.status).toBe(404);
    expect(after.body.error).toMatch(/no study has this crew code/);
    const malformed = await request('POST', '/join', { json: { code: 'ABCD-EFGH', device: 'x' } });
    expect(malformed.status).toBe(400);
  });

  it('join attempts are limited per address (11th in a minute: 429 with Retry-After); another address still joins', async () => {
    const { a } = await sharedStudy();
    const guesser = client(app, '203.0.113.7');
    const statuses: number[] = [];
    for (let i = 0; i < 11; i++)
      statuses.push(
        (await guesser('POST', '/join', { json: { code: '0000000000000000', device: 'g' } })).status,
      );
    expect(statuses.slice(0, 10).every((s) => s === 404)).toBe(true);
    const last = await guesser('POST', '/join', { json: { code: a.crewCode, device: 'g' } });
    expect(last.status).toBe(429);
    const retry = Number(last.headers.get('retry-after'));
    expect(retry >= 1 && retry <= 60).toBe(true);
    // the right code from the limited address is refused too: the limit counts attempts, not failures
    expect(statuses[10]).toBe(429);
    expect(
      (await client(app, '203.0.113.8')('POST', '/join', { json: { code: a.crewCode, device: 'h' } })).status,
    ).toBe(200);
  });

  it('the global join limit holds across addresses', async () => {
    const limited = createApp(db, {
      clientAddress: testAddress,
      limits: { joinGlobal: 3 },
      logError: () => {},
    });
    // the global bucket is shared with the other tests of this file: count from what is there now
    const statuses: number[] = [];
    for (let i = 0; i < 3 + 700; i++) {
      const r = await client(limited, `198.51.100.${i % 250}`)('POST', '/join', {
        json: { code: '0000000000000000', device: 'g' },
      });
      statuses.push(r.status);
      if (r.status === 429) break;
    }
    expect(statuses.at(-1)).toBe(429);
    expect(statuses.length).toBeLessThanOrEqual(4);
  });

  it('tokens and crew codes are stored only as their SHA-256', async () => {
    const { st, a, b, code } = await sharedStudy();
    const phones = await db.query<{ token_hash: string }>(
      'select token_hash from phones where study_id = $1 order by creator desc',
      [st.id],
    );
    expect(phones.map((p) => p.token_hash)).toEqual([sha256(a.token), sha256(b.token)]);
    const codes = await db.query<{ code_hash: string }>(
      'select code_hash from crew_codes where study_id = $1',
      [st.id],
    );
    expect(codes.map((c) => c.code_hash)).toEqual([sha256(code)]);
    const dump = JSON.stringify([
      await db.query('select * from phones where study_id = $1', [st.id]),
      await db.query('select * from crew_codes where study_id = $1', [st.id]),
      await db.query('select * from studies where id = $1', [st.id]),
    ]);
    for (const secret of [a.token, b.token, code]) expect(dump).not.toContain(secret);
    expect(a.token).toMatch(/^[A-Za-z0-9_-]{43}$/);
  });

  it('two phones voiding the same entry: both voids are kept, the entry is withdrawn once', async () => {
    const { st, request, a, b } = await sharedStudy();
    const [e1, e2] = entriesOf(st, 'phone-A', [10.1, 10.2]);
    await request('POST', `/studies/${st.id}/events`, { token: a.token, json: { events: [e1, e2] } });
    const vA = voidOf(st, e1!, 'phone-A', 3);
    const vB = voidOf(st, e1!, 'phone-B', 1);
    expect(
      (await request('POST', `/studies/${st.id}/events`, { token: a.token, json: { events: [vA] } })).status,
    ).toBe(200);
    expect(
      (await request('POST', `/studies/${st.id}/events`, { token: b.token, json: { events: [vB] } })).status,
    ).toBe(200);
    const pulled = await request('GET', `/studies/${st.id}/events`, { token: b.token });
    const events = pulled.body.events as ObservationRecord[];
    expect(
      events
        .filter((e) => e.voids === e1!.id)
        .map((e) => e.device)
        .sort(),
    ).toEqual(['phone-A', 'phone-B']);
    const { crewView } = await import('../../src/sync/crew-view.ts');
    expect(crewView(st, events).n).toBe(1);
  });

  it('a void or correction naming a void, or an event of another study, is refused', async () => {
    const { st, request, a } = await sharedStudy();
    const other = await sharedStudy();
    const [e1] = entriesOf(st, 'phone-A', [1]);
    const [o1] = entriesOf(other.st, 'phone-A', [1]);
    await other.request('POST', `/studies/${other.st.id}/events`, {
      token: other.a.token,
      json: { events: [o1] },
    });
    const v1 = voidOf(st, e1!, 'phone-A', 2);
    expect(
      (await request('POST', `/studies/${st.id}/events`, { token: a.token, json: { events: [e1, v1] } }))
        .status,
    ).toBe(200);
    const vv = { ...voidOf(st, e1!, 'phone-A', 3), voids: v1.id };
    const r1 = await request('POST', `/studies/${st.id}/events`, { token: a.token, json: { events: [vv] } });
    expect(r1.body.problems).toEqual([expect.stringMatching(/^events\[0\]\.voids: .* is a void/)]);
    const vo = { ...voidOf(st, e1!, 'phone-A', 3), voids: o1!.id };
    const r2 = await request('POST', `/studies/${st.id}/events`, { token: a.token, json: { events: [vo] } });
    expect(r2.body.problems).toEqual([expect.stringMatching(/^events\[0\]\.voids: no event/)]);
    const correction = { ...entriesOf(st, 'phone-A', [1.5], 3)[0]!, corrects: e1!.id };
    expect(
      (await request('POST', `/studies/${st.id}/events`, { token: a.token, json: { events: [correction] } }))
        .status,
    ).toBe(200);
  });

  it('a phone a week offline pushes 2,000 entries in batches of 200 (one batch sent twice): each stored once', async () => {
    const { st, request, a } = await sharedStudy();
    const values = Array.from({ length: 2000 }, (_, i) => 10 + ((i * 37) % 101) / 100);
    const week = entriesOf(st, 'phone-A', values, 1, '2026-05-04T07:00:00Z').map((e, i) => ({
      ...e,
      at: new Date(Date.parse('2026-05-04T07:00:00Z') + i * 300_000).toISOString().replace('Z', '+00:00'),
    }));
    let stored = 0;
    for (let i = 0; i < week.length; i += 200) {
      const r = await request('POST', `/studies/${st.id}/events`, {
        token: a.token,
        json: { events: week.slice(i, i + 200) },
      });
      expect(r.status).toBe(200);
      stored += r.body.stored;
      if (i === 1000)
        expect(
          (
            await request('POST', `/studies/${st.id}/events`, {
              token: a.token,
              json: { events: week.slice(i, i + 200) },
            })
          ).body.alreadyPresent,
        ).toBe(200);
    }
    expect(stored).toBe(2000);
    expect(await countEvents(st.id)).toBe(2000);
    const ids: string[] = [];
    let cursor = '0';
    for (;;) {
      const page = await request('GET', `/studies/${st.id}/events?after=${cursor}`, { token: a.token });
      ids.push(...page.body.events.map((e: ObservationRecord) => e.id));
      cursor = page.body.cursor;
      if (!page.body.more) break;
    }
    expect(ids).toEqual(week.map((e) => e.id));
  });

  it('a replica that lags: pulls see nothing yet (cursor unmoved), the crew list falls back, tokens are checked on the primary', async () => {
    const { st, request, a, b } = await sharedStudy();
    await request('POST', `/studies/${st.id}/events`, {
      token: a.token,
      json: { events: entriesOf(st, 'phone-A', [1, 2]) },
    });
    // a replica that has received nothing yet
    const empty: Db = { ...db, query: async () => [] };
    const replicated = client(
      createApp(db, { readDb: empty, clientAddress: testAddress, logError: () => {} }),
    );
    const page = await replicated('GET', `/studies/${st.id}/events?after=0`, { token: b.token });
    expect(page.body).toEqual({ events: [], cursor: '0', more: false });
    const crew = await replicated('GET', `/studies/${st.id}`, { token: b.token });
    expect(crew.body.study).toEqual(st);
    await request('DELETE', `/studies/${st.id}/phones/${b.phoneId}`, { token: a.token });
    expect((await replicated('GET', `/studies/${st.id}/events`, { token: b.token })).status).toBe(401);
  });

  it('a lost share answer asked for again with the same key: a new token and code, the unseen ones dead', async () => {
    const request = client(app);
    const st = newStudy();
    const shareKey = newShareKey();
    const first = await request<ShareResponse>('POST', '/studies', {
      json: { study: st, device: 'phone-A', shareKey },
    });
    expect(first.status).toBe(201);
    // the answer never reached the phone; it asks again with the key it kept
    const again = await request<ShareResponse>('POST', '/studies', {
      json: { study: st, device: 'phone-A', shareKey },
    });
    expect(again.status).toBe(201);
    expect(again.body.phoneId).toBe(first.body.phoneId);
    expect(again.body.token).not.toBe(first.body.token);
    expect(again.body.crewCode).not.toBe(first.body.crewCode);
    expect((await request('GET', `/studies/${st.id}`, { token: first.body.token })).status).toBe(401);
    expect((await request('GET', `/studies/${st.id}`, { token: again.body.token })).status).toBe(200);
    expect(
      (await request('POST', '/join', { json: { code: first.body.crewCode, device: 'phone-B' } })).status,
    ).toBe(404);
    expect(
      (await request('POST', '/join', { json: { code: again.body.crewCode, device: 'phone-B' } })).status,
    ).toBe(200);
    // the same key from another device, or another key: refused, nothing changes
    const other = await request('POST', '/studies', { json: { study: st, device: 'phone-X', shareKey } });
    expect(other.status).toBe(409);
    expect((await request('GET', `/studies/${st.id}`, { token: again.body.token })).status).toBe(200);
  });

  it('a study shared twice: 409; unknown routes: JSON 404; security headers on every API answer', async () => {
    const { st, request, a } = await sharedStudy();
    const again = await request('POST', '/studies', {
      json: { study: st, device: 'phone-A', shareKey: newShareKey() },
    });
    expect(again.status).toBe(409);
    const missing = await request('GET', '/nothing-here');
    expect(missing.status).toBe(404);
    expect(missing.headers.get('content-type')).toMatch(/^application\/json/);
    const ok = await request('GET', `/studies/${st.id}`, { token: a.token });
    expect(ok.status).toBe(200);
    for (const r of [again, missing, ok]) {
      expect(r.headers.get('content-security-policy')).toBe("default-src 'none'; frame-ancestors 'none'");
      expect(r.headers.get('x-content-type-options')).toBe('nosniff');
      expect(r.headers.get('cache-control')).toBe('no-store');
      expect(r.headers.get('content-disposition')).toBe('attachment; filename="api.json"');
      expect(r.headers.get('x-frame-options')).toBe('DENY');
      expect(r.headers.get('referrer-policy')).toBe('no-referrer');
      expect(r.headers.get('strict-transport-security')).toMatch(/^max-age=\d+/);
      expect(r.headers.get('server')).toBeNull();
      expect(r.headers.get('x-powered-by')).toBeNull();
    }
  });
});
