/**
 * A crew of two phones on a real crew server (src/server, serving the built app on its own origin, so the
 * app's `connect-src 'self'` is exactly this server): one phone shares a study, the other joins with the
 * crew code; both go offline, enter readings, come back; both show the same pooled verdict, and it is the
 * one that `sure-enough merge` of the two phones' own bundles followed by `sure-enough assess` gives.
 *
 * The server runs on PostgreSQL when DATABASE_URL is set (CI starts a throwaway cluster: .ci/run), in a
 * schema of its own; otherwise on the embedded PGlite in a temporary folder.
 *
 * Data: the first 16 readings of NIST/SEMATECH e-Handbook dataset ZARR13 (heat flow meter calibration,
 * test/fixtures/stats-zarr13.json), dealt to the two phones.
 */
import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import { existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type BrowserContext, expect, type Page, test } from '@playwright/test';
import pg from 'pg';
import { keyIn, parseInterval, waitForServiceWorker } from './helpers.ts';
import { PHONE } from './playwright.config.ts';

const root = join(import.meta.dirname, '..');
const zarr13 = JSON.parse(readFileSync(join(root, 'test/fixtures/stats-zarr13.json'), 'utf8')) as {
  values: number[];
};
const readings = zarr13.values.slice(0, 16);
/** The phone sizes of e2e/screens.spec.ts (WCAG 2.2 SC 1.4.4 and 1.4.10). */
const SIZES = [
  { name: '320x568', width: 320, height: 568, text: 1 },
  { name: '390x844', width: 390, height: 844, text: 1 },
  { name: '844x390', width: 844, height: 390, text: 1 },
  { name: '390x844-text200', width: 390, height: 844, text: 2 },
] as const;

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.on('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

let server: ChildProcess | undefined;
let base = '';
let dataDir = '';
let serverLog = '';
let schema = '';

test.beforeAll(async () => {
  const script = join(root, 'dist-server', 'server.mjs');
  if (!existsSync(script)) throw new Error('dist-server/server.mjs is missing: run npm run build:server');
  const port = await freePort();
  dataDir = mkdtempSync(join(tmpdir(), 'crew-e2e-'));
  const env: NodeJS.ProcessEnv = { ...process.env };
  if (env.DATABASE_URL) {
    schema = `crew_e2e_${randomUUID().replace(/-/g, '').slice(0, 12)}`;
    env.DATABASE_SCHEMA = schema;
  }
  server = spawn(
    process.execPath,
    [script, '--port', String(port), '--host', '127.0.0.1', '--app', 'dist', '--data', dataDir],
    { cwd: root, env, stdio: ['ignore', 'pipe', 'pipe'] },
  );
  server.stdout?.on('data', (d) => (serverLog += d));
  server.stderr?.on('data', (d) => (serverLog += d));
  base = `http://localhost:${port}`;
  for (let i = 0; i < 300; i++) {
    try {
      if ((await fetch(`${base}/`)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`the crew server did not start:\n${serverLog}`);
});

test.afterAll(async () => {
  server?.kill('SIGTERM');
  await new Promise((r) => setTimeout(r, 500));
  rmSync(dataDir, { recursive: true, force: true });
  if (process.env.DATABASE_URL && schema) {
    const client = new pg.Client({ connectionString: process.env.DATABASE_URL });
    await client.connect();
    await client.query(`drop schema if exists ${schema} cascade`);
    await client.end();
  }
});

async function phone(
  browser: import('@playwright/test').Browser,
): Promise<{ ctx: BrowserContext; page: Page }> {
  const ctx = await browser.newContext({ ...PHONE, baseURL: base });
  const page = await ctx.newPage();
  await page.goto('/');
  await waitForServiceWorker(page);
  const banner = page.getByRole('status').filter({ hasText: 'Ready to work offline' });
  await expect(banner).toBeVisible();
  await banner.getByRole('button', { name: 'OK' }).click();
  return { ctx, page };
}

async function openCrew(page: Page) {
  await page.getByTestId('crew-chip').click();
  const dialog = page.getByRole('dialog', { name: 'Crew' });
  await expect(dialog).toBeVisible();
  return dialog;
}

async function exportBundle(page: Page, studyId: string, file: string): Promise<void> {
  await page.goto(`/#/s/${studyId}/report`);
  const download = page.waitForEvent('download');
  await page.getByTestId('export-bundle').click();
  writeFileSync(file, readFileSync((await (await download).path())!, 'utf8'));
}

function cli(args: string[]): string {
  const r = spawnSync(process.execPath, [join(root, 'dist-cli/sure-enough.mjs'), ...args], {
    encoding: 'utf8',
  });
  if (r.status !== 0) throw new Error(`sure-enough ${args[0]} failed: ${r.stderr}`);
  return r.stdout;
}

test('two phones offline, then synced: the same pooled verdict on both, equal to merge + assess', async ({
  browser,
}) => {
  test.setTimeout(180_000);
  const a = await phone(browser);
  const b = await phone(browser);

  // phone A starts the study (a 20 % share must not go unseen: 14 entries before any verdict)
  await a.page.goto('/#/new');
  await a.page.getByLabel('Study name').fill('Heat flow meter, crew check');
  await a.page.getByRole('radio', { name: /^Measurement/ }).check();
  await a.page.getByLabel('Unit', { exact: true }).fill('W/(m2.K)');
  await a.page.getByRole('radio', { name: /^Margin/ }).check();
  await a.page.getByLabel('Target margin ±').fill('0.05');
  await a.page.getByLabel('Smallest share of the site that must not go unseen').fill('20');
  await a.page.getByLabel('I have read the cautions').check();
  await a.page.getByRole('button', { name: 'Start the study' }).click();
  await expect(a.page.getByTestId('verdict')).toBeVisible();
  const studyId = /#\/s\/([0-9a-f-]{36})/.exec(a.page.url())![1]!;

  // … shares it: the crew code as text (and as a QR code)
  let dialog = await openCrew(a.page);
  await dialog.getByRole('button', { name: 'Share with crew' }).click();
  const code = (await dialog.getByTestId('crew-code').textContent())!.trim();
  expect(code).toMatch(/^[0-9A-Z]{4}-[0-9A-Z]{4}-[0-9A-Z]{4}-[0-9A-Z]{4}$/);
  await expect(dialog.getByRole('img', { name: /QR code/ })).toBeVisible();
  await dialog.getByRole('button', { name: 'Close' }).click();

  // phone B joins by typing the code (lower case, with spaces: as read aloud)
  await b.page.getByRole('button', { name: 'Join a crew' }).click();
  await b.page.getByLabel('Crew code').fill(code.toLowerCase().replace(/-/g, ' '));
  await b.page.getByRole('button', { name: 'Join', exact: true }).click();
  await expect(b.page.getByTestId('verdict')).toBeVisible();
  expect(b.page.url()).toContain(studyId);

  // both lose signal and enter readings
  await a.ctx.setOffline(true);
  await b.ctx.setOffline(true);
  for (const [i, v] of readings.entries()) await keyIn(i % 2 === 0 ? a.page : b.page, String(v));
  await expect(a.page.getByTestId('crew-chip')).toContainText('waiting');
  await expect(b.page.getByTestId('crew-chip')).toContainText('waiting');
  // alone, each phone is below the crew's minimum
  await expect(a.page.getByTestId('n')).toHaveText('8');

  // signal again: both sync by themselves (each pushes its own entries) …
  await a.ctx.setOffline(false);
  await b.ctx.setOffline(false);
  for (const p of [a.page, b.page])
    await expect(p.getByTestId('crew-chip')).toHaveText('Crew · synced', { timeout: 30_000 });
  // … and opening the crew panel fetches what the other pushed
  for (const p of [a.page, b.page]) {
    dialog = await openCrew(p);
    await expect(dialog.getByTestId('crew-n')).toHaveText('n 16 from 2 phones', { timeout: 30_000 });
    await expect(p.getByTestId('crew-chip')).toContainText('synced');
  }
  // each phone's studies list says where the shared study's sync stands
  await b.page.goto('/');
  await expect(b.page.getByTestId('study-sync')).toHaveText(/^Crew · synced · last sync \d\d:\d\d$/);
  await b.page.getByRole('button', { name: 'Join a crew' }).click();
  mkdirSync('test-results/screens/sizes', { recursive: true });
  await b.page.screenshot({ path: 'test-results/screens/sizes/390x844-studies-crew.png', fullPage: true });
  await b.page.goto(`/#/s/${studyId}`);
  await openCrew(b.page);
  const verdictA = await a.page.getByTestId('crew-verdict').textContent();
  const estimateA = await a.page.getByTestId('crew-estimate').textContent();
  expect(await b.page.getByTestId('crew-verdict').textContent()).toBe(verdictA);
  expect(await b.page.getByTestId('crew-estimate').textContent()).toBe(estimateA);

  // the same as merge + assess on the two phones' own bundles
  const dir = mkdtempSync(join(tmpdir(), 'crew-bundles-'));
  await exportBundle(a.page, studyId, join(dir, 'a.json'));
  await exportBundle(b.page, studyId, join(dir, 'b.json'));
  writeFileSync(join(dir, 'merged.json'), cli(['merge', join(dir, 'a.json'), join(dir, 'b.json')]));
  const core = JSON.parse(cli(['assess', join(dir, 'merged.json')])) as {
    n: number;
    verdict: string;
    estimate: number;
    lower: number;
    upper: number;
  };
  rmSync(dir, { recursive: true, force: true });
  expect(core.n).toBe(16);
  expect(verdictA).toBe(core.verdict);
  const [lo, hi] = parseInterval(estimateA!);
  // shown to the study's precision: within half a unit of the last digit shown
  const half = (text: string) => 0.5 * 10 ** -(text.split('.')[1]?.length ?? 0);
  const shown = /(-?[\d.]+) to (-?[\d.]+)/.exec(estimateA!)!;
  expect(Math.abs(lo - core.lower)).toBeLessThanOrEqual(half(shown[1]!) + 1e-12);
  expect(Math.abs(hi - core.upper)).toBeLessThanOrEqual(half(shown[2]!) + 1e-12);

  // the crew panel on every phone size: nothing past the edge, a screenshot of each for review
  mkdirSync('test-results/screens/sizes', { recursive: true });
  await a.page.goto(`/#/s/${studyId}`);
  for (const size of SIZES) {
    await a.page.setViewportSize({ width: size.width, height: size.height });
    // the screen as it opens at this size (the last size's taps scrolled its pane)
    await a.page.reload();
    await expect(a.page.getByTestId('verdict')).toBeVisible();
    await a.page.evaluate((k) => {
      document.documentElement.style.fontSize = k === 1 ? '' : `${17 * k}px`;
    }, size.text);
    // a shared study's field screen keeps its essentials in view with the crew button added
    await a.page.screenshot({ path: `test-results/screens/sizes/${size.name}-field-shared.png` });
    const essentials = [
      a.page.getByTestId('verdict'),
      a.page.getByTestId('est-line'),
      a.page.getByTestId('more').or(a.page.getByTestId('done')),
      a.page.getByRole('button', { name: 'Save', exact: true }),
    ];
    for (const loc of essentials) {
      const seen = await loc.evaluate((el) => {
        const r = el.getBoundingClientRect();
        const inside =
          r.top >= 0 && r.left >= 0 && r.bottom <= innerHeight + 0.5 && r.right <= innerWidth + 0.5;
        const pts = [
          [r.left + r.width / 2, r.top + r.height / 2],
          [r.left + 2, r.top + 2],
          [r.right - 2, r.bottom - 2],
        ];
        const shown = pts.every(([x, y]) => {
          const hit = document.elementFromPoint(x as number, y as number);
          return hit !== null && (el === hit || el.contains(hit) || hit.contains(el));
        });
        return inside && shown
          ? 'ok'
          : `${el.getAttribute('data-testid') ?? el.textContent} not fully in view`;
      });
      expect(seen, size.name).toBe('ok');
    }
    dialog = await openCrew(a.page);
    await expect(dialog.getByTestId('crew-n')).toBeVisible();
    const wide = await dialog.evaluate((el) =>
      [el, ...el.querySelectorAll<HTMLElement>('*')]
        .filter((x) => (x as HTMLElement).offsetParent !== null || x === el)
        .map((x) => ({ x, r: x.getBoundingClientRect() }))
        .filter(({ r }) => r.width > 0 && (r.right > window.innerWidth + 0.5 || r.left < -0.5))
        .map(
          ({ x, r }) =>
            `${x.tagName.toLowerCase()}.${x.className} ${Math.round(r.left)}–${Math.round(r.right)}`,
        ),
    );
    expect(wide, `${size.name}: crew panel past the edge`).toEqual([]);
    const scroll = await a.page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(scroll, `${size.name}: page scrolls sideways`).toBeLessThanOrEqual(0);
    for (const name of ['Sync now', 'Close'])
      expect((await dialog.getByRole('button', { name }).boundingBox())!.height).toBeGreaterThanOrEqual(44);
    await a.page.screenshot({ path: `test-results/screens/sizes/${size.name}-crew-panel.png` });
    await dialog.getByRole('button', { name: 'Close' }).click();
  }
  await a.ctx.close();
  await b.ctx.close();
});
