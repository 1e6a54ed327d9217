// `npm run bench`: the app's speed against the machine's own floor, measured in the same run, in headless
// Chromium on a phone profile (390×844, touch) with the CPU throttled 4× through the DevTools Protocol
// (Emulation.setCPUThrottlingRate). Not part of `npm test`: timings are measured, never asserted in tests.
//
//   node e2e/bench/run.mjs [--dist <dir>]     (default dist/; built with `vite build` when missing — run
//                                              `npm run build` first after a change)
//
// The floors are bare pages (e2e/bench/floor/, served on their own origin) doing the least the app's job
// needs, on the same profile and throttle:
// - blank page: a tap changes one text;
// - bare write: a tap → one IndexedDB add() of an app-shaped record, strict durability → text once committed;
// - bare open-and-read: a relaunched browser, offline, a page served by a bare service worker opens
//   IndexedDB and reads a study's records (50, and 5,000 for comparison) with one getAll.
// Every tap, app or floor, is timed by the same script: from the tap's pointerdown (Event.timeStamp) to the
// animation frame after the DOM first shows the awaited state; 60 taps after 5 warm-up taps. The app's value
// is typed on its own keys before each tap, outside the timing. Cold starts:
// navigation start (performance.now() = 0) → the app's Save button enabled / the floor's records shown;
// 3 launches of each, interleaved so that a load change on the machine hits app and floor alike.
// Goals (issue 14), each a ratio to a floor of the same run, exit code 1 when one is over:
// - tap → acknowledgement on screen (the pad says "Saving…"), p95 ≤ 1.3 × the blank-page floor's p95;
// - tap → durably saved ("Saved #k", set only after the commit), p95 ≤ 1.5 × the bare-write floor's p95;
//   both with 5,000 and with 50 entries in the study;
// - cold start offline with 5,000 entries ≤ 1.2 × the bare open-and-read floor at 50 records, and ≤ 1.1 ×
//   the app's own cold start with 50 entries (medians).
// Also reported, without a goal: tap → statistics on screen, the floor at 5,000 records, opening the Report
// screen of a 10,000-entry study, and the app shell's gzipped JavaScript (its 60 KB budget is checked by
// .ci/size-check.mjs in `npm test` as well).
// bench-results.json: [{"name","value","unit","goal","pass","beside"}] (goal and pass null where none;
// `beside` the absolute medians and p95s); every sample is in test-results/bench-details.json.
// The app's studies are seeded with raw IndexedDB calls in the documented schema (web/storage/SCHEMA-v3.md);
// the taps then save through the app, which writes each study's running snapshot once saves pause, so the
// cold starts open from it as a crew's phone would.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer as createHttpServer } from 'node:http';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { extname, join, resolve } from 'node:path';
import { chromium } from '@playwright/test';
import { SHELL_BUDGET_BYTES, shellGzipBytes } from '../../.ci/size-check.mjs';

// Same browser and flags as e2e/playwright.config.ts (a .ts file, which plain Node does not load).
const CHROMIUM = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
const CHROME_ARGS = [
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];
const PHONE = { viewport: { width: 390, height: 844 }, deviceScaleFactor: 2, isMobile: true, hasTouch: true };
const THROTTLE = 4;
const TAPS = 60;
const WARMUP = 5;

const root = resolve(import.meta.dirname, '..', '..');
const distArg = process.argv.indexOf('--dist');
const dist = resolve(root, distArg > 0 ? process.argv[distArg + 1] : 'dist');

function log(...a) {
  console.error('[bench]', ...a);
}

function ensureBuild() {
  if (existsSync(join(dist, 'sw.js')) && existsSync(join(dist, 'index.html'))) return;
  log(`building into ${dist}`);
  const r = spawnSync('npx', ['vite', 'build', '--outDir', dist, '--emptyOutDir'], {
    cwd: root,
    stdio: 'inherit',
  });
  if (r.status !== 0 || !existsSync(join(dist, 'sw.js'))) throw new Error('build failed (no sw.js)');
}

function freePort() {
  return new Promise((res, rej) => {
    const s = createServer();
    s.once('error', rej);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address();
      s.close(() => res(port));
    });
  });
}

async function startPreview(port) {
  const child = spawn('npx', ['vite', 'preview', '--port', String(port), '--strictPort', '--outDir', dist], {
    cwd: root,
    detached: true,
    stdio: 'ignore',
  });
  const url = `http://localhost:${port}`;
  for (let i = 0; i < 150; i++) {
    try {
      const r = await fetch(url);
      if (r.ok) return { url, stop: () => process.kill(-child.pid, 'SIGTERM') };
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  process.kill(-child.pid, 'SIGTERM');
  throw new Error('vite preview did not start');
}

const quantile = (xs, q) => {
  const s = [...xs].sort((a, b) => a - b);
  const i = (s.length - 1) * q;
  const lo = Math.floor(i);
  return s[lo] + (s[Math.ceil(i)] - s[lo]) * (i - lo);
};
const median = (xs) => quantile(xs, 0.5);

async function throttle(page) {
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: THROTTLE });
  return cdp;
}

async function waitForServiceWorker(page) {
  await page.evaluate(async () => {
    await navigator.serviceWorker.ready;
  });
  if (!(await page.evaluate(() => navigator.serviceWorker.controller !== null))) await page.reload();
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
}

/** Writes a study and `n` entries with raw IndexedDB calls (documented schema), in one transaction. */
async function seedStudy(page, name, n) {
  return page.evaluate(
    ({ name, n }) =>
      new Promise((resolve, reject) => {
        const pad = (x, w = 2) => String(Math.abs(x)).padStart(w, '0');
        const iso = (d) => {
          const off = -d.getTimezoneOffset();
          return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}:${pad(d.getSeconds())}.${pad(d.getMilliseconds(), 3)}${off >= 0 ? '+' : '-'}${pad(Math.trunc(off / 60))}:${pad(off % 60)}`;
        };
        // xorshift + Box–Muller: values around 20 with spread 3, reproducible
        let s = 2463534242;
        const u = () => {
          s ^= s << 13;
          s ^= s >>> 17;
          s ^= s << 5;
          return ((s >>> 0) + 0.5) / 4294967296;
        };
        const normal = () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
        const id = crypto.randomUUID();
        const device = 'bench-device';
        const start = Date.now() - n * 30_000;
        const req = indexedDB.open('sure-enough');
        req.onerror = () => reject(req.error);
        req.onsuccess = () => {
          const db = req.result;
          const tx = db.transaction(['studies', 'observations'], 'readwrite');
          const now = iso(new Date());
          tx.objectStore('studies').add({
            id,
            name,
            createdAt: iso(new Date(start - 60_000)),
            version: 1,
            setup: {
              kind: 'measurement',
              unit: 'mg/L',
              level: 0.95,
              sided: 'two',
              rule: 'standard',
              min: 10,
              target: { kind: 'margin', value: 0.01 },
              decimalSeparator: '.',
            },
            cautionsAcceptedAt: now,
            device,
            ...(n > 0 ? { lockedAt: iso(new Date(start)) } : {}),
          });
          const obs = tx.objectStore('observations');
          for (let i = 0; i < n; i++)
            obs.add({
              id: crypto.randomUUID(),
              studyId: id,
              seq: i + 1,
              at: iso(new Date(start + i * 30_000)),
              device,
              value: Math.round((20 + 3 * normal()) * 1000) / 1000,
            });
          tx.oncomplete = () => {
            db.close();
            resolve(id);
          };
          tx.onerror = () => reject(tx.error);
        };
      }),
    { name, n },
  );
}

/**
 * Measures `count` taps (after `warmup` more) on a page: from the tap's pointerdown (Event.timeStamp) to the
 * animation frame after the DOM first shows each awaited state, so that every page — the app and the
 * floors — is timed by the same script. `states` names the awaited states and how the page shows them
 * (evaluated in the page); `before(i)` prepares each tap (typing a value), outside the timing.
 */
async function timeTaps(page, target, states, count, warmup, before = async () => {}) {
  await page.evaluate(() => {
    window.__benchT0 = 0;
    document.addEventListener(
      'pointerdown',
      (e) => {
        window.__benchT0 = e.timeStamp;
      },
      true,
    );
  });
  const out = Object.fromEntries(Object.keys(states).map((k) => [k, []]));
  for (let i = 0; i < count + warmup; i++) {
    await before(i);
    await page.evaluate((states) => {
      const tests = Object.fromEntries(Object.entries(states).map(([k, src]) => [k, new Function('s', src)]));
      const snap = {
        msg: document.querySelector('[data-testid="pad-msg"]')?.textContent ?? '',
        out: document.getElementById('out')?.textContent ?? '',
        n: document.querySelector('[data-testid="n"]')?.textContent ?? '',
      };
      window.__benchDone = new Promise((resolve) => {
        const got = {};
        let left = Object.keys(tests).length;
        const check = () => {
          for (const [k, test] of Object.entries(tests)) {
            if (k in got || !test(snap)) continue;
            got[k] = null;
            requestAnimationFrame(() => {
              got[k] = performance.now() - window.__benchT0;
              if (--left === 0) {
                mo.disconnect();
                resolve(got);
              }
            });
          }
        };
        const mo = new MutationObserver(check);
        mo.observe(document.body, { subtree: true, childList: true, characterData: true, attributes: true });
      });
    }, states);
    await target.tap();
    const r = await page.evaluate(() => window.__benchDone);
    if (i >= warmup) for (const k of Object.keys(states)) out[k].push(r[k]);
  }
  return out;
}

// How the app shows each state (s: the page's texts just before the tap).
const APP_STATES = {
  // the pad's own re-render: the Save button says "Saving…" (or the save was already acknowledged)
  ack: `const m = document.querySelector('[data-testid="pad-msg"]');
        return /Saving/.test(document.querySelector('button.save')?.textContent ?? '') ||
          (m?.getAttribute('data-committed') === '1' && m.textContent !== s.msg);`,
  // "Saved #k" — set only after the IndexedDB transaction committed
  saved: `const m = document.querySelector('[data-testid="pad-msg"]');
          return m?.getAttribute('data-committed') === '1' && m.textContent !== s.msg;`,
  // the statistics: the count of entries moved on
  stats: `const n = document.querySelector('[data-testid="n"]')?.textContent;
          return n !== undefined && n !== s.n;`,
};
const FLOOR_TEXT = { ack: `return document.getElementById('out')?.textContent !== s.out;` };
const FLOOR_SAVED = {
  saved: `return /^Saved #/.test(document.getElementById('out')?.textContent ?? '') && document.getElementById('out').textContent !== s.out;`,
};

/** Taps Save on the app's field screen. */
async function appTaps(page, studyId, count, warmup) {
  await page.goto(`/#/s/${studyId}`);
  await page.waitForFunction(
    () => {
      const b = document.querySelector('button.save');
      return b !== null && !b.disabled;
    },
    null,
    { timeout: 120_000 },
  );
  const keys = page.locator('.pad .keys');
  return timeTaps(page, page.locator('button.save'), APP_STATES, count, warmup, async (i) => {
    // typed on the pad's own keys, as a crew types (the display takes no keyboard: inputMode "none"); the
    // study's decimal separator is the point unless set otherwise (bench studies leave it unset)
    const value = String(18 + (i % 7) * 0.5);
    for (const ch of value)
      await keys.getByRole('button', { name: ch === '.' ? 'Decimal point' : ch, exact: true }).tap();
    await page.waitForFunction((v) => document.getElementById('value-input')?.value === v, value);
  });
}

/**
 * Tells the harness when the page is ready without touching the page meanwhile: `window.__readyAt` (set by
 * the app's readiness check below or by the floor page itself) is trapped and reported as a console
 * message. Waiting with page.waitForFunction would inject Playwright's selector engine into the page and
 * poll it every frame, on the same main thread as the start being timed (about 60 ms of script at ×1 on
 * this machine, landing in the middle of the app's start and not the floor's); a console message costs
 * neither.
 */
function readySignal() {
  let at;
  Object.defineProperty(window, '__readyAt', {
    configurable: true,
    get: () => at,
    set: (v) => {
      at = v;
      // the floor page sets its record count right after: read it once that script has run
      queueMicrotask(() =>
        console.debug(`__bench_ready ${JSON.stringify({ ms: v, count: window.__readCount ?? null })}`),
      );
    },
  });
}

/** Cold start: relaunch on the profile, offline, throttled; navigation start → `readyExpr` true (ms). */
async function coldStart(profile, baseURL, path, readyScript) {
  const ctx = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    args: CHROME_ARGS,
    headless: true,
    baseURL,
    ...PHONE,
  });
  try {
    await ctx.setOffline(true);
    const page = ctx.pages()[0] ?? (await ctx.newPage());
    await ctx.addInitScript(readySignal);
    if (readyScript) await ctx.addInitScript(readyScript);
    const ready = new Promise((resolve, reject) => {
      const timer = setTimeout(() => reject(new Error(`cold start of ${path}: not ready in 300 s`)), 300_000);
      page.on('console', (m) => {
        const text = m.text();
        if (!text.startsWith('__bench_ready ')) return;
        clearTimeout(timer);
        resolve(JSON.parse(text.slice('__bench_ready '.length)));
      });
    });
    await throttle(page);
    const resp = await page.goto(path);
    if (!resp?.fromServiceWorker())
      throw new Error(`cold start of ${path} was not served by the service worker`);
    return await ready;
  } finally {
    await ctx.close();
  }
}

/** The app is ready when the entry pad's Save button is enabled (seen by a mutation or the next frame). */
function appReady() {
  const check = () => {
    const b = document.querySelector('button.save');
    if (b && !b.disabled && window.__readyAt === undefined) window.__readyAt = performance.now();
  };
  new MutationObserver(check).observe(document, { subtree: true, childList: true, attributes: true });
  const frame = () => {
    check();
    if (window.__readyAt === undefined) requestAnimationFrame(frame);
  };
  requestAnimationFrame(frame);
}

/** Serves e2e/bench/floor/ (the floor pages) on its own origin, so its database and worker are its own. */
async function startFloorServer(port) {
  const dir = join(root, 'e2e', 'bench', 'floor');
  const types = { '.html': 'text/html; charset=utf-8', '.js': 'text/javascript; charset=utf-8' };
  const server = createHttpServer((req, res) => {
    const name = (req.url ?? '/').split(/[?#]/)[0].replace(/^\/+/, '') || 'blank.html';
    const file = join(dir, name);
    if (!/^[a-z-]+\.(html|js)$/.test(name) || !existsSync(file)) {
      res.writeHead(404).end();
      return;
    }
    res.writeHead(200, { 'content-type': types[extname(name)], 'cache-control': 'no-store' });
    res.end(readFileSync(file));
  });
  await new Promise((r) => server.listen(port, '127.0.0.1', r));
  return { url: `http://localhost:${port}`, stop: () => server.close() };
}

const results = [];
const r1 = (x) => Math.round(x * 10) / 10;
/** One figure: its value, and its goal (`≤ goal`) and pass where it has one; `beside` the absolute figures. */
function add(name, value, unit, goal = null, beside = '') {
  const pass = goal === null ? null : value <= goal;
  results.push({
    name,
    value: unit === '×' ? Math.round(value * 100) / 100 : r1(value),
    unit,
    goal,
    pass,
    beside,
  });
}
const ms = (xs) => `median ${r1(median(xs))} ms, p95 ${r1(quantile(xs, 0.95))} ms`;

async function launch(profile, baseURL) {
  const ctx = await chromium.launchPersistentContext(profile, {
    executablePath: CHROMIUM,
    args: CHROME_ARGS,
    headless: true,
    baseURL,
    ...PHONE,
  });
  return { ctx, page: ctx.pages()[0] ?? (await ctx.newPage()) };
}

async function main() {
  ensureBuild();
  const preview = await startPreview(await freePort());
  const floor = await startFloorServer(await freePort());
  const profile = mkdtempSync(join(tmpdir(), 'se-bench-'));
  const floorProfile = mkdtempSync(join(tmpdir(), 'se-bench-floor-'));
  log(`serving ${dist} at ${preview.url}, the floor pages at ${floor.url}`);
  const coldApp50 = [];
  const coldApp5000 = [];
  const coldFloor50 = [];
  const coldFloor5000 = [];
  let app5000;
  let app50;
  let blank;
  let write;
  let reportOpenMs;
  try {
    // ---- the app: seed, taps, report (online, service worker installed) ----
    let { ctx, page } = await launch(profile, preview.url);
    await page.goto('/');
    await waitForServiceWorker(page);
    await page.getByRole('heading', { level: 1 }).waitFor();
    log('seeding 5,000 + 50 + 10,000 observations');
    const big = await seedStudy(page, 'Bench: 5,000 observations', 5000);
    const small = await seedStudy(page, 'Bench: 50 observations', 50);
    const huge = await seedStudy(page, 'Bench: 10,000 observations', 10000);
    await throttle(page);
    log(`app: ${TAPS} taps with 5,000 observations, CPU ×${THROTTLE}`);
    app5000 = await appTaps(page, big, TAPS, WARMUP);
    log('app: the same with 50 observations');
    app50 = await appTaps(page, small, TAPS, WARMUP);
    // the running snapshot is written once saves pause; the cold starts below must find it current (taken
    // from the log as it is: same record count), or they would time the rebuild from the log instead
    await page.waitForFunction(
      (ids) =>
        new Promise((resolve) => {
          const req = indexedDB.open('sure-enough');
          req.onsuccess = () => {
            const tx = req.result.transaction(['snapshots', 'observations']);
            const idx = tx.objectStore('observations').index('byStudySeq');
            const checks = ids.map(
              (id) =>
                new Promise((ok) => {
                  const snap = tx.objectStore('snapshots').get(id);
                  const count = idx.count(IDBKeyRange.bound([id, 0], [id, Number.POSITIVE_INFINITY]));
                  tx.addEventListener('complete', () => ok(snap.result?.count === count.result));
                }),
            );
            Promise.all(checks).then((r) => {
              req.result.close();
              resolve(r.every(Boolean));
            });
          };
        }),
      [big, small],
      { timeout: 60_000, polling: 500 },
    );
    log('open the Report screen of the 10,000-entry study');
    const reportStart = Date.now();
    await page.goto(`/#/s/${huge}/report`);
    await page.getByTestId('export-bundle').waitFor({ timeout: 300_000 });
    reportOpenMs = Date.now() - reportStart;
    await ctx.close();

    // ---- the floors: blank tap, bare write (online; same phone profile and throttle) ----
    ({ ctx, page } = await launch(floorProfile, floor.url));
    await page.goto('/read.html#50');
    await waitForServiceWorker(page);
    await page.evaluate(() => Promise.all([floorSeed(50), floorSeed(5000)]));
    await throttle(page);
    log(`floor: blank page, ${TAPS} taps`);
    await page.goto('/blank.html');
    blank = await timeTaps(page, page.locator('#tap'), FLOOR_TEXT, TAPS, WARMUP);
    log(`floor: bare IndexedDB write, ${TAPS} taps`);
    await page.goto('/write.html');
    await page.waitForFunction(() => document.getElementById('out')?.textContent === 'ready');
    write = await timeTaps(page, page.locator('#tap'), FLOOR_SAVED, TAPS, WARMUP);
    await ctx.close();

    // ---- cold starts, offline, from each service worker's cache; interleaved so load drifts hit all ----
    log('cold starts offline (3 launches of each)');
    for (let i = 0; i < 3; i++) {
      coldApp50.push((await coldStart(profile, preview.url, `/#/s/${small}`, appReady)).ms);
      coldApp5000.push((await coldStart(profile, preview.url, `/#/s/${big}`, appReady)).ms);
      for (const [n, into] of [
        [50, coldFloor50],
        [5000, coldFloor5000],
      ]) {
        const r = await coldStart(floorProfile, floor.url, `/read.html#${n}`);
        if (r.count !== n) throw new Error(`floor read ${r.count} records, expected ${n}`);
        into.push(r.ms);
      }
    }
  } finally {
    preview.stop();
    floor.stop();
    rmSync(profile, { recursive: true, force: true });
    rmSync(floorProfile, { recursive: true, force: true });
  }

  const p95 = (xs) => quantile(xs, 0.95);
  for (const [label, app] of [
    ['5,000', app5000],
    ['50', app50],
  ]) {
    add(
      `tap → acknowledgement on screen, p95 ÷ blank-page floor p95 (${label} entries)`,
      p95(app.ack) / p95(blank.ack),
      '×',
      1.3,
      `app ${ms(app.ack)}; floor ${ms(blank.ack)}`,
    );
    add(
      `tap → durably saved ("Saved #k"), p95 ÷ bare-write floor p95 (${label} entries)`,
      p95(app.saved) / p95(write.saved),
      '×',
      1.5,
      `app ${ms(app.saved)}; floor ${ms(write.saved)}`,
    );
    add(
      `tap → statistics on screen (${label} entries), p95`,
      p95(app.stats),
      'ms',
      null,
      `app ${ms(app.stats)}`,
    );
  }
  const cm = (xs) => `median of 3 ${r1(median(xs))} ms (${xs.map(r1).join(', ')})`;
  add(
    'cold start offline, 5,000 entries ÷ bare open-and-read floor at 50 records (medians)',
    median(coldApp5000) / median(coldFloor50),
    '×',
    1.2,
    `app ${cm(coldApp5000)}; floor ${cm(coldFloor50)}`,
  );
  add(
    "cold start offline, 5,000 entries ÷ the app's own at 50 entries (medians)",
    median(coldApp5000) / median(coldApp50),
    '×',
    1.1,
    `5,000: ${cm(coldApp5000)}; 50: ${cm(coldApp50)}`,
  );
  add(
    'bare open-and-read floor, 5,000 records (for comparison)',
    median(coldFloor5000),
    'ms',
    null,
    cm(coldFloor5000),
  );
  add('open the Report screen of a 10,000-entry study (CPU ×4)', reportOpenMs, 'ms');
  const shell = shellGzipBytes(dist);
  add('app shell JavaScript, gzipped', shell.total / 1024, 'KB', SHELL_BUDGET_BYTES / 1024);
  add('all JavaScript (shell + chunks loaded after first paint), gzipped', shell.all / 1024, 'KB');

  const details = { app5000, app50, blank, write, coldApp50, coldApp5000, coldFloor50, coldFloor5000 };
  writeFileSync(join(root, 'bench-results.json'), `${JSON.stringify(results, null, 2)}\n`);
  mkdirSync(join(root, 'test-results'), { recursive: true });
  writeFileSync(join(root, 'test-results', 'bench-details.json'), `${JSON.stringify(details, null, 2)}\n`);

  const w = Math.max(...results.map((r) => r.name.length));
  console.log(`${'figure'.padEnd(w)}  ${'value'.padStart(9)}  ${'goal'.padStart(9)}  status  absolute`);
  for (const r of results) {
    const v = `${r.value} ${r.unit}`;
    const g = r.goal === null ? '—' : `≤ ${r.goal} ${r.unit}`;
    const st = r.pass === null ? '     ' : r.pass ? 'ok   ' : 'OVER ';
    console.log(`${r.name.padEnd(w)}  ${v.padStart(9)}  ${g.padStart(9)}  ${st}   ${r.beside}`);
  }
  const failed = results.filter((r) => r.pass === false);
  console.log(
    failed.length === 0
      ? 'all goals met'
      : `${failed.length} over goal: ${failed.map((r) => `${r.name} = ${r.value} ${r.unit}`).join('; ')}`,
  );
  process.exitCode = failed.length === 0 ? 0 : 1;
}

main().catch((err) => {
  console.error(err);
  process.exitCode = 2;
});
