/**
 * The crew server serves the built phone app beside the API (issue 16: same origin, so the app's
 * `connect-src 'self'` allows exactly this server): files with the right type and cache policy,
 * navigations answered with index.html, nothing outside the folder, and the headers every answer carries.
 *
 * Outside references: MIME types per the IANA media type registry (text/html, text/javascript per
 * RFC 9239, application/manifest+json per W3C Web App Manifest); Cache-Control directives RFC 9111 §5.2
 * and `immutable` RFC 8246; X-Content-Type-Options and X-Frame-Options as the Fetch and HTML standards
 * define them; path traversal as OWASP ASVS 4.0.3 V12.3.1; CORS per the Fetch standard (an origin not
 * on the list gets no Access-Control-Allow-Origin).
 */
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp } from '../../src/server/app.ts';
import type { Db } from '../../src/server/db.ts';

const dir = mkdtempSync(join(tmpdir(), 'crew-app-'));
mkdirSync(join(dir, 'assets'));
writeFileSync(join(dir, 'index.html'), '<!doctype html><title>app</title>');
writeFileSync(join(dir, 'sw.js'), 'self.addEventListener("fetch", () => {});');
writeFileSync(join(dir, 'assets', 'index-abc123.js'), 'console.log(1);');
writeFileSync(join(dir, 'manifest.webmanifest'), '{}');
writeFileSync(join(tmpdir(), 'crew-secret.txt'), 'outside the app folder');
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** The API is not reached in these tests: a database that refuses every query proves it. */
const noDb: Db = {
  kind: 'pglite',
  query: () => Promise.reject(new Error('no database in this test')),
  transaction: () => Promise.reject(new Error('no database in this test')),
  close: async () => {},
};
const app = createApp(noDb, { appDir: dir, logError: () => {} });

describe('the phone app served by the crew server', () => {
  it('index.html, the service worker and the manifest: revalidated on every load', async () => {
    for (const [path, type] of [
      ['/', 'text/html; charset=utf-8'],
      ['/sw.js', 'text/javascript; charset=utf-8'],
      ['/manifest.webmanifest', 'application/manifest+json'],
    ] as const) {
      const res = await app.request(path);
      expect(res.status, path).toBe(200);
      expect(res.headers.get('content-type')).toBe(type);
      expect(res.headers.get('cache-control')).toBe('no-cache');
      expect(res.headers.get('x-content-type-options')).toBe('nosniff');
      expect(res.headers.get('x-frame-options')).toBe('DENY');
    }
  });

  it('hashed assets are cached for a year as immutable', async () => {
    const res = await app.request('/assets/index-abc123.js');
    expect(res.headers.get('cache-control')).toBe('public, max-age=31536000, immutable');
    expect(await res.text()).toBe('console.log(1);');
  });

  it('a navigation inside the app gets index.html; a missing file with an extension gets 404', async () => {
    const nav = await app.request('/studies/abc/field');
    expect(nav.status).toBe(200);
    expect(await nav.text()).toContain('<title>app</title>');
    expect((await app.request('/assets/missing.js')).status).toBe(404);
  });

  it('nothing outside the folder is served, however the path is written', async () => {
    for (const path of [
      '/..%2fcrew-secret.txt',
      '/%2e%2e/crew-secret.txt',
      '/assets/..%2f..%2fcrew-secret.txt',
    ]) {
      const res = await app.request(path);
      expect(await res.text(), path).not.toContain('outside the app folder');
      expect(res.status, path).toBe(404);
    }
  });

  it('API paths never fall back to the app: JSON 404 with the API headers', async () => {
    const res = await app.request('/api/v1/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.headers.get('content-type')).toMatch(/^application\/json/);
    expect(res.headers.get('content-security-policy')).toBe("default-src 'none'; frame-ancestors 'none'");
    expect(res.headers.get('cache-control')).toBe('no-store');
  });

  it('CORS only for the origins given, exactly (none by default)', async () => {
    const crossSite = createApp(noDb, { allowOrigins: ['https://app.example.org'], logError: () => {} });
    const preflight = (origin: string) =>
      crossSite.request('/api/v1/join', {
        method: 'OPTIONS',
        headers: {
          origin,
          'access-control-request-method': 'POST',
          'access-control-request-headers': 'content-type',
        },
      });
    const allowed = await preflight('https://app.example.org');
    expect(allowed.headers.get('access-control-allow-origin')).toBe('https://app.example.org');
    expect(
      (await preflight('https://evil.example.net')).headers.get('access-control-allow-origin'),
    ).toBeNull();
    expect((await preflight('null')).headers.get('access-control-allow-origin')).toBeNull();
    const sameOrigin = await app.request('/api/v1/join', {
      method: 'OPTIONS',
      headers: { origin: 'https://app.example.org' },
    });
    expect(sameOrigin.headers.get('access-control-allow-origin')).toBeNull();
  });

  it('an unexpected failure answers 500 without its cause', async () => {
    const res = await app.request('/api/v1/studies/00000000-0000-4000-8000-000000000000', {
      headers: { authorization: `Bearer ${'a'.repeat(43)}` },
    });
    expect(res.status).toBe(500);
    expect(await res.json()).toEqual({ error: 'internal error (the cause is in the server log)' });
  });
});
