/**
 * HTTP plumbing of the crew server: refusals as JSON, request bodies read within the size limit, the
 * security headers, tokens and their hashes.
 *
 * Bodies: refused with 415 unless sent as `application/json`, with 413 as soon as more than
 * MAX_BODY_BYTES arrive (the declared Content-Length is checked first, then the bytes as they stream, so
 * a body without a length cannot run past the limit either), with 400 when they are not UTF-8 JSON.
 * Nothing is parsed before the size is known to be within the limit.
 */
import { createHash, randomBytes } from 'node:crypto';
import type { Context } from 'hono';
import type { ContentfulStatusCode } from 'hono/utils/http-status';
import { type ErrorBody, MAX_BODY_BYTES } from '../sync/protocol.ts';

/** Listed problems are capped like the bundle validator's (at most 50, then "… and N more"). */
const MAX_PROBLEMS = 50;

/** A refusal: thrown by a handler, answered by the app as an ErrorBody with this status. */
export class HttpError extends Error {
  constructor(
    readonly status: ContentfulStatusCode,
    message: string,
    readonly problems?: string[],
    readonly headers: Record<string, string> = {},
  ) {
    super(message);
  }

  body(): ErrorBody {
    if (this.problems === undefined || this.problems.length === 0) return { error: this.message };
    const extra = this.problems.length - MAX_PROBLEMS;
    const problems = this.problems.slice(0, MAX_PROBLEMS);
    if (extra > 0) problems.push(`… and ${extra} more problems`);
    return { error: this.message, problems };
  }
}

/** The request body as parsed JSON (see the module note for the refusals). */
export async function readJson(c: Context): Promise<unknown> {
  const type = c.req.header('content-type') ?? '';
  if (!/^application\/json\s*(;|$)/i.test(type))
    throw new HttpError(415, 'send the request body as JSON with "Content-Type: application/json"');
  const tooLarge = () =>
    new HttpError(413, `request body over ${MAX_BODY_BYTES} bytes; send fewer events per request`);
  const declared = c.req.header('content-length');
  if (declared !== undefined && Number(declared) > MAX_BODY_BYTES) throw tooLarge();
  const stream = c.req.raw.body;
  if (stream === null) throw new HttpError(400, 'request body missing');
  const chunks: Uint8Array[] = [];
  let size = 0;
  const reader = stream.getReader();
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > MAX_BODY_BYTES) {
      await reader.cancel().catch(() => {});
      throw tooLarge();
    }
    chunks.push(value);
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(Buffer.concat(chunks));
  } catch {
    throw new HttpError(400, 'request body is not UTF-8 text');
  }
  try {
    return JSON.parse(text);
  } catch (err) {
    throw new HttpError(400, `request body is not valid JSON (${(err as Error).message})`);
  }
}

/** A new bearer token: 32 random bytes (256 bits), base64url without padding (43 characters). */
export function newToken(): string {
  return randomBytes(32).toString('base64url');
}

/** SHA-256 of `text` as 64 hexadecimal digits: how tokens and crew codes are stored and looked up. */
export function sha256(text: string): string {
  return createHash('sha256').update(text, 'utf8').digest('hex');
}

const TOKEN = /^Bearer ([A-Za-z0-9_-]{43})$/;

/** The token of an `Authorization: Bearer …` header (RFC 6750 §2.1), or a 401 naming what is wrong. */
export function bearerToken(c: Context): string {
  const header = c.req.header('authorization');
  if (header === undefined)
    throw new HttpError(401, 'no phone token: send "Authorization: Bearer <token>"', undefined, {
      'WWW-Authenticate': 'Bearer realm="crew"',
    });
  const m = TOKEN.exec(header);
  if (m === null)
    throw new HttpError(401, 'malformed phone token', undefined, {
      'WWW-Authenticate': 'Bearer realm="crew", error="invalid_token"',
    });
  return m[1]!;
}

/**
 * Headers on every answer. API answers are JSON that no browser may render, frame or cache
 * (`default-src 'none'`, nosniff, no-store). The app's own files keep the policy their HTML carries
 * (index.html's meta CSP) and get only what a meta tag cannot say: no framing by other sites.
 */
export function securityHeaders(c: Context, api: boolean): void {
  c.header('X-Content-Type-Options', 'nosniff');
  c.header('Referrer-Policy', 'no-referrer');
  c.header('X-Frame-Options', 'DENY');
  // browsers act on it only when it arrives over HTTPS (RFC 6797 §8.1), i.e. through the TLS proxy
  // in front of the server; over plain HTTP on a laptop it is ignored
  c.header('Strict-Transport-Security', 'max-age=31536000');
  if (api) {
    c.header('Content-Security-Policy', "default-src 'none'; frame-ancestors 'none'");
    c.header('Cache-Control', 'no-store');
    // an API answer opened directly in a browser tab is downloaded, never rendered
    c.header('Content-Disposition', 'attachment; filename="api.json"');
  } else c.header('Content-Security-Policy', "frame-ancestors 'none'");
}
