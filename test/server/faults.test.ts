/**
 * Nothing lost (issue 16, item 5), with the built server as a real process: killed with SIGKILL while a
 * batch is in flight and started again, the network cut after the request was sent and before the
 * answer came, a graceful stop (SIGTERM) with a push in flight, and two processes starting at once on
 * one database. After every fault the phone pushes the same batch again, and every event is stored
 * exactly once (counted by pulling everything).
 *
 * Runs on PGlite (a data folder per test) and, when DATABASE_URL is set, on PostgreSQL (a schema per
 * test, DATABASE_SCHEMA). Reference for the kill: POSIX signal semantics (SIGKILL cannot be caught, so
 * the process gets no chance to finish or clean up).
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ObservationRecord, StudyRecord } from '../../src/model/records.ts';
import { MIGRATIONS } from '../../src/server/migrations.ts';
import { API_PREFIX } from '../../src/sync/protocol.ts';
import { databaseUrl, dropSchema, entriesOf, newShareKey, newStudy } from './harness.ts';

const root = join(import.meta.dirname, '..', '..');
const script = join(root, 'dist-server', 'server.mjs');

// dist-server/ is built once for every test file by test/global-setup.ts
beforeAll(() => {
  if (!existsSync(script))
    throw new Error('dist-server/server.mjs is missing (test/global-setup.ts builds it)');
});

interface Place {
  env: NodeJS.ProcessEnv;
  data: string;
  cleanup: () => Promise<void>;
}

const places: { name: string; make: () => Place }[] = [
  {
    name: 'PGlite',
    make: () => {
      const data = mkdtempSync(join(tmpdir(), 'crew-fault-'));
      const env = { ...process.env };
      delete env.DATABASE_URL;
      return { env, data, cleanup: async () => rmSync(data, { recursive: true, force: true }) };
    },
  },
];
const url = databaseUrl;
if (url)
  places.push({
    name: 'PostgreSQL',
    make: () => {
      const schema = `crew_fault_${randomUUID().replace(/-/g, '').slice(0, 16)}`;
      const data = mkdtempSync(join(tmpdir(), 'crew-fault-'));
      return {
        env: { ...process.env, DATABASE_SCHEMA: schema },
        data,
        cleanup: async () => {
          rmSync(data, { recursive: true, force: true });
          await dropSchema(url, schema);
        },
      };
    },
  });

function start(place: Place): Promise<{ child: ChildProcess; base: string; log: () => string }> {
  const child = spawn(process.execPath, [script, '--port', '0', '--data', place.data, '--no-app'], {
    env: place.env,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let out = '';
  child.stdout!.on('data', (c: Buffer) => {
    out += c.toString();
  });
  child.stderr!.on('data', (c: Buffer) => {
    out += c.toString();
  });
  return new Promise((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`server did not start:\n${out}`)), 60_000);
    child.stdout!.on('data', () => {
      const m = /listening on (http:\/\/[^\s]+)/.exec(out);
      if (m) {
        clearTimeout(timer);
        resolve({ child, base: m[1]!, log: () => out });
      }
    });
    child.on('exit', (code) => {
      clearTimeout(timer);
      reject(new Error(`server exited (${code}):\n${out}`));
    });
  });
}

const exited = (child: ChildProcess) =>
  new Promise<number | null>((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) resolve(child.exitCode);
    else child.once('exit', (code) => resolve(code));
  });

async function call(base: string, method: string, path: string, body?: unknown, token?: string) {
  const res = await fetch(`${base}${API_PREFIX}${path}`, {
    method,
    headers: {
      ...(body === undefined ? {} : { 'content-type': 'application/json' }),
      ...(token === undefined ? {} : { authorization: `Bearer ${token}` }),
    },
    ...(body === undefined ? {} : { body: JSON.stringify(body) }),
  });
  // biome-ignore lint/suspicious/noExplicitAny: the answers' shapes are what the assertions check
  return { status: res.status, body: (await res.json()) as any };
}

/** A new study shared by phone-A: the study and its token (the share must succeed). */
async function shareNew(base: string): Promise<{ st: StudyRecord; token: string }> {
  const st = newStudy();
  const shared = await call(base, 'POST', '/studies', {
    study: st,
    device: 'phone-A',
    shareKey: newShareKey(),
  });
  expect(shared.status).toBe(201);
  return { st, token: shared.body.token as string };
}

/** Sends a push and calls `cut` once the whole request is written; resolves with the status or the error. */
function pushThenCut(
  base: string,
  studyId: string,
  token: string,
  events: ObservationRecord[],
  cut: (req: ReturnType<typeof httpRequest>) => void,
) {
  const body = JSON.stringify({ events });
  const url = new URL(`${base}${API_PREFIX}/studies/${studyId}/events`);
  return new Promise<string>((resolve) => {
    const req = httpRequest(url, {
      method: 'POST',
      headers: {
        'content-type': 'application/json',
        'content-length': Buffer.byteLength(body),
        authorization: `Bearer ${token}`,
      },
    });
    req.on('response', (res) => {
      res.resume();
      resolve(`answered ${res.statusCode}`);
    });
    req.on('error', (err) => resolve(`cut (${(err as NodeJS.ErrnoException).code ?? err.message})`));
    req.on('finish', () => cut(req));
    req.end(body);
  });
}

async function pullAll(base: string, studyId: string, token: string): Promise<string[]> {
  const ids: string[] = [];
  let cursor = '0';
  for (;;) {
    const page = await call(base, 'GET', `/studies/${studyId}/events?after=${cursor}`, undefined, token);
    ids.push(...page.body.events.map((e: ObservationRecord) => e.id));
    cursor = page.body.cursor;
    if (!page.body.more) return ids;
  }
}

/** Batches of 200 entries with notes, so that storing one takes the server a moment. */
function batches(st: StudyRecord, count: number): ObservationRecord[][] {
  const out: ObservationRecord[][] = [];
  for (let b = 0; b < count; b++)
    out.push(
      entriesOf(
        st,
        'phone-A',
        Array.from({ length: 200 }, (_, i) => 10 + ((b * 200 + i) % 97) / 10),
        b * 200 + 1,
      ).map((e) => ({
        ...e,
        note: `batch ${b}, ${'field note '.repeat(40)}`,
      })),
    );
  return out;
}

describe.each(places)('faults on a real server process on $name', ({ make }) => {
  const made: Place[] = [];
  const fresh = () => {
    const p = make();
    made.push(p);
    return p;
  };
  afterAll(async () => {
    for (const p of made) await p.cleanup();
  });

  it('killed (SIGKILL) with a batch in flight, started again, the batch pushed again: every event stored exactly once', async () => {
    const place = fresh();
    let server = await start(place);
    const { st, token } = await shareNew(server.base);
    const all = batches(st, 4);
    const outcomes: string[] = [];
    const delays = [0, 3, 15, 60];
    for (const [i, batch] of all.entries()) {
      const child = server.child;
      const outcome = await pushThenCut(server.base, st.id, token, batch, () => {
        setTimeout(() => child.kill('SIGKILL'), delays[i]);
      });
      await exited(child);
      server = await start(place);
      const again = await call(server.base, 'POST', `/studies/${st.id}/events`, { events: batch }, token);
      expect(again.status).toBe(200);
      expect(again.body.stored + again.body.alreadyPresent).toBe(200);
      outcomes.push(
        `${outcome} → retry stored ${again.body.stored}, already present ${again.body.alreadyPresent}`,
      );
    }
    const ids = await pullAll(server.base, st.id, token);
    expect(ids).toEqual(all.flat().map((e) => e.id));
    server.child.kill('SIGTERM');
    expect(await exited(server.child)).toBe(0);
    console.log(`kill -9 rounds:\n  ${outcomes.join('\n  ')}`);
  }, 240_000);

  it('network cut after the request was sent: the retry stores what is missing, nothing twice', async () => {
    const place = fresh();
    const server = await start(place);
    const { st, token } = await shareNew(server.base);
    const all = batches(st, 3);
    const delays = [0, 5, 50];
    for (const [i, batch] of all.entries()) {
      await pushThenCut(server.base, st.id, token, batch, (req) => {
        setTimeout(() => req.destroy(), delays[i]);
      });
      const again = await call(server.base, 'POST', `/studies/${st.id}/events`, { events: batch }, token);
      expect(again.status).toBe(200);
      expect(again.body.stored + again.body.alreadyPresent).toBe(200);
    }
    expect(await pullAll(server.base, st.id, token)).toEqual(all.flat().map((e) => e.id));
    server.child.kill('SIGTERM');
    expect(await exited(server.child)).toBe(0);
  }, 120_000);

  it('SIGTERM with a push in flight: the push is answered and stored, then the process exits 0', async () => {
    const place = fresh();
    const server = await start(place);
    const { st, token } = await shareNew(server.base);
    const [batch] = batches(st, 1);
    const outcome = await pushThenCut(server.base, st.id, token, batch!, () => server.child.kill('SIGTERM'));
    expect(outcome).toBe('answered 200');
    expect(await exited(server.child)).toBe(0);
    expect(server.log()).toMatch(/SIGTERM: finishing the requests in flight/);
    const again = await start(place);
    expect(await pullAll(again.base, st.id, token)).toEqual(batch!.map((e) => e.id));
    again.child.kill('SIGTERM');
    await exited(again.child);
  }, 120_000);

  it('two processes starting at once: on PostgreSQL both serve and the migrations run once; on PGlite the second is refused', async () => {
    const place = fresh();
    const [one, two] = await Promise.allSettled([start(place), start(place)]);
    const up = [one, two].filter((r) => r.status === 'fulfilled').map((r) => r.value);
    if (place.env.DATABASE_SCHEMA !== undefined) {
      expect(up.length).toBe(2);
      const c = new pg.Client({ connectionString: url });
      await c.connect();
      const rows = await c.query(`select version from ${place.env.DATABASE_SCHEMA}.schema_migrations`);
      await c.end();
      expect(rows.rows.map((r) => r.version)).toEqual(MIGRATIONS.map((m) => m.version));
    } else {
      expect(up.length).toBe(1);
      const refused = [one, two].find((r) => r.status === 'rejected') as PromiseRejectedResult;
      expect(String(refused.reason)).toMatch(
        /is in use by process \d+; one server process per PGlite folder/,
      );
    }
    for (const s of up) {
      s.child.kill('SIGTERM');
      await exited(s.child);
    }
  }, 120_000);
});
