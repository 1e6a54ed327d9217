/**
 * A crew server in memory for the phone's sync tests — not the real one (src/server), which has its own
 * tests against PostgreSQL. It follows src/sync/protocol.ts: bodies checked with the protocol's own
 * validators, pushes idempotent by event id (same content but `seq` → already present; other content → 409,
 * nothing stored), pulls paged after a cursor. `fault` makes the next request fail the way a field network
 * does. Not a test file.
 */
import {
  API_PREFIX,
  MAX_PULL_EVENTS,
  type ObservationRecord,
  pushProblems,
  type StudyRecord,
} from '../../src/index.ts';

export type Fault =
  | { kind: 'network' }
  /** The server does the work, then the answer is lost on the way back. */
  | { kind: 'cut' }
  /** The request never comes back (the phone is killed while it waits). */
  | { kind: 'hang' }
  | { kind: 'status'; status: number; retryAfter?: string; error?: string };

interface Phone {
  phoneId: string;
  device: string;
  token: string;
  creator: boolean;
  revoked: boolean;
}

const sameContent = (a: ObservationRecord, b: ObservationRecord) =>
  JSON.stringify({ ...a, seq: 0 }, Object.keys(a).sort()) ===
  JSON.stringify({ ...b, seq: 0 }, Object.keys(b).sort());

export class FakeCrewServer {
  study: StudyRecord | null = null;
  code: string | null = 'ABCDEFGHJKMNPQRS';
  phones: Phone[] = [];
  events: ObservationRecord[] = [];
  /** Every request: method, path and the number of events pushed. */
  log: { method: string; path: string; events?: number }[] = [];
  faults: Fault[] = [];
  private n = 0;

  /** Adds a phone as if it had joined (for events "from another phone"). */
  addPhone(device: string): Phone {
    const p = {
      phoneId: `p${++this.n}`,
      device,
      token: `t${this.n}-${device}`,
      creator: false,
      revoked: false,
    };
    this.phones.push(p);
    return p;
  }

  fetch = async (url: string, init: RequestInit = {}): Promise<Response> => {
    const u = new URL(url, 'http://phone.test');
    const method = init.method ?? 'GET';
    const path = u.pathname.slice(API_PREFIX.length);
    const body =
      typeof init.body === 'string' ? (JSON.parse(init.body) as Record<string, unknown>) : undefined;
    const events = Array.isArray(body?.events) ? body.events.length : undefined;
    this.log.push({ method, path, ...(events !== undefined ? { events } : {}) });
    const fault = this.faults.shift();
    if (fault?.kind === 'network') throw new TypeError('Failed to fetch');
    if (fault?.kind === 'hang') return new Promise<Response>(() => undefined);
    if (fault?.kind === 'status')
      return json(fault.status, { error: fault.error ?? 'refused' }, fault.retryAfter);
    const res = this.handle(method, path, u.searchParams, body, init.headers as Record<string, string>);
    if (fault?.kind === 'cut')
      return new Response(
        new ReadableStream({
          start: (c) => c.error(new TypeError('network connection was lost')),
        }),
        { status: res.status },
      );
    return res;
  };

  private auth(headers: Record<string, string> | undefined): Phone | undefined {
    const token = headers?.Authorization?.replace(/^Bearer /, '');
    return this.phones.find((p) => p.token === token && !p.revoked);
  }

  private handle(
    method: string,
    path: string,
    q: URLSearchParams,
    body: Record<string, unknown> | undefined,
    headers: Record<string, string> | undefined,
  ): Response {
    if (method === 'POST' && path === '/studies') {
      this.study = body?.study as StudyRecord;
      const p = this.addPhone(body?.device as string);
      p.creator = true;
      return json(201, { studyId: this.study.id, crewCode: this.code, token: p.token, phoneId: p.phoneId });
    }
    if (method === 'POST' && path === '/join') {
      if (body?.code !== this.code || this.code === null) return json(404, { error: 'no such code' });
      const p = this.addPhone(body?.device as string);
      return json(200, { study: this.study, token: p.token, phoneId: p.phoneId });
    }
    const phone = this.auth(headers);
    if (!phone || !this.study) return json(401, { error: 'unknown token' });
    const base = `/studies/${this.study.id}`;
    if (method === 'POST' && path === `${base}/events`) {
      const problems = pushProblems(body, this.study, phone.device);
      if (problems.length > 0) return json(400, { error: 'malformed push', problems });
      let stored = 0;
      let alreadyPresent = 0;
      const batch = body?.events as ObservationRecord[];
      for (const e of batch) {
        const held = this.events.find((h) => h.id === e.id);
        if (held && !sameContent(held, e))
          return json(409, { error: `event ${e.id} is held with other content` });
      }
      for (const e of batch) {
        if (this.events.some((h) => h.id === e.id)) alreadyPresent++;
        else {
          this.events.push(structuredClone(e));
          stored++;
        }
      }
      return json(200, { stored, alreadyPresent });
    }
    if (method === 'GET' && path === `${base}/events`) {
      const after = Number(q.get('after') ?? '0');
      const limit = Math.min(Number(q.get('limit') ?? MAX_PULL_EVENTS), MAX_PULL_EVENTS);
      const page = this.events.slice(after, after + limit);
      return json(200, {
        events: page,
        cursor: String(after + page.length),
        more: after + page.length < this.events.length,
      });
    }
    if (method === 'GET' && path === base)
      return json(200, {
        study: this.study,
        phones: this.phones.map(({ token: _, ...p }) => ({ ...p, joinedAt: '2026-05-04T07:00:00Z' })),
        you: phone.phoneId,
      });
    if (!phone.creator) return json(403, { error: 'creator only' });
    if (method === 'POST' && path === `${base}/code`) {
      this.code = 'ZYXWVTSRQPNMKJHG';
      return json(200, { crewCode: this.code });
    }
    if (method === 'DELETE' && path === `${base}/code`) {
      this.code = null;
      return new Response(null, { status: 204 });
    }
    const revoke = path.match(/^\/studies\/[^/]+\/phones\/([^/]+)$/);
    if (method === 'DELETE' && revoke) {
      const p = this.phones.find((x) => x.phoneId === revoke[1]);
      if (!p) return json(404, { error: 'no such phone' });
      p.revoked = true;
      return new Response(null, { status: 204 });
    }
    return json(404, { error: 'no such route' });
  }
}

function json(status: number, body: unknown, retryAfter?: string): Response {
  const headers: Record<string, string> = { 'Content-Type': 'application/json' };
  if (retryAfter !== undefined) headers['Retry-After'] = retryAfter;
  return new Response(JSON.stringify(body), { status, headers });
}
