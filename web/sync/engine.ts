/**
 * The sync loop of one linked study: push this phone's own events, then pull the others' (protocol:
 * src/sync/protocol.ts; storage: web/storage/crew.ts).
 *
 * - Push: the own events after `pushedSeq`, oldest first, in batches of MAX_BATCH_EVENTS. `pushedSeq` is
 *   raised (and committed) only after the server acknowledged a batch, so a phone killed mid-push, or an
 *   answer lost on the way back, resends that batch — which the server counts as already present (the event
 *   id is the key), so nothing is counted twice.
 * - Pull: pages after the stored cursor until `more` is false; each page's events (other phones' only) and
 *   the cursor after them are committed together.
 * - Failures: no connection, a cut answer, 5xx, 408 or 429 → try again after an exponential backoff with
 *   jitter (2 s doubling to a 5 min cap; never sooner than Retry-After). Any other refusal (400, 401, 403,
 *   404, 409, 413) stops syncing this study with the server's reason shown: the same request would be
 *   refused again, so it is never resent silently; "Try again" on the crew panel clears it.
 *
 * Runs only after a save was acknowledged and never inside the tap path (web/sync/index.ts schedules it).
 */
import type { ObservationRecord, PullResponse, PushResponse } from '../core.ts';
import { loadCore } from '../core-loader.ts';
import { getLink, ownEventsAfter, ownWaiting, storePulled, updateLink } from '../storage/crew.ts';
import type { CrewLink } from '../storage/schema.ts';
import { getStudy } from '../storage/studies.ts';
import { isoWithOffset } from '../storage/time.ts';
import { type Reply, request } from './api.ts';
import { apiUrl, deps } from './deps.ts';
import { setStatus } from './status.ts';

export const BACKOFF_FIRST_MS = 2_000;
export const BACKOFF_CAP_MS = 5 * 60_000;

/**
 * The wait before retry number `attempt` (0 for the first): "equal jitter" — half the capped exponential
 * delay plus a random share of the other half (Brooker, "Exponential Backoff And Jitter", AWS Architecture
 * Blog, 2015), so phones that lost signal together do not come back in step; never less than the server's
 * Retry-After.
 */
export function backoffDelay(attempt: number, random: number, retryAfter: number | null): number {
  const ceiling = Math.min(BACKOFF_CAP_MS, BACKOFF_FIRST_MS * 2 ** attempt);
  return Math.max(ceiling / 2 + (ceiling / 2) * random, retryAfter ?? 0);
}

/** Why a sync was asked for. A retry timer waiting is not cut short by a save or the minute tick. */
export type SyncReason = 'open' | 'save' | 'tick' | 'online' | 'manual' | 'retry';

interface Flight {
  running: Promise<void> | null;
  again: boolean;
  attempt: number;
  timer: unknown;
  offline: boolean;
}
const flights = new Map<string, Flight>();

function flight(id: string): Flight {
  let f = flights.get(id);
  if (!f) {
    f = { running: null, again: false, attempt: 0, timer: null, offline: false };
    flights.set(id, f);
  }
  return f;
}

/** For tests: forget every study's loop (timers are cleared). */
export function resetSyncForTests(): void {
  for (const f of flights.values()) if (f.timer !== null) deps.clearTimer(f.timer);
  flights.clear();
}

/** Syncs one study now (or joins the sync already running); resolves when this round is over. */
export function syncStudy(id: string, reason: SyncReason): Promise<void> {
  const f = flight(id);
  if (f.timer !== null) {
    if (reason === 'save' || reason === 'tick') return f.running ?? Promise.resolve();
    deps.clearTimer(f.timer);
    f.timer = null;
    if (reason === 'online') f.attempt = 0;
  }
  if (f.running) {
    f.again = true;
    return f.running;
  }
  f.running = (async () => {
    try {
      do {
        f.again = false;
        await round(id, f);
      } while (f.again && f.timer === null);
    } finally {
      f.running = null;
    }
  })();
  return f.running;
}

type Outcome = { kind: 'done' } | { kind: 'none' } | Exclude<Reply<unknown>, { kind: 'ok' }>;

async function round(id: string, f: Flight): Promise<void> {
  const link = await getLink(id);
  if (!link) {
    setStatus(id, null);
    return;
  }
  if (link.stopped) {
    await refreshStatus(id, link);
    return;
  }
  await refreshStatus(id, link, true);
  let out: Outcome;
  try {
    out = await pushAndPull(link);
  } catch (err) {
    // storage failed (full, or closed for an upgrade): nothing was acknowledged wrongly; try later
    out = { kind: 'retry', status: null, retryAfterMs: null, error: (err as Error).message };
  }
  if (out.kind === 'retry') {
    f.offline = true;
    const wait = backoffDelay(f.attempt, deps.random(), out.retryAfterMs);
    f.attempt++;
    f.timer = deps.setTimer(() => {
      f.timer = null;
      void syncStudy(id, 'retry');
    }, wait);
  } else if (out.kind === 'refused') {
    f.offline = false;
    await updateLink(id, (l) => ({
      ...l,
      stopped: { at: isoWithOffset(deps.now()), message: refusal(out) },
    }));
  } else if (out.kind === 'done') {
    f.offline = false;
    f.attempt = 0;
    await updateLink(id, (l) => ({ ...l, lastSyncAt: isoWithOffset(deps.now()) }));
  }
  await refreshStatus(id);
}

/** Reads the study's sync state into the status store (the crew chip and panel show it). */
export async function refreshStatus(id: string, known?: CrewLink, syncing = false): Promise<void> {
  const link = known ?? (await getLink(id));
  if (!link) {
    setStatus(id, null);
    return;
  }
  const f = flight(id);
  setStatus(id, {
    waiting: await ownWaiting(id, link.device, link.pushedSeq),
    ...(link.lastSyncAt !== undefined ? { lastSyncAt: link.lastSyncAt } : {}),
    offline: f.offline,
    ...(link.stopped ? { stopped: link.stopped.message } : {}),
    syncing: syncing || f.running !== null,
  });
}

async function pushAndPull(link: CrewLink): Promise<Outcome> {
  const core = await loadCore();
  const url = (path: string) => apiUrl(link.server, core.API_PREFIX, path);
  const base = `/studies/${encodeURIComponent(link.studyId)}`;
  let pushed = link.pushedSeq;
  for (;;) {
    const batch = await ownEventsAfter(link.studyId, link.device, pushed, core.MAX_BATCH_EVENTS);
    if (batch.length === 0) break;
    const r = await request<PushResponse>(deps, url(`${base}/events`), 'POST', {
      token: link.token,
      body: { events: batch },
    });
    if (r.kind !== 'ok') return r;
    pushed = (batch.at(-1) as ObservationRecord).seq;
    await updateLink(link.studyId, (l) => ({ ...l, pushedSeq: Math.max(l.pushedSeq, pushed) }));
  }
  const study = await getStudy(link.studyId);
  if (!study) return { kind: 'none' };
  let cursor = link.cursor;
  for (;;) {
    const q = `?limit=${core.MAX_PULL_EVENTS}${cursor === null ? '' : `&after=${encodeURIComponent(cursor)}`}`;
    const r = await request<PullResponse>(deps, url(`${base}/events${q}`), 'GET', { token: link.token });
    if (r.kind !== 'ok') return r;
    const page = r.body as Partial<PullResponse> | undefined;
    if (
      !page ||
      !Array.isArray(page.events) ||
      typeof page.cursor !== 'string' ||
      typeof page.more !== 'boolean'
    )
      return unreadable('the answer is not a page of events');
    const others: ObservationRecord[] = [];
    for (const [i, e] of page.events.entries()) {
      const from = typeof (e as { device?: unknown })?.device === 'string' ? e.device : '';
      // the core's own event rules (those a bundle import applies), for this study
      const problems = core.pushProblems({ events: [e] }, study, from);
      if (problems.length > 0) return unreadable(`event ${i + 1} of a page: ${problems[0]}`);
      if (from !== link.device) others.push(e);
    }
    await storePulled(link.studyId, others, page.cursor);
    const moved = page.cursor !== cursor;
    cursor = page.cursor;
    if (!page.more || !moved) break;
  }
  return { kind: 'done' };
}

function unreadable(why: string): Outcome {
  // status 200: the request went through, but the answer cannot be used (refusal() words it)
  return { kind: 'refused', status: 200, error: why, problems: [] };
}

/** The message shown when the server refused: what happened, and that the entries are safe. */
export function refusal(r: { status: number; error: string; problems: string[] }): string {
  const kept = 'Your entries stay on this phone; export a study bundle to hand them over.';
  const detail = [r.error, ...r.problems.slice(0, 3)].join('; ');
  switch (r.status) {
    case 200:
      return `Sync stopped: the crew server sent data this phone cannot read (${detail}). Nothing is kept from it. ${kept}`;
    case 401:
      return `Sync stopped: the crew server no longer accepts this phone for this study (its access was removed). ${kept}`;
    case 403:
      return `Sync stopped: the crew server refused this phone access to this study (${detail}). ${kept}`;
    case 404:
      return `Sync stopped: the crew server does not know this study (${detail}). ${kept}`;
    case 409:
      return `Sync stopped: the crew server holds an entry with the same id but other content (${detail}). Nothing more is sent for this study. ${kept}`;
    default:
      return `Sync stopped: the crew server refused this phone's data (${detail}). Nothing more is sent for this study. ${kept}`;
  }
}

/** After a refusal was sorted out: clear it and sync again (the user's explicit "Try again"). */
export async function resumeSync(id: string): Promise<void> {
  await updateLink(id, (l) => {
    const { stopped: _, ...rest } = l;
    return rest;
  });
  const f = flight(id);
  f.attempt = 0;
  await syncStudy(id, 'manual');
}
