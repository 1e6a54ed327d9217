/**
 * The built phone app (`vite build` → dist/) served by the crew server itself, so a phone opens the app
 * from the server it syncs with: one origin, which the app's content security policy (`connect-src
 * 'self'`, web/index.html) allows and nothing else.
 *
 * GET and HEAD only. A path that names a file of the folder gets that file; any other path without a file
 * extension (a navigation inside the app) gets index.html. Paths are decoded and resolved inside the
 * folder; anything that would leave it is refused. Cache: Vite's hashed files under `assets/` never change
 * (a year, immutable); everything else — index.html, the service worker, the manifest, icons — is
 * revalidated on every load (`no-cache`), so an update reaches the phone and the service worker decides
 * when to use it.
 */
import { readFile, stat } from 'node:fs/promises';
import { extname, resolve, sep } from 'node:path';
import type { Context } from 'hono';

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.map': 'application/json',
  '.webmanifest': 'application/manifest+json',
  '.png': 'image/png',
  '.svg': 'image/svg+xml',
  '.ico': 'image/x-icon',
  '.txt': 'text/plain; charset=utf-8',
  '.woff2': 'font/woff2',
};

async function isFile(path: string): Promise<boolean> {
  try {
    return (await stat(path)).isFile();
  } catch {
    return false;
  }
}

/** Answers a request for the app in `dir`, or null when nothing there answers it. */
export async function serveApp(c: Context, dir: string): Promise<Response | null> {
  if (c.req.method !== 'GET' && c.req.method !== 'HEAD') return null;
  const root = resolve(dir);
  let path: string;
  try {
    path = decodeURIComponent(new URL(c.req.url).pathname);
  } catch {
    return c.text('malformed path', 400);
  }
  if (path.includes('\0')) return c.text('malformed path', 400);
  let file = resolve(root, `.${path}`);
  if (file !== root && !file.startsWith(root + sep)) return c.text('not found', 404);
  if (!(await isFile(file))) {
    if (extname(path) !== '') return null;
    file = resolve(root, 'index.html');
    if (!(await isFile(file))) return null;
  }
  const immutable = file.startsWith(resolve(root, 'assets') + sep);
  c.header('Content-Type', TYPES[extname(file).toLowerCase()] ?? 'application/octet-stream');
  c.header('Cache-Control', immutable ? 'public, max-age=31536000, immutable' : 'no-cache');
  if (c.req.method === 'HEAD') return c.body(null, 200);
  return c.body(new Uint8Array(await readFile(file)), 200);
}
