/**
 * The pooled figures through the server are the core's own (issue 16, "the crew view"): three phones push
 * their logs to the crew server, one phone pulls everything, and the crew view (src/sync/crew-view.ts) of
 * what it pulled equals `merge` of the phones' bundles followed by `assess` — the estimate, the bounds and
 * the verdict, object for object. One phone's clock is years behind another's: the server pages in the
 * order it stored the events, and the figures do not move.
 *
 * Data: NIST/SEMATECH e-Handbook ZARR13 heat flow meter readings (test/support/published-data.ts),
 * dealt out to three phones. Evidence level: agreement between the server path and the bundle path of
 * the project on published data; the assessment itself is checked against references in test/core.
 */
import type { Hono } from 'hono';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ObservationRecord } from '../../src/model/records.ts';
import { createApp } from '../../src/server/app.ts';
import type { Db } from '../../src/server/db.ts';
import { crewView } from '../../src/sync/crew-view.ts';
import { mergedAssessment } from '../support/merged.ts';
import { heat } from '../support/published-data.ts';
import { backends, client, entriesOf, newShareKey, newStudy, testAddress, voidOf } from './harness.ts';

describe.each(backends())('pooled figures through the crew server on $name', (backend) => {
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

  it('crew view of the pulled events = merge + assess of the phones bundles, clocks years apart', async () => {
    const st = newStudy();
    const request = client(app);
    const shared = await request('POST', '/studies', {
      json: { study: st, device: 'phone-A', shareKey: newShareKey() },
    });
    const tokens: Record<string, string> = { 'phone-A': shared.body.token };
    for (const device of ['phone-B', 'phone-C'])
      tokens[device] = (
        await request('POST', '/join', { json: { code: shared.body.crewCode, device } })
      ).body.token;
    const dealt: number[][] = [[], [], []];
    heat.forEach((v, i) => {
      dealt[[0, 0, 1, 2, 1, 0, 2][i % 7]!]!.push(v);
    });
    // A's clock right, B's nine years behind, C's three years ahead
    const A = entriesOf(st, 'phone-A', dealt[0]!, 1, '2026-05-04T07:00:00Z');
    const B = entriesOf(st, 'phone-B', dealt[1]!, 1, '2017-05-04T07:00:00Z');
    const C = entriesOf(st, 'phone-C', dealt[2]!, 1, '2029-05-04T07:00:00Z');
    C.push(voidOf(st, A[3]!, 'phone-C', C.length + 1));
    const logs = [A, B, C];
    // pushed in an order that is neither the clocks' nor the pooled one: C's first half, A, B, C's rest
    const half = Math.floor(C.length / 2);
    const pushes: [string, ObservationRecord[]][] = [
      ['phone-C', C.slice(0, half)],
      ['phone-A', A],
      ['phone-B', B],
      ['phone-C', C.slice(half)],
    ];
    for (const [device, events] of pushes) {
      const r = await request('POST', `/studies/${st.id}/events`, {
        token: tokens[device],
        json: { events },
      });
      expect(r.status, JSON.stringify(r.body).slice(0, 300)).toBe(200);
    }
    const pulled: ObservationRecord[] = [];
    let cursor = '0';
    for (;;) {
      const page = await request('GET', `/studies/${st.id}/events?after=${cursor}&limit=7`, {
        token: tokens['phone-B'],
      });
      pulled.push(...page.body.events);
      cursor = page.body.cursor;
      if (!page.body.more) break;
    }
    // the server's order is the order of storing, whatever the clocks say
    expect(pulled.map((e) => e.id)).toEqual(pushes.flatMap(([, events]) => events.map((e) => e.id)));
    const view = crewView(st, pulled);
    const merged = await mergedAssessment(st, logs);
    expect(view.assessment).not.toBeNull();
    expect(view.assessment!.estimate).toEqual(merged.estimate);
    expect([view.assessment!.lower, view.assessment!.upper]).toEqual([merged.lower, merged.upper]);
    expect(view.assessment!.verdict).toEqual(merged.verdict);
    expect(view.assessment).toEqual(merged);
    expect(view.n).toBe(heat.length - 1);
    expect(view.phones.map((p) => [p.device, p.counted])).toEqual([
      ['phone-A', A.length - 1],
      ['phone-B', B.length],
      ['phone-C', C.length - 1],
    ]);
  });
});
