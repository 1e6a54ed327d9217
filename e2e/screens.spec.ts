/**
 * Every screen on every phone size (issue 13, item 1), checked by bounding boxes: at 320×568, 360×640,
 * 390×844, landscape 844×390 and 390×844 with the text at 200 % (the root font size doubled, as a reader
 * who enlarges text sees it), the field screen shows the verdict word, the estimate with its interval, the
 * "more" line (or what a reached verdict allows) and the entry control together, inside the viewport and
 * not covered by anything (the element at each one's centre is that element); no screen scrolls sideways
 * (document scrollWidth ≤ innerWidth, every visible control inside the viewport's width). The outside
 * reference is WCAG 2.2, success criteria 1.4.4 (Resize Text, 200 %) and 1.4.10 (Reflow: no scrolling in
 * two dimensions at 320 CSS px). A screenshot of each screen goes to test-results/screens/sizes/.
 */
import { mkdirSync } from 'node:fs';
import { expect, type Locator, type Page, test } from '@playwright/test';

const SIZES = [
  { name: '320x568', width: 320, height: 568, text: 1 },
  { name: '360x640', width: 360, height: 640, text: 1 },
  { name: '390x844', width: 390, height: 844, text: 1 },
  { name: '844x390', width: 844, height: 390, text: 1 },
  { name: '390x844-text200', width: 390, height: 844, text: 2 },
] as const;

const DEMOS = [
  ['measurement', 'Demo: nitrate at a spring (invented)'],
  ['count', 'Demo: seedlings in 1 m² plots (invented)'],
  ['pass-fail', 'Demo: loose fittings in a lot of 400 (invented)'],
] as const;

async function shot(page: Page, size: string, name: string): Promise<void> {
  mkdirSync('test-results/screens/sizes', { recursive: true });
  await page.screenshot({ path: `test-results/screens/sizes/${size}-${name}.png` });
}

/** The element is inside the viewport and is what the user sees at its centre (not clipped or covered). */
async function expectInView(page: Page, loc: Locator, what: string): Promise<void> {
  await expect(loc, what).toBeVisible();
  const box = await loc.boundingBox();
  const vp = page.viewportSize()!;
  expect(box, what).not.toBeNull();
  const b = box!;
  expect(b.y, `${what}: top`).toBeGreaterThanOrEqual(0);
  expect(b.x, `${what}: left`).toBeGreaterThanOrEqual(0);
  expect(b.y + b.height, `${what}: bottom`).toBeLessThanOrEqual(vp.height + 0.5);
  expect(b.x + b.width, `${what}: right`).toBeLessThanOrEqual(vp.width + 0.5);
  // every corner's neighbourhood and the centre show the element itself: clipping by the scrolling pane
  // or an overlapping pad would show something else there
  const seen = await loc.evaluate((el) => {
    const r = el.getBoundingClientRect();
    const pts = [
      [r.left + r.width / 2, r.top + r.height / 2],
      [r.left + 2, r.top + 2],
      [r.right - 2, r.bottom - 2],
    ];
    return pts.every(([x, y]) => {
      const hit = document.elementFromPoint(x as number, y as number);
      return hit !== null && (el === hit || el.contains(hit) || hit.contains(el));
    });
  });
  expect(seen, `${what}: not clipped or covered`).toBe(true);
}

async function expectNoSidewaysScroll(page: Page, what: string): Promise<void> {
  const r = await page.evaluate(() => {
    const w = window.innerWidth;
    const wide = [...document.querySelectorAll<HTMLElement>('main *, .banners *')]
      .filter((el) => el.offsetParent !== null && el.closest('.shares, .oc-table') === null)
      .map((el) => ({ el, r: el.getBoundingClientRect() }))
      .filter(({ r }) => r.width > 0 && (r.right > w + 0.5 || r.left < -0.5))
      .map(
        ({ el, r }) =>
          `${el.tagName.toLowerCase()}.${el.className} ${Math.round(r.left)}–${Math.round(r.right)}`,
      );
    return {
      scroll: Math.max(document.documentElement.scrollWidth, document.body.scrollWidth),
      main: document.querySelector('main')?.scrollWidth ?? 0,
      mainClient: document.querySelector('main')?.clientWidth ?? 0,
      w,
      wide: wide.slice(0, 5),
    };
  });
  expect(r.scroll, `${what}: page scrollWidth`).toBeLessThanOrEqual(r.w);
  expect(r.main, `${what}: main scrollWidth`).toBeLessThanOrEqual(r.mainClient);
  expect(r.wide, `${what}: elements past the edge`).toEqual([]);
}

async function openDemo(page: Page, title: string): Promise<void> {
  await page.goto('/#/demo');
  await page.getByRole('button', { name: new RegExp(`^${title.replace(/[()]/g, '\\$&')}`) }).click();
  await expect(page.getByTestId('verdict')).toBeVisible();
}

async function expectFieldEssentials(page: Page, kind: string, what: string): Promise<void> {
  await expectInView(page, page.getByTestId('verdict'), `${what}: verdict word`);
  await expectInView(page, page.getByTestId('est-line'), `${what}: estimate with interval`);
  const more = page.getByTestId('more').or(page.getByTestId('done'));
  await expectInView(page, more, `${what}: "more" line`);
  if (kind === 'measurement') {
    await expectInView(page, page.locator('.display-row'), `${what}: value display`);
    for (const k of ['7', '1', '0'])
      await expectInView(page, page.getByRole('button', { name: k, exact: true }), `${what}: key ${k}`);
    await expectInView(page, page.getByRole('button', { name: 'Save', exact: true }), `${what}: Save`);
  } else if (kind === 'count') {
    await expectInView(page, page.getByRole('button', { name: 'Plus one' }), `${what}: +1`);
    await expectInView(page, page.getByRole('button', { name: /^Save plot/ }), `${what}: Save plot`);
  } else {
    await expectInView(page, page.locator('.pf-btn.yes'), `${what}: outcome button`);
    await expectInView(page, page.locator('.pf-btn.no'), `${what}: other button`);
  }
}

for (const size of SIZES) {
  test.describe(`at ${size.name}`, () => {
    test.use({ viewport: { width: size.width, height: size.height } });
    test.beforeEach(async ({ page }) => {
      if (size.text !== 1)
        await page.addInitScript((k) => {
          document.documentElement.style.fontSize = `${17 * k}px`;
        }, size.text);
    });

    test('field screen: verdict, estimate, more and the entry control in view together', async ({ page }) => {
      test.setTimeout(90_000);
      for (const [kind, title] of DEMOS) {
        await openDemo(page, title);
        const what = `${size.name} ${kind}`;
        await shot(page, size.name, `field-${kind}`);
        await expectFieldEssentials(page, kind, what);
        await expectNoSidewaysScroll(page, what);
        await shot(page, size.name, `field-${kind}`);
        // the chart: inline where there is room, else a panel one tap away
        const panel = page.getByTestId('chart-panel');
        const toggle = page.getByRole('button', { name: 'Chart', exact: true });
        if (await toggle.isVisible()) {
          await toggle.click();
          await expect(panel.locator('svg[role=img]')).toBeVisible();
          await expectInView(page, panel.locator('svg[role=img]'), `${what}: chart panel`);
          expect((await panel.locator('svg[role=img]').boundingBox())!.height).toBeGreaterThanOrEqual(100);
          await shot(page, size.name, `field-${kind}-chart`);
          await page.getByRole('button', { name: 'Close chart' }).click();
          await expectInView(page, page.getByTestId('verdict'), `${what}: verdict after closing the chart`);
        } else {
          await expect(panel.locator('svg[role=img]')).toBeVisible();
          expect((await panel.locator('svg[role=img]').boundingBox())!.height).toBeGreaterThanOrEqual(140);
        }
      }
    });

    test('no screen scrolls sideways', async ({ page }) => {
      test.setTimeout(90_000);
      await page.goto('/');
      await expect(page.getByRole('link', { name: 'New study' })).toBeVisible();
      await expectNoSidewaysScroll(page, `${size.name} studies (empty)`);
      await shot(page, size.name, 'studies-empty');
      await page.goto('/#/demo');
      await expect(page.getByText('Every demo uses invented data')).toBeVisible();
      await expectNoSidewaysScroll(page, `${size.name} demo`);
      await shot(page, size.name, 'demo');
      await openDemo(page, DEMOS[1][1]);
      await page.getByRole('link', { name: 'Log' }).click();
      await expect(page.getByTestId('log-entry').first()).toBeVisible();
      await expectNoSidewaysScroll(page, `${size.name} log`);
      await shot(page, size.name, 'log');
      await page.getByRole('link', { name: 'Report' }).click();
      await expect(page.getByRole('heading', { name: 'Method' })).toBeVisible();
      await expectNoSidewaysScroll(page, `${size.name} report`);
      await shot(page, size.name, 'report');
      // the export buttons wrap: each is reachable inside the width
      for (const b of await page.locator('.handover .actions .btn, .handover button').all()) {
        const box = await b.boundingBox();
        if (box) expect(box.x + box.width).toBeLessThanOrEqual(size.width + 0.5);
      }
      await page.goto('/');
      await expect(page.getByTestId('study-card').first()).toBeVisible();
      await expectNoSidewaysScroll(page, `${size.name} studies`);
      await shot(page, size.name, 'studies');
      await page.getByRole('link', { name: 'New study' }).click();
      await expect(page.getByLabel('Study name')).toBeVisible();
      await expectNoSidewaysScroll(page, `${size.name} new study`);
      await shot(page, size.name, 'new-study');
    });
  });
}
