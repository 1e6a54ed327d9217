/**
 * Setup screen, phone profile: the limit decision's figures appear live as the form is filled — the
 * chance of "below limit" at several true rates (operating characteristic) and the expected number of
 * items (Wald's ASN) — and the warnings of the chosen rule. Checked figures: Wald (1947) L(θ₀) = 1 − α and
 * L(θ₁) = β [read/secondary]; ASN 58.3 / 45.0 and truncation 279 for 2 % – 8 %, α 0.05, β 0.10 from
 * test/bench/coverage.md [derived]. (test/web/rule-preview.test.tsx compares every row with the core's
 * sprtOperatingCharacteristic.) Screenshot: test-results/screens/new-study-sprt.png.
 */
import { mkdirSync } from 'node:fs';
import { expect, test } from '@playwright/test';

test('limit decision setup shows the OC table, expected sizes, the maximum and warnings', async ({
  page,
}) => {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(String(e)));
  await page.goto('/#/new');
  await page.getByLabel('Study name').fill('Lot 7 seals');
  await page.getByRole('radio', { name: /^Pass\/fail/ }).check();
  await page.getByLabel('Counted outcome').fill('leak');
  await page.getByRole('radio', { name: /^Decide against a limit/ }).check();
  await page.getByLabel('Limit value').fill('5');
  await page.getByRole('radio', { name: /^Limit decision/ }).check();
  await page.getByLabel('Indifference zone from').fill('2');
  await page.getByLabel('to', { exact: true }).fill('8');

  const preview = page.getByTestId('sprt-preview');
  await expect(preview).toBeVisible();
  const row = (theta: string) => preview.locator(`tr[data-theta="${theta}"]`);
  await expect(row('0.02')).toContainText('95 %');
  await expect(row('0.02')).toContainText('58.3');
  await expect(row('0.08')).toContainText('10 %');
  await expect(row('0.08')).toContainText('45.0');
  await expect(row('0.05')).toContainText('limit');
  await expect(page.getByTestId('sprt-max')).toHaveAttribute('data-max', '279');

  // live: a narrower zone needs more items (the maximum grows)
  await page.getByLabel('Indifference zone from').fill('3');
  await page.getByLabel('to', { exact: true }).fill('7');
  await expect
    .poll(async () => Number(await page.getByTestId('sprt-max').getAttribute('data-max')))
    .toBeGreaterThan(279);
  await page.getByLabel('Indifference zone from').fill('2');
  await page.getByLabel('to', { exact: true }).fill('8');
  await expect(page.getByTestId('sprt-max')).toHaveAttribute('data-max', '279');

  // readable on a 390 px phone: the table fits the width
  const box = await preview.locator('table').boundingBox();
  expect(box && box.x >= 0 && box.x + box.width <= 390).toBe(true);

  // the first-visit "ready to work offline" banner would cover the top of the screenshot
  const ok = page.getByRole('button', { name: 'OK', exact: true });
  if (await ok.isVisible()) await ok.click();
  await page.getByTestId('rule-preview').scrollIntoViewIfNeeded();
  await page.getByTestId('rule-preview').evaluate((el) => el.scrollIntoView({ block: 'start' }));
  mkdirSync('test-results/screens', { recursive: true });
  await page.screenshot({ path: 'test-results/screens/new-study-sprt.png', fullPage: false });
  expect(errors).toEqual([]);
});
