/**
 * One request to the crew server (the routes, bodies and statuses are src/sync/protocol.ts), sorted into
 * what the sync loop does next:
 * - `ok`: a 2xx answer with its JSON body (undefined for 204);
 * - `retry`: no answer (no signal, the connection cut mid-response, an unreadable 2xx body), a 5xx, 408 or
 *   429 — the same request may be sent again later (pushes are idempotent: the event id is the key);
 * - `refused`: any other 4xx — sending the same request again would be refused again, so it is not resent.
 * `Retry-After` (RFC 9110 §10.2.3: delay-seconds or an HTTP-date) is read into milliseconds.
 */

export type Reply<T> =
  | { kind: 'ok'; status: number; body: T }
  | { kind: 'retry'; status: number | null; retryAfterMs: number | null; error: string }
  | { kind: 'refused'; status: number; error: string; problems: string[] };

export interface Caller {
  fetch: (url: string, init: RequestInit) => Promise<Response>;
  now: () => Date;
}

/** RFC 9110 §10.2.3: `Retry-After: 120` or `Retry-After: Fri, 31 Dec 1999 23:59:59 GMT`. */
export function retryAfterMs(header: string | null, now: Date): number | null {
  if (header === null || header.trim() === '') return null;
  const text = header.trim();
  if (/^\d+$/.test(text)) return Number(text) * 1000;
  const at = Date.parse(text);
  return Number.isNaN(at) ? null : Math.max(0, at - now.getTime());
}

function errorOf(body: unknown, status: number): { error: string; problems: string[] } {
  const b = body as { error?: unknown; problems?: unknown } | null;
  const error = typeof b?.error === 'string' && b.error !== '' ? b.error : `status ${status}`;
  const problems = Array.isArray(b?.problems) ? b.problems.filter((p) => typeof p === 'string') : [];
  return { error, problems };
}

export async function request<T>(
  caller: Caller,
  url: string,
  method: 'GET' | 'POST' | 'DELETE',
  opts: { token?: string; body?: unknown } = {},
): Promise<Reply<T>> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (opts.token !== undefined) headers.Authorization = `Bearer ${opts.token}`;
  if (opts.body !== undefined) headers['Content-Type'] = 'application/json';
  let res: Response;
  try {
    res = await caller.fetch(url, {
      method,
      headers,
      // the token is the only credential; nothing cached, so a pull never reads an old page
      credentials: 'omit',
      cache: 'no-store',
      ...(opts.body !== undefined ? { body: JSON.stringify(opts.body) } : {}),
    });
  } catch (err) {
    return {
      kind: 'retry',
      status: null,
      retryAfterMs: null,
      error: (err as Error).message || 'no connection',
    };
  }
  let text: string;
  try {
    text = await res.text();
  } catch {
    // the answer was cut off: the server may have done it (a repeated push is then "already present")
    return {
      kind: 'retry',
      status: null,
      retryAfterMs: null,
      error: 'the connection broke during the answer',
    };
  }
  let body: unknown;
  try {
    body = text === '' ? undefined : JSON.parse(text);
  } catch {
    if (res.ok)
      return { kind: 'retry', status: res.status, retryAfterMs: null, error: 'the answer was cut off' };
    body = undefined;
  }
  if (res.ok) return { kind: 'ok', status: res.status, body: body as T };
  const { error, problems } = errorOf(body, res.status);
  if (res.status >= 500 || res.status === 429 || res.status === 408)
    return {
      kind: 'retry',
      status: res.status,
      retryAfterMs: retryAfterMs(res.headers.get('Retry-After'), caller.now()),
      error,
    };
  return { kind: 'refused', status: res.status, error, problems };
}
