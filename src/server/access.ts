/**
 * Who gets in: phone tokens (which study a request may read and write) and the attempt limits on joining
 * and sharing.
 *
 * Limits are counted in PostgreSQL (`rate_limits`), per bucket and clock minute of the database's clock,
 * so every server process behind a proxy shares one count. A fixed window lets up to twice the limit
 * through across a minute boundary; against an 80-bit crew code that changes nothing that matters.
 */
import type { Context } from 'hono';
import type { Db, Queryable } from './db.ts';
import { bearerToken, HttpError, sha256 } from './http.ts';

export interface Phone {
  id: string;
  studyId: string;
  device: string;
  creator: boolean;
}

/**
 * The phone the request's token belongs to, checked against the study in the path: 401 without a token,
 * with an unknown one or a revoked phone's; 403 for a token of another study, or a creator-only request
 * from another phone.
 */
export async function authorize(
  c: Context,
  db: Queryable,
  studyId: string,
  creatorOnly = false,
): Promise<Phone> {
  const rows = await db.query<{
    id: string;
    study_id: string;
    device: string;
    creator: boolean;
    revoked: boolean;
  }>(
    'select id::text as id, study_id::text as study_id, device, creator, revoked from phones where token_hash = $1',
    [sha256(bearerToken(c))],
  );
  const row = rows[0];
  const invalid = { 'WWW-Authenticate': 'Bearer realm="crew", error="invalid_token"' };
  if (row === undefined) throw new HttpError(401, 'unknown phone token', undefined, invalid);
  if (row.revoked)
    throw new HttpError(
      401,
      "this phone's access to the study was revoked by its creator",
      undefined,
      invalid,
    );
  if (row.study_id !== studyId) throw new HttpError(403, 'this token opens another study, not this one');
  if (creatorOnly && !row.creator)
    throw new HttpError(403, 'only the phone that shared the study may do this');
  return { id: row.id, studyId: row.study_id, device: row.device, creator: row.creator };
}

export interface Limits {
  /** Join attempts per client address per minute. */
  joinPerAddress: number;
  /**
   * Join attempts per minute from all addresses together: a wrong code names no study, so guessing spread
   * over many addresses is bounded by this global count.
   */
  joinGlobal: number;
  /** Studies shared per client address per minute. */
  sharePerAddress: number;
}

export const DEFAULT_LIMITS: Limits = { joinPerAddress: 10, joinGlobal: 600, sharePerAddress: 10 };

/** Counts one attempt in `bucket`; a 429 with Retry-After (seconds to the next minute) when over `limit`. */
export async function countAttempt(db: Db, bucket: string, limit: number): Promise<void> {
  const rows = await db.query<{ hits: number; retry: number; fresh: boolean }>(
    `insert into rate_limits (bucket, window_start, hits)
     values ($1, floor(extract(epoch from now()) / 60)::bigint, 1)
     on conflict (bucket, window_start) do update set hits = rate_limits.hits + 1
     returning hits, (60 - floor(extract(epoch from now()))::bigint % 60)::int as retry`,
    [bucket],
  );
  const row = rows[0]!;
  if (row.hits === 1)
    // the first attempt of a minute in a bucket sweeps the counts of past minutes, which no longer
    // matter: the table holds about one minute of buckets
    await db.query(
      'delete from rate_limits where window_start < floor(extract(epoch from now()) / 60)::bigint',
    );
  if (row.hits > limit)
    throw new HttpError(429, `too many attempts; try again in ${row.retry} s`, undefined, {
      'Retry-After': String(row.retry),
    });
}
