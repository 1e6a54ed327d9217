/**
 * `node dist-server/server.mjs [--port 8787] [--host 127.0.0.1] [--data DIR] [--app DIR | --no-app]
 * [--trust-proxy] [--allow-origin ORIGIN]…` — starts the crew server.
 *
 * Database: PostgreSQL at `DATABASE_URL` when it is set (in the schema `DATABASE_SCHEMA` when that is set;
 * reads that may lag go to `DATABASE_READ_URL` when that is set too); otherwise the embedded PGlite in `--data` (default `CREW_DATA` or
 * ./crew-data). Migrations run before the port opens. SIGTERM or SIGINT stops taking connections,
 * lets the requests in flight finish (at most 10 s), closes the database and exits 0.
 *
 * Errors in the flags: a message on stderr naming the flag, exit code 2 (as the command line does).
 */
import { existsSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { parseArgs } from 'node:util';
import { serve } from '@hono/node-server';
import { createApp } from './app.ts';
import { type Db, openPglite, openPostgres } from './db.ts';
import { migrate } from './migrations.ts';

interface Flags {
  port: number;
  host: string;
  data: string;
  app: string | undefined;
  trustProxy: boolean;
  allowOrigins: string[];
}

class FlagError extends Error {}

/** The flags by Node's own parser (strict: an unknown flag or a missing value is refused), then checked. */
function parseFlags(argv: string[], env: NodeJS.ProcessEnv): Flags {
  let values: ReturnType<typeof parse>['values'];
  try {
    ({ values } = parse(argv));
  } catch (err) {
    throw new FlagError(`${(err as Error).message} (see src/server/README.md)`);
  }
  const flags: Flags = {
    port: 8787,
    host: values.host ?? '127.0.0.1',
    data: values.data ?? env.CREW_DATA ?? './crew-data',
    app: existsSync('dist/index.html') ? 'dist' : undefined,
    trustProxy: values['trust-proxy'] ?? false,
    allowOrigins: [],
  };
  if (values.port !== undefined) {
    const port = /^[0-9]{1,5}$/.test(values.port) ? Number(values.port) : -1;
    if (port < 0 || port > 65535) throw new FlagError(`--port: a port number 0–65535, got "${values.port}"`);
    flags.port = port;
  }
  if (values.app !== undefined) {
    if (!existsSync(`${values.app}/index.html`))
      throw new FlagError(`--app: no index.html in "${values.app}" (run npm run build)`);
    flags.app = values.app;
  }
  if (values['no-app']) flags.app = undefined;
  for (const origin of values['allow-origin'] ?? []) {
    if (!/^https?:\/\/[^/\s]+$/.test(origin))
      throw new FlagError(`--allow-origin: an origin such as https://app.example.org, got "${origin}"`);
    flags.allowOrigins.push(origin);
  }
  return flags;
}

function parse(argv: string[]) {
  return parseArgs({
    args: argv,
    strict: true,
    allowPositionals: false,
    options: {
      port: { type: 'string' },
      host: { type: 'string' },
      data: { type: 'string' },
      app: { type: 'string' },
      'no-app': { type: 'boolean' },
      'trust-proxy': { type: 'boolean' },
      'allow-origin': { type: 'string', multiple: true },
    },
  });
}

async function main(): Promise<void> {
  let flags: Flags;
  try {
    flags = parseFlags(process.argv.slice(2), process.env);
  } catch (err) {
    if (!(err instanceof FlagError)) throw err;
    process.stderr.write(`crew server: ${err.message}\n`);
    process.exit(2);
  }
  const url = process.env.DATABASE_URL;
  const readUrl = process.env.DATABASE_READ_URL;
  const schema = process.env.DATABASE_SCHEMA;
  const pgOptions = schema ? { schema } : {};
  const db: Db = url ? await openPostgres(url, pgOptions) : await openPglite(flags.data);
  const readDb =
    url && readUrl ? await openPostgres(readUrl, { ...pgOptions, createSchema: false }) : undefined;
  const applied = await migrate(db);
  if (applied.length > 0) console.log(`database: migrations ${applied.join(', ')} applied`);
  const app = createApp(db, {
    ...(readDb ? { readDb } : {}),
    ...(flags.app ? { appDir: flags.app } : {}),
    trustProxy: flags.trustProxy,
    allowOrigins: flags.allowOrigins,
  });
  const server = serve({ fetch: app.fetch, port: flags.port, hostname: flags.host }, (info: AddressInfo) => {
    const where = url ? 'PostgreSQL (DATABASE_URL)' : `PGlite in ${flags.data}`;
    const what = flags.app ? `, app from ${flags.app}` : '';
    console.log(`crew server listening on http://${flags.host}:${info.port} — ${where}${what}`);
  });
  // a slow or stalled client cannot hold a connection open for long
  if ('requestTimeout' in server) {
    server.requestTimeout = 30_000;
    server.headersTimeout = 10_000;
  }
  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    console.log(`${signal}: finishing the requests in flight, then stopping`);
    // kept-alive connections that go idle after their last answer would hold close() for their timeout
    const idle = setInterval(() => {
      if ('closeIdleConnections' in server) server.closeIdleConnections();
    }, 100);
    idle.unref();
    const force = setTimeout(() => {
      if ('closeAllConnections' in server) server.closeAllConnections();
    }, 10_000);
    force.unref();
    server.close(async () => {
      await readDb?.close();
      await db.close();
      process.exit(0);
    });
  };
  process.on('SIGTERM', () => stop('SIGTERM'));
  process.on('SIGINT', () => stop('SIGINT'));
}

main().catch((err: unknown) => {
  process.stderr.write(`crew server: ${err instanceof Error ? err.message : String(err)}\n`);
  process.exit(1);
});
