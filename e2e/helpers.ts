/** Shared steps for the browser tests: waiting for the service worker, creating studies, reading the screen. */

import { spawnSync } from 'node:child_process';
import { mkdirSync } from 'node:fs';
import { expect, type Page } from '@playwright/test';

/** Waits until the service worker controls the page (it claims the first visit; nothing reloads). */
export async function waitForServiceWorker(page: Page): Promise<void> {
  await page.evaluate(async () => {
    await navigator.serviceWorker.ready;
  });
  // The worker claims the page (clientsClaim) a moment after it is active. No reload while waiting: a
  // reloaded page is controlled from its start, and the one-time "ready to work offline" note it would
  // have shown never comes (the cause of a flaky wait for that note).
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
export async function keyIn(page: Page, value: string, taps = false, asked = false): Promise<void> {
  const before = Number(await page.getByTestId('n').textContent());
  if (taps) {
    for (const ch of value) {
      // the decimal key shows the study's separator (the phone's locale by default)
      if (ch === ',' || ch === '.')
        await page.getByRole('button', { name: /^Decimal (comma|point)$/ }).click();
      else if (ch === '-') await page.getByRole('button', { name: 'Minus sign' }).click();
      else await page.getByRole('button', { name: ch, exact: true }).click();
    }
  } else await page.locator('#value-input').fill(value);
  await page.getByRole('button', { name: 'Save', exact: true }).click();
  if (asked) {
    // an implausible value is questioned before it is saved, and kept as typed when the user says so
    await expect(page.getByTestId('keep-prompt')).toContainText('Keep it?');
    await page.getByRole('button', { name: /^Keep / }).click();
  }
  await expect(page.getByTestId('pad-msg')).toHaveAttribute('data-committed', '1');
  await expect(page.getByTestId('n')).toHaveText(String(before + 1));
}

/**
 * After a Save: when the pad asks "keep it?" (a value outside the expected range or far from the others,
 * web/app/plausible.ts), keeps it; then waits for "Saved #seq". A real value is never refused.
 */
export async function keepIfAsked(page: Page, seq: number): Promise<void> {
  const saved = page.getByTestId('pad-msg').filter({ hasText: `Saved #${seq}` });
  const prompt = page.getByTestId('keep-prompt');
  await expect(saved.or(prompt)).toBeVisible();
  if (await prompt.isVisible()) await page.getByRole('button', { name: /^Keep / }).click();
  await expect(saved).toBeVisible();
}

/** Parses "12.34 to 15.67" into numbers. */
export function parseInterval(text: string): [number, number] {
  const m = /(-?[\d.]+) to (-?[\d.]+)/.exec(text);
  if (!m) throw new Error(`no interval in “${text}”`);
  return [Number(m[1]), Number(m[2])];
}

/**
 * The core's own assessment of a sequence, computed in Node by the command line built from src/
 * (`npm run build:cli` → dist-cli/sure-enough.mjs; `npm test` builds it before the browser tests).
 * Importing src/index.ts directly does not load under Playwright's ESM loader (jstat is a UMD module
 * without named ESM exports), so the bundled command line is the way to run the same code in Node.
 */
export interface CoreAssessment {
  n: number;
  estimate: number | null;
  lower: number | null;
  upper: number | null;
  verdict: string;
  more: { likely: number; low: number; high: number; atLeast?: boolean } | null;
  level: number;
  methodLabel: string;
}
export function coreAssess(values: readonly number[], flags: string[]): CoreAssessment {
  const r = spawnSync(process.execPath, ['dist-cli/sure-enough.mjs', 'assess', ...flags], {
    input: `${values.join('\n')}\n`,
    encoding: 'utf8',
  });
  if (r.status !== 0) throw new Error(`sure-enough assess failed: ${r.stderr}`);
  return JSON.parse(r.stdout) as CoreAssessment;
}

/** The app's duration wording, restated here: seconds below 90 s, then minutes, then hours and minutes. */
export function durationWords(ms: number): string {
  const s = Math.max(1, Math.round(ms / 1000));
  if (s < 90) return `${s} s`;
  const min = Math.round(s / 60);
  if (min < 60) return `${min} min`;
  return min % 60 ? `${Math.floor(min / 60)} h ${min % 60} min` : `${min / 60} h`;
}

/** Checks the field screen against the core's assessment: verdict, n, estimate, interval, more. */
export async function expectMatchesCore(
  page: Page,
  core: CoreAssessment,
  paceMs: number | null,
): Promise<void> {
  await expect(page.getByTestId('verdict')).toHaveText(core.verdict);
  await expect(page.getByTestId('n')).toHaveText(String(core.n));
  const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1e-12, Math.abs(b));
  const est = Number(await page.getByTestId('estimate').getAttribute('data-value'));
  expect(rel(est, core.estimate as number)).toBeLessThan(1e-9);
  const iv = page.getByTestId('interval');
  expect(rel(Number(await iv.getAttribute('data-lower')), core.lower as number)).toBeLessThan(1e-9);
  expect(rel(Number(await iv.getAttribute('data-upper')), core.upper as number)).toBeLessThan(1e-9);
  if (core.verdict === 'keep going' && core.more && !core.more.atLeast && core.more.likely > 0) {
    const m = core.more;
    const range = m.low === m.high ? '' : ` (likely ${m.low}–${m.high})`;
    const pace = paceMs === null ? '' : `, about ${durationWords(m.likely * paceMs)} at your pace`;
    await expect(page.getByTestId('more')).toHaveText(`about ${m.likely} more${range}${pace}`);
    await expect(page.locator('.verdict .safety')).toHaveText(/^Statistical guidance, not an instruction/);
  } else if (core.verdict !== 'keep going') {
    await expect(page.getByTestId('more')).toHaveCount(0);
  }
}
