/**
 * The crew server's database — answers "where do studies and events live, and how does the server talk to it?"
 *
 * One small interface (query, transaction, close) over two implementations that speak the same SQL:
 * - **PGlite** (`@electric-sql/pglite`): PostgreSQL compiled to WebAssembly, running inside the server's
 *   own process and persisted in a data folder — `npm run server` needs no other install. One process
 *   owns the folder (a lock file refuses a second one); PGlite serialises every query of that process.
 * - **PostgreSQL** through `pg` (node-postgres) when `DATABASE_URL` is set: a pool of connections, so
 *   several server processes can share one primary.
 *
 * The SQL the server sends is plain PostgreSQL that both accept; values come back in forms both produce
 * alike (bigints and times are cast to text in the queries, jsonb arrives parsed).
 */
import { closeSync, openSync, readFileSync, rmSync, writeSync } from 'node:fs';
import { mkdir } from 'node:fs/promises';
import { join } from 'node:path';
import { PGlite } from '@electric-sql/pglite';
import pg from 'pg';

export interface Queryable {
  /** Runs one statement with `$1, $2…` parameters and returns its rows. */
  query<R = Record<string, unknown>>(sql: string, params?: readonly unknown[]): Promise<R[]>;
}

export interface Db extends Queryable {
  readonly kind: 'pglite' | 'postgres';
  /** Runs `work` in one transaction: committed when it resolves, rolled back when it throws. */
  transaction<T>(work: (tx: Queryable) => Promise<T>): Promise<T>;
  close(): Promise<void>;
}

const LOCK_FILE = '.crew-server.lock';

function processAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (err) {
    return (err as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/**
 * Takes the data folder for this process. Two processes on one PGlite folder would each write its files
 * and damage it, so a second start is refused while the first runs; a lock left by a process that died
 * (kill -9, power loss) is taken over.
 */
function lockFolder(dir: string): () => void {
  const path = join(dir, LOCK_FILE);
  for (let attempt = 0; attempt < 2; attempt++) {
    try {
      const fd = openSync(path, 'wx');
      writeSync(fd, String(process.pid));
      closeSync(fd);
      return () => rmSync(path, { force: true });
    } catch (err) {
      if ((err as NodeJS.ErrnoException).code !== 'EEXIST') throw err;
      const pid = Number(readFileSync(path, 'utf8'));
      if (Number.isInteger(pid) && pid > 0 && pid !== process.pid && processAlive(pid))
        throw new Error(
          `data folder ${dir} is in use by process ${pid}; one server process per PGlite folder`,
        );
      rmSync(path, { force: true });
    }
  }
  throw new Error(`data folder ${dir}: could not take ${LOCK_FILE}`);
}

/** Opens (creating when new) an embedded PostgreSQL persisted in `dir`; `dir` undefined keeps it in memory. */
export async function openPglite(dir?: string): Promise<Db> {
  let unlock = () => {};
  if (dir !== undefined) {
    await mkdir(dir, { recursive: true });
    unlock = lockFolder(dir);
  }
  let lite: PGlite;
  try {
    lite = await PGlite.create(dir === undefined ? undefined : join(dir, 'pg'));
  } catch (err) {
    unlock();
    throw err;
  }
  const run = async <R>(q: Pick<PGlite, 'query'>, sql: string, params?: readonly unknown[]) =>
    (await q.query<R>(sql, params as unknown[] | undefined)).rows;
  return {
    kind: 'pglite',
    query: (sql, params) => run(lite, sql, params),
    transaction: (work) => lite.transaction((tx) => work({ query: (sql, params) => run(tx, sql, params) })),
    close: async () => {
      await lite.close();
      unlock();
    },
  };
}

export interface PostgresOptions {
  /** A schema to work in (created when missing), e.g. one per test run; default the server's search_path. */
  schema?: string;
  /** False for a read replica: the schema is the primary's to create (default true). */
  createSchema?: boolean;
  /** Most connections this process opens (default 10). */
  maxConnections?: number;
}

const SCHEMA_NAME = /^[a-z_][a-z0-9_]{0,62}$/;

/** Connects to a PostgreSQL server (`postgres://user@host:port/db`). */
export async function openPostgres(url: string, options: PostgresOptions = {}): Promise<Db> {
  const { schema } = options;
  if (schema !== undefined && !SCHEMA_NAME.test(schema))
    throw new Error(`schema "${schema}": lower-case letters, digits and _ only`);
  if (schema !== undefined && options.createSchema !== false) {
    const admin = new pg.Client({ connectionString: url });
    await admin.connect();
    try {
      await admin.query(`create schema if not exists ${schema}`);
    } catch (err) {
      // two processes creating the schema at the same moment: one wins, the other finds it made
      if ((err as { code?: string }).code !== '23505') throw err;
    } finally {
      await admin.end();
    }
  }
  const pool = new pg.Pool({
    connectionString: url,
    max: options.maxConnections ?? 10,
    ...(schema === undefined ? {} : { options: `-c search_path=${schema}` }),
  });
  // an idle connection the server drops (restart, failover) must not crash the process
  pool.on('error', (err) => console.error(`database connection lost: ${err.message}`));
  const run = async <R>(q: pg.Pool | pg.PoolClient, sql: string, params?: readonly unknown[]) =>
    (await q.query(sql, params as unknown[] | undefined)).rows as R[];
  return {
    kind: 'postgres',
    query: (sql, params) => run(pool, sql, params),
    transaction: async (work) => {
      const client = await pool.connect();
      let broken: Error | undefined;
      try {
        await client.query('begin');
        const result = await work({ query: (sql, params) => run(client, sql, params) });
        await client.query('commit');
        return result;
      } catch (err) {
        await client.query('rollback').catch((lost: Error) => {
          broken = lost;
        });
        throw err;
      } finally {
        // a connection that could not even roll back is closed, not handed to the next request
        client.release(broken);
      }
    },
    close: () => pool.end(),
  };
}
