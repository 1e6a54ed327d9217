/**
 * Issue 7 in the browser: a two-stratum study shows per-stratum progress and the "where next" suggestion,
 * and entries are filed under the chosen stratum (the stratified estimate follows).
 */
import { expect, test } from '@playwright/test';
import { keyIn, screenshot } from './helpers.ts';

test('a two-stratum study shows per-stratum progress and where next', async ({ page }) => {
  const errors: string[] = [];
  page.on('pageerror', (e) => errors.push(String(e)));
  await page.goto('/#/new');
  await page.getByLabel('Study name').fill('Two habitats');
  await page.getByRole('radio', { name: /^Measurement/ }).check();
  await page.getByLabel('Unit', { exact: true }).fill('cm');
  await page.getByRole('radio', { name: /^Margin/ }).check();
  await page.getByLabel('Target margin ±').fill('1');
  await page.getByLabel('Strata and weights (optional)').fill('woodland:0.6, meadow:0.4');
  await page.getByLabel('I have read the cautions').check();
  await page.getByRole('button', { name: 'Start the study' }).click();
  await expect(page.getByTestId('verdict')).toBeVisible();

  const panel = page.getByTestId('strata-panel');
  await expect(panel).toBeVisible();
  // No entries yet: the heavier stratum first, because every stratum needs two entries.
  await expect(page.getByTestId('where-next')).toContainText('woodland');
  await expect(page.getByTestId('stratum-n-woodland')).toHaveText('0 entries');
  await expect(page.getByTestId('stratum-n-meadow')).toHaveText('0 entries');

  await panel.getByRole('button', { name: 'woodland' }).click();
  await keyIn(page, '12');
  await keyIn(page, '14');
  await expect(page.getByTestId('stratum-n-woodland')).toHaveText('2 entries');
  // woodland has its two entries: now the meadow, for the same reason.
  await expect(page.getByTestId('where-next')).toContainText('meadow');
  await expect(page.getByTestId('where-next')).toContainText('at least two');

  await panel.getByRole('button', { name: 'meadow' }).click();
  await keyIn(page, '30');
  await keyIn(page, '38');
  await expect(page.getByTestId('stratum-n-meadow')).toHaveText('2 entries');
  // Both strata have two: the suggestion now rests on the variance reduction per entry (the meadow varies more).
  await expect(page.getByTestId('where-next')).toContainText('meadow');
  await expect(page.getByTestId('where-next')).toContainText('narrows the interval');
  // The estimate is the stratified mean 0.6·13 + 0.4·34 = 21.4.
  // (shown rounded to the interval's precision, so compare within half a unit)
  const shown = Number(
    (await page.getByTestId('estimate').textContent())?.replace(',', '.').replace('−', '-'),
  );
  expect(Math.abs(shown - 21.4)).toBeLessThanOrEqual(0.5);
  await screenshot(page, 'design-two-strata');
  expect(errors).toEqual([]);
});
