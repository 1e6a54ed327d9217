/**
 * Schema migrations — answers "what tables does the crew server need, and how does a database get there?"
 *
 * Each migration has a version; `schema_migrations` records the versions applied. At every start the
 * server applies the missing ones, in order, in one transaction that first takes a transaction-level
 * advisory lock (PostgreSQL's `pg_advisory_xact_lock`): when two processes start at once on one database,
 * the second waits for the first to commit and then finds nothing left to do. A migration is never edited
 * once released; a change is a new version.
 *
 * Tables:
 * - `studies` — each shared study record (jsonb, as the bundle's validator accepted it).
 * - `phones` — a phone's membership of one study: its device id, the SHA-256 of its token (never the
 *   token), whether it created the study (may revoke codes and phones) and whether it is revoked.
 * - `crew_codes` — the SHA-256 of each crew code issued (never the code) and whether it still works.
 * - `events` — the immutable events; `id` (the event's UUID) is the key that makes pushes idempotent,
 *   `server_seq` the order of storing that pull pages through.
 * - `rate_limits` — attempt counters per bucket and minute, shared by every server process.
 */
import type { Db } from './db.ts';

export interface Migration {
  version: number;
  name: string;
  sql: string;
}

export const MIGRATIONS: readonly Migration[] = [
  {
    version: 1,
    name: 'studies, phones, crew codes, events, rate limits',
    sql: `
      create table studies (
        id uuid primary key,
        study jsonb not null,
        created_at timestamptz not null default now()
      );
      create table phones (
        id uuid primary key,
        study_id uuid not null references studies (id),
        device text not null,
        token_hash text not null unique,
        creator boolean not null,
        revoked boolean not null default false,
        joined_at timestamptz not null default now()
      );
      create index phones_study on phones (study_id);
      create table crew_codes (
        code_hash text primary key,
        study_id uuid not null references studies (id),
        active boolean not null,
        created_at timestamptz not null default now()
      );
      create index crew_codes_study on crew_codes (study_id);
      create table events (
        server_seq bigserial not null unique,
        id uuid primary key,
        study_id uuid not null references studies (id),
        device text not null,
        seq integer not null,
        body jsonb not null,
        stored_at timestamptz not null default now()
      );
      create index events_study_order on events (study_id, server_seq);
      create table rate_limits (
        bucket text not null,
        window_start bigint not null,
        hits integer not null,
        primary key (bucket, window_start)
      );
    `,
  },
  {
    version: 2,
    name: "studies remember the hash of the sharing phone's share key (a lost answer can be asked for again)",
    sql: `
      alter table studies add column share_key_hash text;
    `,
  },
];

/** Any constant shared by every server process: the lock's identity. */
const MIGRATION_LOCK = 731_600_001;

/** Applies the migrations `db` lacks; returns the versions applied now (empty when up to date). */
export async function migrate(db: Db, migrations: readonly Migration[] = MIGRATIONS): Promise<number[]> {
  return db.transaction(async (tx) => {
    await tx.query('select pg_advisory_xact_lock($1)', [MIGRATION_LOCK]);
    await tx.query(`create table if not exists schema_migrations (
      version integer primary key,
      name text not null,
      applied_at timestamptz not null default now()
    )`);
    const rows = await tx.query<{ version: number }>('select version from schema_migrations');
    const have = new Set(rows.map((r) => Number(r.version)));
    const applied: number[] = [];
    for (const m of [...migrations].sort((a, b) => a.version - b.version)) {
      if (have.has(m.version)) continue;
      for (const statement of m.sql.split(';').filter((s) => s.trim() !== '')) await tx.query(statement);
      await tx.query('insert into schema_migrations (version, name) values ($1, $2)', [m.version, m.name]);
      applied.push(m.version);
    }
    return applied;
  });
}
