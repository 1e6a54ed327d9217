/**
 * Test helpers for the crew server (not a test file): the database backends to run on, a small client for
 * in-process requests, and well-formed studies and events with fresh ids.
 *
 * Backends: PGlite always (in memory, one instance per test file: its first open costs seconds); real
 * PostgreSQL too when DATABASE_URL is set, each test file in a schema of its own (created here, dropped
 * at the end), so files and runs never see each other's rows.
 */
import { randomBytes, randomUUID } from 'node:crypto';
import type { Hono } from 'hono';
import pg from 'pg';
import type { ObservationRecord, StudyRecord } from '../../src/model/records.ts';
import { type Db, openPglite, openPostgres } from '../../src/server/db.ts';
import { migrate } from '../../src/server/migrations.ts';
import { API_PREFIX } from '../../src/sync/protocol.ts';

export interface Backend {
  name: string;
  open: () => Promise<Db>;
  /** Removes what the backend left (the schema on PostgreSQL). */
  drop: () => Promise<void>;
}

export const databaseUrl = process.env.DATABASE_URL;

export function backends(): Backend[] {
  const list: Backend[] = [
    { name: 'PGlite', open: async () => withMigrations(await openPglite()), drop: async () => {} },
  ];
  if (databaseUrl !== undefined && databaseUrl !== '') {
    const schema = `crew_test_${randomUUID().replace(/-/g, '').slice(0, 16)}`;
    list.push({
      name: 'PostgreSQL',
      open: async () => withMigrations(await openPostgres(databaseUrl, { schema })),
      drop: () => dropSchema(databaseUrl, schema),
    });
  }
  return list;
}

async function withMigrations(db: Db): Promise<Db> {
  await migrate(db);
  return db;
}

export async function dropSchema(url: string, schema: string): Promise<void> {
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query(`drop schema if exists ${schema} cascade`);
  } finally {
    await client.end();
  }
}

export interface Answer<T = unknown> {
  status: number;
  body: T;
  headers: Headers;
}

/** Requests against an app in process, as from the client address `address`. */
export function client(
  app: Hono,
  address = `10.0.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`,
) {
  // biome-ignore lint/suspicious/noExplicitAny: the answers' shapes are what the assertions check
  return async function request<T = any>(
    method: string,
    path: string,
    options: { token?: string; json?: unknown; raw?: string; type?: string } = {},
  ): Promise<Answer<T>> {
    const headers: Record<string, string> = { 'x-test-address': address };
    if (options.token !== undefined) headers.authorization = `Bearer ${options.token}`;
    let body: string | undefined;
    if (options.json !== undefined) body = JSON.stringify(options.json);
    if (options.raw !== undefined) body = options.raw;
    if (body !== undefined) headers['content-type'] = options.type ?? 'application/json';
    const res = await app.request(`${API_PREFIX}${path}`, {
      method,
      headers,
      ...(body === undefined ? {} : { body }),
    });
    const text = await res.text();
    const type = res.headers.get('content-type') ?? '';
    return {
      status: res.status,
      body: type.includes('json') ? JSON.parse(text) : text,
      headers: res.headers,
    };
  };
}

/** The client address the in-process tests send (createApp's clientAddress option reads it). */
export const testAddress = (c: { req: { header: (name: string) => string | undefined } }) =>
  c.req.header('x-test-address') ?? 'unknown';

/** A measurement study with a fresh id (setup as the bundle tests' measurement studies). */
/** A share key as a phone makes one: 32 random bytes, base64url (src/sync/protocol.ts, ShareRequest). */
export function newShareKey(): string {
  return randomBytes(32).toString('base64url');
}

export function newStudy(over: Partial<StudyRecord['setup']> = {}): StudyRecord {
  return {
    id: randomUUID(),
    name: 'Heat flow, test wall',
    createdAt: '2026-05-04T08:00:00+02:00',
    setup: {
      kind: 'measurement',
      level: 0.95,
      sided: 'two',
      rule: 'standard',
      min: 10,
      target: { kind: 'margin', value: 0.01 },
      unit: 'W/(m2.K)',
      ...over,
    },
    version: 1,
  };
}

/**
 * Entries of one phone: seq from `firstSeq`, one a minute from `start` (an ISO time), values as given.
 * The ids are fresh UUIDs.
 */
export function entriesOf(
  study: StudyRecord,
  device: string,
  values: readonly number[],
  firstSeq = 1,
  start = '2026-05-04T07:00:00Z',
): ObservationRecord[] {
  const t0 = Date.parse(start);
  return values.map((value, i) => ({
    id: randomUUID(),
    studyId: study.id,
    seq: firstSeq + i,
    at: new Date(t0 + (firstSeq + i) * 60_000).toISOString().replace('Z', '+00:00'),
    value,
    device,
  }));
}

/** A void of `target` recorded on `device` as its event number `seq`. */
export function voidOf(
  study: StudyRecord,
  target: ObservationRecord,
  device: string,
  seq: number,
): ObservationRecord {
  return {
    id: randomUUID(),
    studyId: study.id,
    seq,
    at: target.at,
    device,
    voids: target.id,
    reason: 'keyed twice',
  };
}
