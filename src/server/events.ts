/**
 * Event routes: push a batch of a phone's events, pull the study's events after a cursor
 * (src/sync/protocol.ts defines the bodies and statuses).
 *
 * Push, in one transaction, so a batch is stored whole or not at all:
 * 1. The study's push lock (`pg_advisory_xact_lock` on the study id) is taken. Pushes of one study are
 *    stored one after another, so `server_seq` values become visible in the order they were drawn: a
 *    pull can never see event 12 committed while event 11's transaction is still open, move its cursor
 *    past 11 and miss it for good. Pushes of different studies do not wait for each other.
 * 2. Every void and correction must name an entry the study holds (in this batch or stored before),
 *    as a bundle's links must (src/bundle/validate.ts); else 400.
 * 3. `insert … on conflict (id) do nothing returning id` stores the new events; an event that was not
 *    inserted is compared with the stored one by the pooling rule's content (src/bundle/pool.ts: everything
 *    but `seq`, as canonical JSON). Equal: already present (a repeated push). Different: the whole batch
 *    is rolled back and refused with 409 naming the events.
 *
 * Pull pages by `server_seq`, the order of storing; the figures use the pooled order (src/bundle/
 * pooled-order.ts), never this one.
 */
import type { Context } from 'hono';
import { cleanEvent } from '../bundle/bundle.ts';
import { canonicalJson } from '../bundle/canonical.ts';
import type { ObservationRecord, StudyRecord } from '../model/records.ts';
import {
  MAX_PULL_EVENTS,
  type PullResponse,
  type PushRequest,
  type PushResponse,
  pushProblems,
} from '../sync/protocol.ts';
import { authorize } from './access.ts';
import type { Queryable } from './db.ts';
import { HttpError, readJson } from './http.ts';
import type { StudyContext } from './studies.ts';

/** Key space of the per-study push locks (the second key is the study id's hash). */
const PUSH_LOCK = 731_600_002;

/** The pooling rule's comparison (src/bundle/pool.ts): the event without its place in one log. */
const contentOf = (e: ObservationRecord) => canonicalJson({ ...cleanEvent(e), seq: 0 });

/** Voids and corrections must name an entry of the study: in the batch, or stored (read inside the lock). */
async function linkProblems(tx: Queryable, studyId: string, events: ObservationRecord[]): Promise<string[]> {
  const inBatch = new Map(events.map((e) => [e.id, e]));
  const named = [...new Set(events.flatMap((e) => [e.voids, e.corrects]))].filter(
    (id): id is string => id !== undefined && !inBatch.has(id),
  );
  const stored = new Map<string, ObservationRecord>();
  if (named.length > 0) {
    const rows = await tx.query<{ body: ObservationRecord }>(
      `select body from events where study_id = $1
       and id in (select (jsonb_array_elements_text($2::jsonb))::uuid)`,
      [studyId, JSON.stringify(named)],
    );
    for (const r of rows) stored.set(r.body.id, r.body);
  }
  const problems: string[] = [];
  events.forEach((e, i) => {
    for (const field of ['voids', 'corrects'] as const) {
      const id = e[field];
      if (id === undefined) continue;
      const target = inBatch.get(id) ?? stored.get(id);
      if (id === e.id) problems.push(`events[${i}].${field}: an event cannot name itself`);
      else if (target === undefined)
        problems.push(
          `events[${i}].${field}: no event ${id} in this study (neither in this batch nor stored)`,
        );
      else if (target.voids !== undefined)
        problems.push(`events[${i}].${field}: ${id} is a void; only entries can be voided or corrected`);
    }
  });
  return problems;
}

/** POST /studies/:id/events */
export async function push(c: Context, s: StudyContext): Promise<Response> {
  const phone = await authorize(c, s.db, c.req.param('id') ?? '');
  const body = await readJson(c);
  const [row] = await s.db.query<{ study: StudyRecord }>('select study from studies where id = $1', [
    phone.studyId,
  ]);
  const problems = pushProblems(body, row!.study, phone.device);
  if (problems.length > 0) throw new HttpError(400, 'the batch was refused; nothing was stored', problems);
  const events = (body as PushRequest).events.map(cleanEvent);
  const answer = await s.db.transaction(async (tx): Promise<PushResponse> => {
    await tx.query('select pg_advisory_xact_lock($1, hashtext($2))', [PUSH_LOCK, phone.studyId]);
    const links = await linkProblems(tx, phone.studyId, events);
    if (links.length > 0) throw new HttpError(400, 'the batch was refused; nothing was stored', links);
    const inserted = await tx.query<{ id: string }>(
      `insert into events (id, study_id, device, seq, body)
       select (e->>'id')::uuid, $1::uuid, e->>'device', (e->>'seq')::integer, e
       from jsonb_array_elements($2::jsonb) with ordinality as t(e, ord) order by ord
       on conflict (id) do nothing returning id::text as id`,
      [phone.studyId, JSON.stringify(events)],
    );
    const fresh = new Set(inserted.map((r) => r.id));
    const repeated = events.filter((e) => !fresh.has(e.id));
    if (repeated.length > 0) {
      const rows = await tx.query<{ body: ObservationRecord }>(
        'select body from events where id in (select (jsonb_array_elements_text($1::jsonb))::uuid)',
        [JSON.stringify(repeated.map((e) => e.id))],
      );
      const held = new Map(rows.map((r) => [r.body.id, r.body]));
      const differ = repeated.filter((e) => {
        const h = held.get(e.id);
        return h === undefined || contentOf(h) !== contentOf(e);
      });
      if (differ.length > 0)
        throw new HttpError(
          409,
          'the batch was refused; nothing was stored: events already stored with other content (one of the copies was altered)',
          differ.map((e) => `event ${e.id} (seq ${e.seq}) differs from the stored event with this id`),
        );
    }
    return { stored: fresh.size, alreadyPresent: repeated.length };
  });
  return c.json(answer, 200);
}

const CURSOR = /^(0|[1-9][0-9]{0,17})$/;

/** GET /studies/:id/events?after=C&limit=L */
export async function pull(c: Context, s: StudyContext): Promise<Response> {
  const phone = await authorize(c, s.db, c.req.param('id') ?? '');
  const after = c.req.query('after') ?? '0';
  const limitText = c.req.query('limit') ?? String(MAX_PULL_EVENTS);
  const problems: string[] = [];
  if (!CURSOR.test(after)) problems.push(`after: not a cursor this server gave, got "${after.slice(0, 40)}"`);
  const limit = /^[0-9]{1,4}$/.test(limitText) ? Number(limitText) : Number.NaN;
  if (!(limit >= 1 && limit <= MAX_PULL_EVENTS))
    problems.push(
      `limit: must be a whole number from 1 to ${MAX_PULL_EVENTS}, got "${limitText.slice(0, 40)}"`,
    );
  if (problems.length > 0) throw new HttpError(400, 'the pull request is malformed', problems);
  const rows = await s.readDb.query<{ s: string; body: ObservationRecord }>(
    `select server_seq::text as s, body from events
     where study_id = $1 and server_seq > $2::bigint order by server_seq limit $3`,
    [phone.studyId, after, limit + 1],
  );
  const page = rows.slice(0, limit);
  const answer: PullResponse = {
    events: page.map((r) => r.body),
    cursor: page.length > 0 ? page[page.length - 1]!.s : after,
    more: rows.length > limit,
  };
  return c.json(answer, 200);
}
