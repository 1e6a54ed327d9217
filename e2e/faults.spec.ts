/**
 * Faults on the production build in real Chromium (phone profile): the browser killed right after a tap,
 * offline + reload + relaunch, two tabs, a schema upgrade from another tab, storage full, persistent
 * storage refused, and a database written by the first schema version. What is on disk is read with raw
 * IndexedDB calls, not through the app. Facts relied on: IndexedDB transactions are
 * atomic, an uncommitted one is absent after a crash (MDN, IDBTransaction); a version change waits until
 * every other connection closed (MDN, IDBDatabase versionchange event); a quota failure surfaces as a
 * transaction abort named QuotaExceededError (MDN, Storage quotas and eviction criteria).
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type BrowserContext, expect, type Page, test } from '@playwright/test';
import {
  expectSaved,
  isComplete,
  killBrowser,
  launchProfile,
  openFresh,
  rawLog,
  readStore,
  studyIdOf,
  typeAndSave,
} from './fixtures/browser.ts';
import { createMeasurementStudy } from './helpers.ts';
import { BASE_URL } from './playwright.config.ts';

const range = (n: number) => Array.from({ length: n }, (_, i) => i + 1);

async function firstPage(ctx: BrowserContext): Promise<Page> {
  return ctx.pages()[0] ?? (await ctx.newPage());
}

/** Everything the field screen says about the study: verdict, n, estimate, interval, "more". */
async function fieldFacts(page: Page) {
  await expect(page.getByTestId('verdict')).toBeVisible();
  const iv = page.getByTestId('interval');
  const more = page.getByTestId('more');
  return {
    verdict: await page.getByTestId('verdict').textContent(),
    n: await page.getByTestId('n').textContent(),
    estimate: await page.getByTestId('estimate').getAttribute('data-value'),
    lower: await iv.getAttribute('data-lower'),
    upper: await iv.getAttribute('data-upper'),
    more: (await more.count()) > 0 ? await more.textContent() : null,
  };
}

async function newStudy(page: Page, name: string): Promise<string> {
  await createMeasurementStudy(page, { name, unit: 'mg/kg', margin: '0,5' });
  return studyIdOf(page);
}

test.describe('browser killed', () => {
  let dir = '';
  test.afterEach(() => {
    if (dir) rmSync(dir, { recursive: true, force: true });
  });

  test('SIGKILL right after a tap: every entry shown as saved is there; the one in flight is whole or absent', async () => {
    test.setTimeout(90_000);
    dir = mkdtempSync(join(tmpdir(), 'se-kill-'));
    let ctx = await launchProfile(dir);
    let page = await firstPage(ctx);
    await openFresh(page);
    const id = await newStudy(page, 'Lead in topsoil, plot 4');
    const shown = ['12,5', '13,25', '11,75', '14'];
    for (const [i, v] of shown.entries()) {
      await typeAndSave(page, v);
      await expectSaved(page, i + 1);
    }

    // 1. the tap, then the kill at once: the entry is in flight
    await typeAndSave(page, '15,5');
    await killBrowser(dir);
    await ctx.close().catch(() => undefined);
    ctx = await launchProfile(dir);
    page = await firstPage(ctx);
    await page.goto(`/#/s/${id}`);
    let log = await rawLog(page, id);
    expect(log.every(isComplete), JSON.stringify(log)).toBe(true);
    expect(log.map((r) => r.seq)).toEqual(range(log.length));
    expect(log.slice(0, 4).map((r) => r.value)).toEqual([12.5, 13.25, 11.75, 14]);
    expect([4, 5]).toContain(log.length);
    if (log.length === 5) expect(log[4]!.value).toBe(15.5);
    await expect(page.getByTestId('n')).toHaveText(String(log.length));

    // 2. the kill the moment the pad says "saved": it must be on disk
    const next = log.length + 1;
    await typeAndSave(page, '9,75');
    await expectSaved(page, next);
    await killBrowser(dir);
    await ctx.close().catch(() => undefined);
    ctx = await launchProfile(dir);
    page = await firstPage(ctx);
    await page.goto(`/#/s/${id}`);
    log = await rawLog(page, id);
    expect(log.every(isComplete)).toBe(true);
    expect(log.map((r) => r.seq)).toEqual(range(next));
    expect(log.at(-1)!.value).toBe(9.75);
    await expect(page.getByTestId('n')).toHaveText(String(next));
    await ctx.close();
  });

  test('offline, reload and relaunch mid-study: nothing lost, the verdict unchanged', async () => {
    test.setTimeout(90_000);
    dir = mkdtempSync(join(tmpdir(), 'se-offline-'));
    let ctx = await launchProfile(dir);
    let page = await firstPage(ctx);
    await openFresh(page);
    const id = await newStudy(page, 'Copper, ditch bank');
    for (const [i, v] of ['21,4', '19,8', '23,1', '20,6', '22,2'].entries()) {
      await typeAndSave(page, v);
      await expectSaved(page, i + 1);
    }
    const before = await fieldFacts(page);

    await ctx.setOffline(true);
    const resp = await page.reload();
    expect(resp?.fromServiceWorker()).toBe(true);
    expect(await fieldFacts(page)).toEqual(before);
    for (const [i, v] of ['20,9', '21,7'].entries()) {
      await typeAndSave(page, v);
      await expectSaved(page, 6 + i);
    }
    const offlineFacts = await fieldFacts(page);
    expect(offlineFacts.n).toBe('7');
    await ctx.close();

    ctx = await launchProfile(dir);
    await ctx.setOffline(true);
    page = await firstPage(ctx);
    const again = await page.goto(`/#/s/${id}`);
    expect(again?.fromServiceWorker()).toBe(true);
    expect(await fieldFacts(page)).toEqual(offlineFacts);
    const log = await rawLog(page, id);
    expect(log.map((r) => r.value)).toEqual([21.4, 19.8, 23.1, 20.6, 22.2, 20.9, 21.7]);
    await ctx.close();
  });
});

test('two tabs: entries from both land in order, and a tab that saves shows them all', async ({
  context,
  page,
}) => {
  await openFresh(page);
  const id = await newStudy(page, 'Two phones? No: two tabs');
  const other = await context.newPage();
  await other.goto(`/#/s/${id}`);
  await expect(other.getByRole('button', { name: 'Save', exact: true })).toBeEnabled();

  const order: [Page, string, number][] = [
    [page, '1', 1],
    [other, '2', 2],
    [page, '3', 3],
    [other, '4', 4],
  ];
  for (const [tab, v, seq] of order) {
    await typeAndSave(tab, v);
    await expectSaved(tab, seq);
    // the tab that saved shows every entry on the phone, not only its own
    await expect(tab.getByTestId('n')).toHaveText(String(seq));
  }
  // both at the same moment: both land, with different seq numbers
  await page.locator('#value-input').fill('5');
  await other.locator('#value-input').fill('6');
  await Promise.all([
    page.getByRole('button', { name: 'Save', exact: true }).click(),
    other.getByRole('button', { name: 'Save', exact: true }).click(),
  ]);
  await expect(page.getByTestId('pad-msg')).toHaveAttribute('data-committed', '1');
  await expect(other.getByTestId('pad-msg')).toHaveAttribute('data-committed', '1');

  const log = await rawLog(page, id);
  expect(log.every(isComplete)).toBe(true);
  expect(log.map((r) => r.seq)).toEqual(range(6));
  expect(log.slice(0, 4).map((r) => r.value)).toEqual([1, 2, 3, 4]);
  expect(
    log
      .slice(4)
      .map((r) => r.value)
      .sort(),
  ).toEqual([5, 6]);
  for (const tab of [page, other]) {
    await tab.reload();
    await expect(tab.getByTestId('n')).toHaveText('6');
  }
});

test('a schema upgrade from another tab: this tab lets go of the database and asks for a reload', async ({
  context,
  page,
}) => {
  await openFresh(page);
  const id = await newStudy(page, 'Upgrade while open');
  await typeAndSave(page, '4,5');
  await expectSaved(page, 1);

  const newer = await context.newPage();
  await newer.goto('/');
  await expect(newer.getByRole('heading', { level: 1 })).toBeVisible();
  const result = await newer.evaluate(
    () =>
      new Promise<{ from: number; to: number; blocked: boolean; stores: string[] }>((resolve, reject) => {
        const probe = indexedDB.open('sure-enough');
        probe.onsuccess = () => {
          const from = probe.result.version;
          probe.result.close();
          const req = indexedDB.open('sure-enough', from + 1);
          let blocked = false;
          req.onblocked = () => {
            blocked = true;
          };
          req.onupgradeneeded = () => {
            req.result.createObjectStore('fromANewerVersion');
          };
          req.onsuccess = () => {
            const db = req.result;
            const stores = [...db.objectStoreNames];
            db.close();
            resolve({ from, to: db.version, blocked, stores });
          };
          req.onerror = () => reject(req.error);
        };
        probe.onerror = () => reject(probe.error);
      }),
  );
  // the upgrade could only run because every open connection (both tabs) was closed
  expect(result.to).toBe(result.from + 1);
  expect(result.blocked).toBe(false);
  expect(result.stores).toContain('observations');

  const alert = page.getByRole('alert').filter({ hasText: 'updated in another tab' });
  await expect(alert).toContainText('Reload');
  await expect(alert.getByRole('button', { name: 'Reload' })).toBeVisible();
  // a save in the old tab is refused, not shown as saved, and nothing is written
  await typeAndSave(page, '5,5');
  await expect(page.getByTestId('pad-msg')).toContainText(/reload/i);
  await expect(page.getByTestId('pad-msg')).not.toHaveAttribute('data-committed', '1');
  await expect(page.getByTestId('n')).toHaveText('1');
  expect((await rawLog(newer, id)).map((r) => r.value)).toEqual([4.5]);
});

test('storage full: a clear message, the entry not shown as saved, earlier entries intact, export still works', async () => {
  test.setTimeout(90_000);
  const dir = mkdtempSync(join(tmpdir(), 'se-quota-'));
  try {
    let ctx = await launchProfile(dir);
    let page = await firstPage(ctx);
    await openFresh(page);
    const id = await newStudy(page, 'Nitrate, well 7');
    for (const [i, v] of ['3,1', '2,9', '3,4'].entries()) {
      await typeAndSave(page, v);
      await expectSaved(page, i + 1);
    }
    await ctx.close();

    // Chromium reads the quota when it opens the origin's database files, so the override is set
    // on a relaunched browser before the app opens them (a quota of 1 byte: every write fails).
    ctx = await launchProfile(dir);
    page = await firstPage(ctx);
    const cdp = await ctx.newCDPSession(page);
    const origin = new URL(BASE_URL).origin;
    await cdp.send('Storage.overrideQuotaForOrigin', { origin, quotaSize: 1 });
    await page.goto(`/#/s/${id}`);
    await expect(page.getByTestId('n')).toHaveText('3');
    await typeAndSave(page, '3,8');
    const msg = page.getByTestId('pad-msg');
    await expect(msg).toContainText('Not saved');
    await expect(msg).toContainText(/storage space/i);
    await expect(msg).toHaveAttribute('role', 'alert');
    await expect(msg).not.toHaveAttribute('data-committed', '1');
    await expect(page.getByTestId('n')).toHaveText('3');
    await expect(page.locator('#value-input')).toHaveValue('3,8');
    expect((await rawLog(page, id)).map((r) => r.value)).toEqual([3.1, 2.9, 3.4]);

    // the data can still leave the phone while storage is full
    await page
      .getByRole('navigation', { name: 'Study screens' })
      .getByRole('link', { name: 'Report' })
      .click();
    const dl = page.waitForEvent('download');
    await page.getByTestId('export-bundle').click();
    const bundle = JSON.parse(readFileSync((await (await dl).path())!, 'utf8'));
    expect(bundle.events.map((e: { value: number }) => e.value)).toEqual([3.1, 2.9, 3.4]);
    // the file left the phone: the status must not say it did not
    await expect(page.getByTestId('handover-status')).toContainText('Downloaded');
    await ctx.close();

    // space again (a normal launch): everything is there and the next entry saves
    ctx = await launchProfile(dir);
    page = await firstPage(ctx);
    await page.goto(`/#/s/${id}`);
    await expect(page.getByTestId('n')).toHaveText('3');
    await typeAndSave(page, '3,8');
    await expectSaved(page, 4);
    expect((await rawLog(page, id)).map((r) => r.value)).toEqual([3.1, 2.9, 3.4, 3.8]);
    await ctx.close();
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
});

test('persistent storage refused: a visible warning recommends installing the app and exporting', async ({
  page,
}) => {
  await page.goto('/');
  // headless Chromium answers persist() with false (measured on the Debian Chromium the tests use)
  expect(await page.evaluate(() => navigator.storage.persisted())).toBe(false);
  const note = page.getByTestId('persist');
  await expect(note).toBeVisible();
  await expect(note).toContainText(/not guaranteed/i);
  await expect(note).toContainText(/install/i);
  await expect(note).toContainText(/export/i);
});

interface V1Fixture {
  database: string;
  version: number;
  stores: {
    name: string;
    keyPath: string | string[] | null;
    indexes: { name: string; keyPath: string | string[]; unique: boolean }[];
  }[];
  records: {
    studies: { id: string; name: string }[];
    observations: Record<string, unknown>[];
    exports: Record<string, unknown>[];
    meta: [string, unknown][];
  };
  expected: { counted: number; mean: number; notExported: number };
}

test('a database written by schema version 1 (raw IndexedDB, documented shape) opens with every entry', async ({
  page,
}) => {
  const fx = JSON.parse(
    readFileSync(join(import.meta.dirname, 'fixtures', 'schema-v1.json'), 'utf8'),
  ) as V1Fixture;
  // a same-origin document that is not the app, so the app does not create the database first
  await page.goto('/manifest.webmanifest');
  await page.evaluate(
    (f) =>
      new Promise<void>((resolve, reject) => {
        const req = indexedDB.open(f.database, f.version);
        req.onupgradeneeded = () => {
          const db = req.result;
          for (const s of f.stores) {
            const store = db.createObjectStore(
              s.name,
              s.keyPath === null ? undefined : { keyPath: s.keyPath },
            );
            for (const ix of s.indexes) store.createIndex(ix.name, ix.keyPath, { unique: ix.unique });
          }
        };
        req.onsuccess = () => {
          const db = req.result;
          const tx = db.transaction(['studies', 'observations', 'exports', 'meta'], 'readwrite');
          for (const r of f.records.studies) tx.objectStore('studies').add(r);
          for (const r of f.records.observations) tx.objectStore('observations').add(r);
          for (const r of f.records.exports) tx.objectStore('exports').add(r);
          for (const [k, v] of f.records.meta) tx.objectStore('meta').put(v, k);
          tx.oncomplete = () => {
            db.close();
            resolve();
          };
          tx.onerror = () => reject(tx.error);
        };
        req.onerror = () => reject(req.error);
      }),
    fx,
  );

  await page.goto('/');
  const study = fx.records.studies[0]!;
  await expect(page.getByText(study.name)).toBeVisible();
  await page.goto(`/#/s/${study.id}`);
  await expect(page.getByTestId('n')).toHaveText(String(fx.expected.counted));
  const est = Number(await page.getByTestId('estimate').getAttribute('data-value'));
  expect(Math.abs(est - fx.expected.mean)).toBeLessThan(1e-9 * fx.expected.mean);
  await expect(page.getByTestId('backup')).toContainText(
    `${fx.expected.notExported} entries not yet exported`,
  );
  await page.getByRole('navigation', { name: 'Study screens' }).getByRole('link', { name: 'Log' }).click();
  await expect(page.getByTestId('log-entry')).toHaveCount(fx.records.observations.length - 1);
  await expect(page.getByTestId('log-void')).toHaveCount(1);
  await expect(page.getByText('by the culvert')).toBeVisible();

  // after the app opened (and, from version 2 on, upgraded) it: the version is current, nothing lost
  const version = await page.evaluate(
    () =>
      new Promise<number>((resolve) => {
        const r = indexedDB.open('sure-enough');
        r.onsuccess = () => {
          resolve(r.result.version);
          r.result.close();
        };
      }),
  );
  expect(version).toBeGreaterThanOrEqual(fx.version);
  const obs = await readStore<Record<string, unknown>>(page, 'observations');
  for (const r of fx.records.observations) expect(obs).toContainEqual(expect.objectContaining(r));
  const studies = await readStore<Record<string, unknown>>(page, 'studies');
  expect(studies).toContainEqual(expect.objectContaining(study));
  const exports = await readStore<Record<string, unknown>>(page, 'exports');
  expect(exports).toContainEqual(expect.objectContaining(fx.records.exports[0]!));
});
