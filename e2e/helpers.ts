/** Shared steps for the browser tests: waiting for the service worker, creating studies, reading the screen. */

import { mkdirSync } from 'node:fs';
import { expect, type Page } from '@playwright/test';

/** Waits until the service worker controls the page (reloads once if the first visit is not controlled). */
export async function waitForServiceWorker(page: Page): Promise<void> {
  await page.evaluate(async () => {
    await navigator.serviceWorker.ready;
  });
  if (!(await page.evaluate(() => navigator.serviceWorker.controller !== null))) await page.reload();
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
}

export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync('test-results/screens', { recursive: true });
  await page.evaluate(() => document.querySelector('main')?.scrollTo(0, 0));
  await page.screenshot({ path: `test-results/screens/${name}.png`, fullPage: false });
}

export interface MeasurementStudy {
  name: string;
  unit: string;
  margin: string;
  level?: '80 %' | '90 %' | '95 %' | '99 %';
  min?: number;
}

/** Fills the New study form for a measurement study with a margin target and starts it. */
export async function createMeasurementStudy(page: Page, s: MeasurementStudy): Promise<void> {
  await page.goto('/#/new');
  await page.getByLabel('Study name').fill(s.name);
  await page.getByRole('radio', { name: /^Measurement/ }).check();
  await page.getByLabel('Unit', { exact: true }).fill(s.unit);
  await page.getByRole('radio', { name: /^Margin/ }).check();
  await page.getByLabel('Target margin ±').fill(s.margin);
  await page.getByRole('radio', { name: new RegExp(`^${s.level ?? '95 %'}`) }).check();
  if (s.min !== undefined) await page.getByLabel('Minimum before any verdict').fill(String(s.min));
  await page.getByLabel('I have read the cautions').check();
  await page.getByRole('button', { name: 'Start the study' }).click();
  await expect(page.getByTestId('verdict')).toBeVisible();
}

/**
 * Keys a value in and saves; waits until the pad says it was committed and n moved on. `taps` uses the
 * on-screen keys one by one; otherwise the value is typed into the field (as with a keyboard).
 */
export async function keyIn(page: Page, value: string, taps = false): Promise<void> {
  const before = Number(await page.getByTestId('n').textContent());
  if (taps) {
    for (const ch of value) {
      if (ch === ',' || ch === '.') await page.getByRole('button', { name: 'Decimal comma' }).click();
      else if (ch === '-') await page.getByRole('button', { name: 'Minus sign' }).click();
      else await page.getByRole('button', { name: ch, exact: true }).click();
    }
  } else await page.locator('#value-input').fill(value);
  await page.getByRole('button', { name: 'Save', exact: true }).click();
  await expect(page.getByTestId('pad-msg')).toHaveAttribute('data-committed', '1');
  await expect(page.getByTestId('n')).toHaveText(String(before + 1));
}

/** Parses "12.34 to 15.67" into numbers. */
export function parseInterval(text: string): [number, number] {
  const m = /(-?[\d.]+) to (-?[\d.]+)/.exec(text);
  if (!m) throw new Error(`no interval in “${text}”`);
  return [Number(m[1]), Number(m[2])];
}
