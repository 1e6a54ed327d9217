/**
 * The crew server as a Hono app — answers "what does the server do with each request?"
 *
 * `createApp(db, options)` returns the app; `main.ts` serves it over HTTP, and the tests call it in
 * process with `app.request()`. The app holds no state of its own between requests: studies, phones,
 * codes, events and attempt counts all live in the database, so any number of processes can serve one
 * PostgreSQL primary behind a proxy (README.md, "Deployment").
 *
 * Routes: exactly those of src/sync/protocol.ts under API_PREFIX; the built phone app (static-app.ts)
 * everywhere else when a folder is given. Every refusal is a JSON ErrorBody; an unexpected failure is a
 * 500 that says nothing of its cause (the cause goes to the server's log).
 */

import { getConnInfo } from '@hono/node-server/conninfo';
import { type Context, Hono } from 'hono';
import { cors } from 'hono/cors';
import { API_PREFIX, type ErrorBody } from '../sync/protocol.ts';
import { DEFAULT_LIMITS, type Limits } from './access.ts';
import type { Db } from './db.ts';
import { pull, push } from './events.ts';
import { HttpError, securityHeaders } from './http.ts';
import { serveApp } from './static-app.ts';
import { crew, join, replaceCode, revokePhone, type StudyContext, share, withdrawCode } from './studies.ts';

export interface AppOptions {
  /** A replica for the reads that may lag (crew list, pull pages); default `db`. */
  readDb?: Db;
  /** Folder of the built phone app to serve beside the API; none: API only. */
  appDir?: string;
  /** Attempt limits (default DEFAULT_LIMITS). */
  limits?: Partial<Limits>;
  /**
   * Behind a proxy: the client's address is the last entry of X-Forwarded-For (the one the proxy
   * added), not the proxy's own. Only set when every request comes through a proxy that sets it.
   */
  trustProxy?: boolean;
  /** Other origins allowed to call the API from a browser (CORS), exactly as `https://host[:port]`. */
  allowOrigins?: readonly string[];
  /** Overrides how a request's client address is found (tests). */
  clientAddress?: (c: Context) => string;
  /** Where unexpected failures are reported (default console.error). */
  logError?: (err: unknown) => void;
}

function addressOf(c: Context, trustProxy: boolean): string {
  if (trustProxy) {
    const hops = (c.req.header('x-forwarded-for') ?? '').split(',').map((h) => h.trim());
    const last = hops[hops.length - 1];
    if (last !== undefined && last !== '') return last;
  }
  try {
    return getConnInfo(c).remote.address ?? 'unknown';
  } catch {
    return 'unknown';
  }
}

export function createApp(db: Db, options: AppOptions = {}): Hono {
  const s: StudyContext = {
    db,
    readDb: options.readDb ?? db,
    limits: { ...DEFAULT_LIMITS, ...options.limits },
    clientAddress: options.clientAddress ?? ((c) => addressOf(c, options.trustProxy ?? false)),
  };
  const logError = options.logError ?? ((err: unknown) => console.error(err));
  const app = new Hono();
  const isApi = (c: Context) => c.req.path === API_PREFIX || c.req.path.startsWith(`${API_PREFIX}/`);

  app.use('*', async (c, next) => {
    await next();
    securityHeaders(c, isApi(c));
  });
  if (options.allowOrigins !== undefined && options.allowOrigins.length > 0)
    app.use(
      `${API_PREFIX}/*`,
      cors({
        origin: [...options.allowOrigins],
        allowMethods: ['GET', 'POST', 'DELETE'],
        allowHeaders: ['Authorization', 'Content-Type'],
        exposeHeaders: ['Retry-After'],
        maxAge: 600,
      }),
    );

  const api = new Hono();
  api.post('/studies', (c) => share(c, s));
  api.post('/join', (c) => join(c, s));
  api.get('/studies/:id', (c) => crew(c, s));
  api.post('/studies/:id/events', (c) => push(c, s));
  api.get('/studies/:id/events', (c) => pull(c, s));
  api.post('/studies/:id/code', (c) => replaceCode(c, s));
  api.delete('/studies/:id/code', (c) => withdrawCode(c, s));
  api.delete('/studies/:id/phones/:phoneId', (c) => revokePhone(c, s));
  app.route(API_PREFIX, api);

  app.onError((err, c) => {
    if (err instanceof HttpError) {
      for (const [k, v] of Object.entries(err.headers)) c.header(k, v);
      return c.json(err.body(), err.status);
    }
    logError(err);
    const body: ErrorBody = { error: 'internal error (the cause is in the server log)' };
    return c.json(body, 500);
  });
  app.notFound(async (c) => {
    if (!isApi(c) && options.appDir !== undefined) {
      const answer = await serveApp(c, options.appDir);
      if (answer !== null) return answer;
    }
    if (!isApi(c)) return c.text('not found', 404);
    const body: ErrorBody = { error: `no such request: ${c.req.method} ${c.req.path.slice(0, 100)}` };
    return c.json(body, 404);
  });
  return app;
}
