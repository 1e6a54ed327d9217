// `npm run bench`: the performance benchmark of the budgets in DEVELOPERS.md, in headless Chromium on a phone
// profile (390×844, touch) with the CPU throttled 4× through the DevTools Protocol
// (Emulation.setCPUThrottlingRate). Not part of `npm test`: timings are measured, never asserted in tests.
//
//   node e2e/bench/run.mjs [--dist <dir>]     (default dist/; built with `vite build` when missing)
//
// Figures (each printed with its budget and written to bench-results.json as
// [{"name","value","unit","budget","pass"}]; budget and pass are null where DEVELOPERS.md sets none):
// - tap → saved → re-rendered, with 5,000 observations already in the study: from the Save tap's
//   pointerdown (Event.timeStamp) to the DOM showing "Saved #k" (set only after the IndexedDB commit)
//   together with the new n, then the next animation frame; median and 95th percentile over 60 taps after
//   5 warm-up taps. The same with 50 observations, to show the per-entry cost does not grow with n.
// - cold start from the service-worker cache, offline: a relaunched browser on the same profile, offline,
//   4×; from navigation start (performance.now() = 0) to the entry pad's Save button being enabled;
//   median of 3 launches for a study with 50 observations, 1 launch with 5,000 observations.
// - opening the Report screen of a 10,000-entry study (no budget; reported because it is slow).
// - the app shell's gzipped JavaScript (.ci/size-check.mjs, the same figure `npm test` checks).
// - exporting 10,000 entries (bundle, and CSV + dictionary) from the Report screen: from the tap to the
//   file being handed to the browser (the download link the app creates); median of 3.
// Studies are seeded with raw IndexedDB calls in the page, in the documented schema
// (web/storage/SCHEMA-v1.md), so that seeding is fast and the app reads them as its own.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
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

/** Taps Save `count` times on the field screen; returns tap → saved → re-rendered times (ms). */
async function tapLatencies(page, studyId, count, warmup) {
  await page.goto(`/#/s/${studyId}`);
  const save = page.locator('button.save');
  await page.waitForFunction(
    () => {
      const b = document.querySelector('button.save');
      return b !== null && !b.disabled;
    },
    null,
    { timeout: 120_000 },
  );
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
  const n0 = Number(await page.getByTestId('n').textContent());
  const dom = [];
  const frame = [];
  for (let i = 0; i < count + warmup; i++) {
    const n = n0 + i + 1;
    await page.locator('#value-input').fill(String(18 + (i % 7) * 0.5).replace('.', ','));
    await page.evaluate((target) => {
      window.__benchDone = new Promise((resolve) => {
        const check = () => {
          const msg = document.querySelector('[data-testid="pad-msg"]');
          const nEl = document.querySelector('[data-testid="n"]');
          if (msg?.getAttribute('data-committed') === '1' && nEl?.textContent === String(target)) {
            const t = performance.now();
            mo.disconnect();
            requestAnimationFrame(() =>
              resolve({ dom: t - window.__benchT0, frame: performance.now() - window.__benchT0 }),
            );
          }
        };
        const mo = new MutationObserver(check);
        mo.observe(document.body, { subtree: true, childList: true, characterData: true, attributes: true });
      });
    }, n);
    await save.tap();
    const r = await page.evaluate(() => window.__benchDone);
    if (i >= warmup) {
      dom.push(r.dom);
      frame.push(r.frame);
    }
  }
  return { dom, frame };
}

/** Cold start: relaunch on the profile, offline, throttled; navigation start → Save enabled (ms). */
async function coldStart(profile, baseURL, studyId) {
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
    await ctx.addInitScript(() => {
      const check = () => {
        const b = document.querySelector('button.save');
        if (b && !b.disabled && window.__interactiveAt === undefined)
          window.__interactiveAt = performance.now();
      };
      window.__interactiveObserver = new MutationObserver(check);
      window.__interactiveObserver.observe(document, { subtree: true, childList: true, attributes: true });
      // and once per frame, in case the enabling change is not seen as a mutation
      const frame = () => {
        check();
        if (window.__interactiveAt === undefined) requestAnimationFrame(frame);
      };
      requestAnimationFrame(frame);
    });
    await throttle(page);
    const resp = await page.goto(`/#/s/${studyId}`);
    if (!resp?.fromServiceWorker()) throw new Error('cold start was not served by the service worker');
    try {
      await page.waitForFunction(() => window.__interactiveAt !== undefined, null, { timeout: 300_000 });
    } catch (err) {
      log(
        'cold start: the pad never became ready:',
        await page.evaluate(() => [
          document.querySelector('button.save')?.outerHTML,
          String(window.__interactiveAt),
          String(window.__interactiveObserver),
          performance.now(),
          document.readyState,
        ]),
      );
      throw err;
    }
    return await page.evaluate(() => window.__interactiveAt);
  } finally {
    await ctx.close();
  }
}

/** Export from the Report screen: tap → the download link handed to the browser (ms); checks the file. */
async function exportTime(page, studyId, format, expectEvents) {
  await page.goto(`/#/s/${studyId}/report`);
  const btn = page.getByTestId(`export-${format}`);
  await btn.waitFor({ timeout: 300_000 });
  await page.waitForFunction((f) => {
    const b = document.querySelector(`[data-testid="export-${f}"]`);
    return b && !b.disabled;
  }, format);
  await page.evaluate(() => {
    window.__benchT0 = 0;
    document.addEventListener(
      'pointerdown',
      (e) => {
        window.__benchT0 = e.timeStamp;
      },
      { capture: true, once: true },
    );
    window.__benchDone = new Promise((resolve) => {
      const mo = new MutationObserver((records) => {
        for (const r of records)
          for (const node of r.addedNodes)
            if (node instanceof HTMLAnchorElement && node.download) {
              mo.disconnect();
              resolve(performance.now() - window.__benchT0);
              return;
            }
      });
      mo.observe(document.body, { childList: true, subtree: true });
    });
  });
  const downloads = [];
  const onDownload = (d) => downloads.push(d);
  page.on('download', onDownload);
  await btn.tap();
  const ms = await page.evaluate(() => window.__benchDone);
  await page.waitForFunction(() =>
    /Downloaded/.test(document.querySelector('[data-testid="handover-status"]')?.textContent ?? ''),
  );
  page.off('download', onDownload);
  const first = downloads[0];
  if (!first) throw new Error(`export ${format}: no download`);
  const text = readFileSync(await first.path(), 'utf8');
  const count = format === 'bundle' ? JSON.parse(text).events.length : text.trim().split(/\r?\n/).length - 1; // CSV: minus header
  if (count !== expectEvents)
    throw new Error(`export ${format}: ${count} records in the file, expected ${expectEvents}`);
  return ms;
}

const results = [];
function add(name, value, unit, budget, better = 'lower') {
  const pass = budget === null ? null : better === 'lower' ? value <= budget : value >= budget;
  results.push({ name, value: Math.round(value * 10) / 10, unit, budget, pass });
}

async function main() {
  ensureBuild();
  const port = await freePort();
  const preview = await startPreview(port);
  const profile = mkdtempSync(join(tmpdir(), 'se-bench-'));
  log(`serving ${dist} at ${preview.url}; profile ${profile}`);
  try {
    let ctx = await chromium.launchPersistentContext(profile, {
      executablePath: CHROMIUM,
      args: CHROME_ARGS,
      headless: true,
      baseURL: preview.url,
      ...PHONE,
    });
    let page = ctx.pages()[0] ?? (await ctx.newPage());
    await page.goto('/');
    await waitForServiceWorker(page);
    await page.getByRole('heading', { level: 1 }).waitFor();
    log('seeding 5,000 + 50 + 10,000 observations');
    const big = await seedStudy(page, 'Bench: 5,000 observations', 5000);
    const small = await seedStudy(page, 'Bench: 50 observations', 50);
    const huge = await seedStudy(page, 'Bench: 10,000 observations', 10000);
    await throttle(page);

    const only = process.env.BENCH_ONLY;
    log(`tap → saved → re-rendered, ${TAPS} taps, 5,000 observations, CPU ×${THROTTLE}`);
    const bigT = only ? { dom: [0], frame: [0] } : await tapLatencies(page, big, TAPS, WARMUP);
    log(`the same with 50 observations`);
    const smallT = only ? { dom: [0], frame: [0] } : await tapLatencies(page, small, TAPS, WARMUP);

    log('open the Report screen of the 10,000-entry study');
    await page.goto(`/#/s/${small}`);
    await page.getByTestId('verdict').waitFor();
    const reportStart = Date.now();
    await page.goto(`/#/s/${huge}/report`);
    await page.getByTestId('export-bundle').waitFor({ timeout: 300_000 });
    const reportOpenMs = Date.now() - reportStart;
    log('export 10,000 entries');
    const bundleMs = [];
    const csvMs = [];
    for (let i = 0; i < (only ? 0 : 3); i++) {
      bundleMs.push(await exportTime(page, huge, 'bundle', 10000));
      csvMs.push(await exportTime(page, huge, 'csv', 10000));
    }
    await ctx.close();

    log('cold start offline from the service-worker cache (3 launches each)');
    const coldSmall = [];
    const coldBig = [];
    for (let i = 0; i < 3; i++) coldSmall.push(await coldStart(profile, preview.url, small));
    // one launch only with 5,000: each takes a long time (see the report)
    coldBig.push(await coldStart(profile, preview.url, big));
    ctx = undefined;
    page = undefined;

    const shell = shellGzipBytes(dist);

    add('tap → saved → re-rendered, median (5,000 observations, CPU ×4)', median(bigT.dom), 'ms', null);
    add('tap → saved → re-rendered, p95 (5,000 observations, CPU ×4)', quantile(bigT.dom, 0.95), 'ms', 50);
    add('tap → saved → next frame, p95 (5,000 observations, CPU ×4)', quantile(bigT.frame, 0.95), 'ms', null);
    add('tap → saved → re-rendered, median (50 observations, CPU ×4)', median(smallT.dom), 'ms', null);
    add('tap → saved → re-rendered, p95 (50 observations, CPU ×4)', quantile(smallT.dom, 0.95), 'ms', 50);
    add(
      'cold start offline → entry pad ready, median of 3 (50 observations, CPU ×4)',
      median(coldSmall),
      'ms',
      1000,
    );
    add(
      'cold start offline → entry pad ready, 1 launch (5,000 observations, CPU ×4)',
      median(coldBig),
      'ms',
      1000,
    );
    add('open the Report screen of a 10,000-entry study (CPU ×4)', reportOpenMs, 'ms', null);
    add('app shell JavaScript, gzipped', shell.total / 1024, 'KB', SHELL_BUDGET_BYTES / 1024);
    add('all JavaScript (shell + chunks loaded after first paint), gzipped', shell.all / 1024, 'KB', null);
    add('export 10,000 entries as a study bundle, median of 3 (CPU ×4)', median(bundleMs), 'ms', null);
    add('export 10,000 entries as CSV + dictionary, median of 3 (CPU ×4)', median(csvMs), 'ms', null);

    const details = {
      tapsMs5000: bigT.dom.map((x) => Math.round(x * 10) / 10),
      tapsMs50: smallT.dom.map((x) => Math.round(x * 10) / 10),
      coldStartMs50: coldSmall,
      coldStartMs5000: coldBig,
      exportBundleMs: bundleMs,
      exportCsvMs: csvMs,
      reportOpenMs,
      shellFiles: shell.files,
    };
    writeFileSync(join(root, 'bench-results.json'), `${JSON.stringify(results, null, 2)}\n`);
    writeFileSync(join(root, 'test-results', 'bench-details.json'), `${JSON.stringify(details, null, 2)}\n`, {
      flag: 'w',
    });
  } finally {
    preview.stop();
    rmSync(profile, { recursive: true, force: true });
  }

  const w = Math.max(...results.map((r) => r.name.length));
  console.log(`${'figure'.padEnd(w)}  ${'value'.padStart(9)}  ${'budget'.padStart(9)}  status`);
  for (const r of results) {
    const v = `${r.value} ${r.unit}`;
    const b = r.budget === null ? '—' : `≤ ${r.budget} ${r.unit}`;
    const st = r.pass === null ? 'no budget' : r.pass ? 'ok' : 'OVER BUDGET';
    console.log(`${r.name.padEnd(w)}  ${v.padStart(9)}  ${b.padStart(9)}  ${st}`);
  }
  const failed = results.filter((r) => r.pass === false);
  console.log(
    failed.length === 0
      ? 'all budgets met'
      : `${failed.length} over budget: ${failed.map((r) => `${r.name} = ${r.value} ${r.unit}`).join('; ')}`,
  );
  process.exitCode = failed.length === 0 ? 0 : 1;
}

main().catch((err) => {
  console.error(err);
  process.exitCode = 2;
});
