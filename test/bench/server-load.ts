/**
 * Crew server load benchmark (`npm run bench:server`, not part of `npm test`): 50 simulated phones push
 * 200 entries each, in batches of 20, against one server process on loopback, with a bounded number of
 * phones pushing at once. Checks that every entry is stored exactly once (the pushes' `stored` counts
 * and a full pull), and reports push latency (p50, p95, p99, max) and entries stored per second.
 *
 * The server is the built one (dist-server/server.mjs), started here as a child process: on PostgreSQL
 * when DATABASE_URL is set (in a fresh schema, DATABASE_SCHEMA, dropped afterwards unless --keep), else
 * on PGlite in a temporary folder. Joins come through one address, so the server runs with --trust-proxy
 * and each phone sends its own X-Forwarded-For, as behind a proxy.
 *
 * Flags: --phones N (50) --entries N (200) --batch N (20) --concurrency N (10)
 *        --out PATH (test/bench/server-load; writes PATH.json and PATH.md)
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { parseArgs } from 'node:util';
import pg from 'pg';
import { API_PREFIX as API } from '../../src/sync/protocol.ts';
import { newShareKey, newStudy } from '../server/harness.ts';

interface Flags {
  phones: number;
  entries: number;
  batch: number;
  concurrency: number;
  out: string;
}

/** The flags by Node's own parser (strict: an unknown flag or a missing value is refused), then checked. */
function parseFlags(argv: string[]): Flags {
  const counts = ['phones', 'entries', 'batch', 'concurrency'] as const;
  const { values } = parseArgs({
    args: argv,
    strict: true,
    options: {
      out: { type: 'string', default: 'test/bench/server-load' },
      phones: { type: 'string' },
      entries: { type: 'string' },
      batch: { type: 'string' },
      concurrency: { type: 'string' },
    },
  });
  const flags: Flags = { phones: 50, entries: 200, batch: 20, concurrency: 10, out: values.out };
  for (const name of counts) {
    const value = values[name];
    if (value === undefined) continue;
    const n = Number(value);
    if (!Number.isInteger(n) || n < 1) throw new Error(`--${name}: a whole number ≥ 1, got "${value}"`);
    flags[name] = n;
  }
  return flags;
}

function startServer(env: NodeJS.ProcessEnv, data: string): Promise<{ child: ChildProcess; base: string }> {
  const script = join(dirname(fileURLToPath(import.meta.url)), 'server.mjs');
  const child = spawn(
    process.execPath,
    [script, '--port', '0', '--host', '127.0.0.1', '--data', data, '--no-app', '--trust-proxy'],
    { env, stdio: ['ignore', 'pipe', 'inherit'] },
  );
  return new Promise((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (chunk: Buffer) => {
      out += chunk.toString();
      const m = /listening on (http:\/\/[^\s]+)/.exec(out);
      if (m) resolve({ child, base: m[1]! });
    });
    child.on('exit', (code) => reject(new Error(`server exited with ${code} before listening:\n${out}`)));
  });
}

async function call(
  base: string,
  method: string,
  path: string,
  body: unknown,
  headers: Record<string, string> = {},
) {
  const res = await fetch(`${base}${API}${path}`, {
    method,
    headers: { ...(body === undefined ? {} : { 'content-type': 'application/json' }), ...headers },
    ...(body === undefined ? {} : { body: JSON.stringify(body) }),
  });
  const json = (await res.json().catch(() => null)) as Record<string, unknown> | null;
  if (!res.ok) throw new Error(`${method} ${path}: ${res.status} ${JSON.stringify(json)}`);
  return json!;
}

function quantile(sorted: number[], q: number): number {
  // linear interpolation between order statistics (Hyndman & Fan 1996, definition 7)
  const h = (sorted.length - 1) * q;
  const lo = Math.floor(h);
  return (
    sorted[lo]! + (h - lo) * ((sorted[Math.min(lo + 1, sorted.length - 1)] ?? sorted[lo]!) - sorted[lo]!)
  );
}

async function main(): Promise<void> {
  const flags = parseFlags(process.argv.slice(2));
  const url = process.env.DATABASE_URL;
  const schema = url ? `crew_bench_${randomUUID().replace(/-/g, '').slice(0, 12)}` : undefined;
  const data = mkdtempSync(join(tmpdir(), 'crew-bench-'));
  const env = { ...process.env, ...(schema ? { DATABASE_SCHEMA: schema } : {}) };
  const backend = url ? 'PostgreSQL' : 'PGlite';
  const { child, base } = await startServer(env, data);
  try {
    const study = { ...newStudy({ unit: 'mg/kg' }), name: 'Load benchmark' };
    const devices = Array.from(
      { length: flags.phones },
      (_, i) => `bench-phone-${String(i).padStart(3, '0')}`,
    );
    const shared = await call(
      base,
      'POST',
      '/studies',
      { study, device: devices[0], shareKey: newShareKey() },
      { 'x-forwarded-for': '10.9.0.0' },
    );
    const tokens = [shared.token as string];
    for (let i = 1; i < devices.length; i++) {
      const joined = await call(
        base,
        'POST',
        '/join',
        { code: shared.crewCode, device: devices[i] },
        { 'x-forwarded-for': `10.9.${i >> 8}.${i & 255}` },
      );
      tokens.push(joined.token as string);
    }
    const t0 = Date.parse('2026-05-04T07:00:00Z');
    const logs = devices.map((device, p) =>
      Array.from({ length: flags.entries }, (_, k) => ({
        id: randomUUID(),
        studyId: study.id,
        seq: k + 1,
        at: new Date(t0 + k * 60_000).toISOString().replace('Z', '+00:00'),
        value: 40 + ((p * 7919 + k * 104_729) % 1000) / 100,
        device,
        note: `plot ${k + 1}`,
      })),
    );
    const latencies: number[] = [];
    let stored = 0;
    let next = 0;
    const started = performance.now();
    const worker = async () => {
      for (let p = next++; p < devices.length; p = next++) {
        const log = logs[p]!;
        for (let i = 0; i < log.length; i += flags.batch) {
          const t = performance.now();
          const r = await call(
            base,
            'POST',
            `/studies/${study.id}/events`,
            { events: log.slice(i, i + flags.batch) },
            { authorization: `Bearer ${tokens[p]}` },
          );
          latencies.push(performance.now() - t);
          stored += r.stored as number;
        }
      }
    };
    await Promise.all(Array.from({ length: Math.min(flags.concurrency, devices.length) }, worker));
    const seconds = (performance.now() - started) / 1000;
    const seen = new Map<string, number>();
    let cursor = '0';
    for (;;) {
      const page = await call(
        base,
        'GET',
        `/studies/${study.id}/events?after=${cursor}&limit=500`,
        undefined,
        {
          authorization: `Bearer ${tokens[0]}`,
        },
      );
      for (const e of page.events as { id: string }[]) seen.set(e.id, (seen.get(e.id) ?? 0) + 1);
      cursor = page.cursor as string;
      if (!page.more) break;
    }
    const expected = flags.phones * flags.entries;
    const missing = logs.flat().filter((e) => seen.get(e.id) !== 1).length;
    const exactlyOnce = stored === expected && seen.size === expected && missing === 0;
    const sorted = [...latencies].sort((a, b) => a - b);
    const ms = (v: number) => Math.round(v * 10) / 10;
    const result = {
      backend,
      date: new Date().toISOString(),
      node: process.version,
      cpus: cpus().length,
      phones: flags.phones,
      entriesPerPhone: flags.entries,
      batch: flags.batch,
      concurrency: flags.concurrency,
      pushes: latencies.length,
      entries: expected,
      stored,
      pulledDistinct: seen.size,
      exactlyOnce,
      seconds: Math.round(seconds * 100) / 100,
      entriesPerSecond: Math.round(expected / seconds),
      pushMs: {
        p50: ms(quantile(sorted, 0.5)),
        p95: ms(quantile(sorted, 0.95)),
        p99: ms(quantile(sorted, 0.99)),
        max: ms(sorted.at(-1)!),
      },
    };
    // one file for both backends: this run replaces the earlier run on the same backend
    let runs: Record<string, typeof result> = {};
    if (existsSync(`${flags.out}.json`))
      runs = (JSON.parse(readFileSync(`${flags.out}.json`, 'utf8')) as { runs?: typeof runs }).runs ?? {};
    runs[backend] = result;
    writeFileSync(`${flags.out}.json`, `${JSON.stringify({ runs }, null, 2)}\n`);
    const row = (r: typeof result) =>
      `| ${r.backend} | ${r.date.slice(0, 10)} | ${r.phones} × ${r.entriesPerPhone}, batches of ${r.batch}, ${r.concurrency} at once | ${r.exactlyOnce ? 'yes' : 'NO'} (${r.stored} stored, ${r.pulledDistinct} distinct pulled) | ${r.pushMs.p50} | ${r.pushMs.p95} | ${r.pushMs.p99} | ${r.pushMs.max} | ${r.entriesPerSecond} |`;
    const md = [
      '# Crew server load benchmark',
      '',
      '`npm run bench:server` (PGlite) and `DATABASE_URL=postgres://… npm run bench:server` (PostgreSQL): simulated',
      'phones push their entries in batches to one server process on loopback (test/bench/server-load.ts).',
      `Machine: ${result.cpus} CPUs shared with other work, Node ${process.version}. Latency in ms per push request.`,
      '',
      '| backend | date | load | every entry stored exactly once | p50 | p95 | p99 | max | entries/s |',
      '| --- | --- | --- | --- | --- | --- | --- | --- | --- |',
      ...Object.values(runs).map(row),
      '',
    ].join('\n');
    writeFileSync(`${flags.out}.md`, md);
    console.log(row(result));
    if (!exactlyOnce) process.exitCode = 1;
  } finally {
    child.kill('SIGTERM');
    await new Promise((r) => child.once('exit', r));
    rmSync(data, { recursive: true, force: true });
    if (url && schema) {
      const c = new pg.Client({ connectionString: url });
      await c.connect();
      await c.query(`drop schema if exists ${schema} cascade`);
      await c.end();
    }
  }
}

main().catch((err: unknown) => {
  console.error(`server-load: ${err instanceof Error ? err.message : String(err)}`);
  process.exit(2);
});
