/**
 * A new version deployed while a value is half-typed (the service-worker update flow of Workbox's
 * "Handling service worker updates" guide, in prompt mode): the typed value stays, nothing reloads by
 * itself, the update is offered — as soon as nothing is half-typed, the app's rule (web/app/App.tsx) —
 * and only the user's tap switches to the new version, with every entry still there.
 *
 * Two builds of the app that differ only in a build tag (e2e/fixtures/vite.tagged.config.ts) are made
 * into temporary directories and served by a small server that switches from v1 to v2 mid-test, so the
 * shared ./dist and the preview server of the other browser tests are left alone.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect, type Page, test } from '@playwright/test';
import { expectSaved, studyIdOf, typeAndSave } from './fixtures/browser.ts';
import { type StaticServer, startStaticServer } from './fixtures/static-server.ts';
import { createMeasurementStudy, waitForServiceWorker } from './helpers.ts';
import { PHONE } from './playwright.config.ts';

const root = join(import.meta.dirname, '..');
let work = '';
let server: StaticServer;

function build(tag: string, version: string): string {
  const out = join(work, tag);
  const r = spawnSync(
    'npx',
    [
      'vite',
      'build',
      '-c',
      'e2e/fixtures/vite.tagged.config.ts',
      '--outDir',
      out,
      '--emptyOutDir',
      '--logLevel',
      'warn',
    ],
    { cwd: root, env: { ...process.env, BUILD_TAG: tag, APP_VERSION: version }, encoding: 'utf8' },
  );
  if (r.status !== 0) throw new Error(`build ${tag} failed:\n${r.stdout}\n${r.stderr}`);
  return out;
}

const tagOf = (page: Page) =>
  page.evaluate(() => document.querySelector('meta[name="build-tag"]')?.getAttribute('content') ?? null);

test.describe('update', () => {
  let v1 = '';
  let v2 = '';
  test.beforeAll(async () => {
    test.setTimeout(180_000);
    work = mkdtempSync(join(tmpdir(), 'se-update-'));
    v1 = build('v1', '0.0.1');
    v2 = build('v2', '0.0.2');
    server = await startStaticServer(v1);
  });
  test.afterAll(async () => {
    await server?.close();
    if (work) rmSync(work, { recursive: true, force: true });
  });

  test('a new version while a value is half-typed: the value stays, nothing reloads, the update is offered', async ({
    browser,
  }) => {
    const context = await browser.newContext({ ...PHONE, baseURL: server.url });
    const page = await context.newPage();
    await page.goto('/');
    await waitForServiceWorker(page);
    expect(await tagOf(page)).toBe('v1');
    await createMeasurementStudy(page, { name: 'Sulphate, spring 2', unit: 'mg/L', margin: '1' });
    const id = studyIdOf(page);
    await typeAndSave(page, '41,5');
    await expectSaved(page, 1);

    // half-typed on the pad, then the new version lands on the server and the browser finds it
    for (const k of ['3', '8']) await page.getByRole('button', { name: k, exact: true }).click();
    // the decimal key writes the study's separator: the phone's locale (en-US here), a point
    await page.getByRole('button', { name: 'Decimal point' }).click();
    await page.getByRole('button', { name: '2', exact: true }).click();
    await expect(page.locator('#value-input')).toHaveValue('38.2');
    await page.evaluate(() => {
      (window as unknown as { __samePage: boolean }).__samePage = true;
    });
    let navigations = 0;
    page.on('framenavigated', (f) => {
      if (f === page.mainFrame()) navigations++;
    });
    server.serve(v2);
    await page.evaluate(async () => {
      const reg = await navigator.serviceWorker.getRegistration();
      await reg?.update();
    });
    await page.waitForFunction(
      async () => (await navigator.serviceWorker.getRegistration())?.waiting != null,
    );

    // nothing moved: same page, same version, the half-typed value intact, no prompt over the typing
    await expect(page.locator('#value-input')).toHaveValue('38.2');
    expect(await page.evaluate(() => (window as unknown as { __samePage?: boolean }).__samePage)).toBe(true);
    expect(await tagOf(page)).toBe('v1');
    await expect(page.getByTestId('update')).toHaveCount(0);

    // saving it makes the pad clean: the update is offered, still without reloading
    await page.getByRole('button', { name: 'Save', exact: true }).click();
    await expectSaved(page, 2);
    const offer = page.getByTestId('update');
    await expect(offer).toContainText('new version');
    await expect(offer.getByRole('button', { name: 'Update' })).toBeVisible();
    expect(navigations).toBe(0);
    expect(await page.evaluate(() => (window as unknown as { __samePage?: boolean }).__samePage)).toBe(true);

    // only the user's tap switches versions; every entry is still there
    await Promise.all([
      page.waitForEvent('framenavigated'),
      offer.getByRole('button', { name: 'Update' }).click(),
    ]);
    await expect.poll(() => tagOf(page)).toBe('v2');
    await page.goto(`/#/s/${id}`);
    await expect(page.getByTestId('n')).toHaveText('2');
    await context.close();
  });
});
