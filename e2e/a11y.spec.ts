/**
 * Every screen: an automated accessibility check (axe-core, WCAG 2.0/2.1/2.2 A and AA rules) with no
 * serious or critical violations, touch targets of at least 48 × 48 CSS px for every control, and a
 * phone-sized screenshot in test-results/screens/ (normal and sun theme). The page's CSP forbids inline
 * scripts, so this file's context bypasses CSP only to inject axe.
 */
import { expect, type Page, test } from '@playwright/test';
import { screenshot } from './helpers.ts';

test.use({ bypassCSP: true });

interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[] }[];
}

async function check(page: Page, name: string): Promise<void> {
  await page.addScriptTag({ path: 'node_modules/axe-core/axe.min.js' });
  const violations = await page.evaluate(async () => {
    const w = window as unknown as {
      axe: { run(ctx: Document, o: object): Promise<{ violations: AxeViolation[] }> };
    };
    const r = await w.axe.run(document, {
      runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'] },
    });
    return r.violations.map((v) => ({
      id: v.id,
      impact: v.impact,
      help: v.help,
      nodes: v.nodes.map((n) => ({ target: n.target })),
    }));
  });
  for (const v of violations)
    console.log(
      `${name}: ${v.impact} ${v.id} — ${v.help} — ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`,
    );
  expect(
    violations.filter((v) => v.impact === 'serious' || v.impact === 'critical'),
    name,
  ).toEqual([]);
  // touch targets: every control a gloved thumb must hit is at least 48 × 48 CSS px
  const small = await page.evaluate(() => {
    const sel =
      'main button, main a.btn, main .tabs a, main .back, main .card-main, main input:not([type=checkbox]):not([type=radio]):not([type=file]), main label.choice, main label.toggle, main summary, .banners button, [role=dialog] button';
    return [...document.querySelectorAll<HTMLElement>(sel)]
      .filter((el) => el.offsetParent !== null)
      .map((el) => ({ el, r: el.getBoundingClientRect() }))
      .filter(({ r }) => r.height < 47.5 || r.width < 47.5)
      .map(
        ({ el, r }) =>
          `${el.tagName.toLowerCase()} “${(el.textContent ?? '').trim().slice(0, 30)}” ${Math.round(r.width)}×${Math.round(r.height)}`,
      );
  });
  expect(small, `${name}: controls smaller than 48 px`).toEqual([]);
  await screenshot(page, name);
}

test('accessibility and screenshots of every screen', async ({ page }) => {
  test.setTimeout(120_000);
  await page.goto('/');
  await expect(page.getByRole('link', { name: 'New study' })).toBeVisible();
  await expect(page.getByTestId('persist')).toBeVisible();
  await check(page, 'studies-empty');

  await page.getByRole('link', { name: 'Open the demo' }).click();
  await expect(page.getByText('Every demo uses invented data')).toBeVisible();
  await check(page, 'demo');

  for (const [kind, title] of [
    ['measurement', 'Demo: nitrate at a spring (invented)'],
    ['count', 'Demo: seedlings in 1 m² plots (invented)'],
    ['pass-fail', 'Demo: loose fittings in a lot of 400 (invented)'],
  ] as const) {
    await page.goto('/#/demo');
    await page.getByRole('button', { name: new RegExp(`^${title.replace(/[()]/g, '\\$&')}`) }).click();
    await expect(page.getByRole('heading', { name: title })).toBeVisible();
    await expect(page.getByText('Invented demo data, not a real site')).toBeVisible();
    await expect(page.getByTestId('verdict')).toBeVisible();
    await check(page, `field-demo-${kind}`);
    if (kind === 'measurement') {
      await page.getByRole('button', { name: 'Undo last' }).click();
      await expect(page.getByRole('dialog', { name: 'Undo last entry' })).toBeVisible();
      await check(page, 'dialog-undo');
      await page.getByRole('button', { name: 'Cancel' }).click();
      await page.getByRole('link', { name: 'Log' }).click();
      await expect(page.getByTestId('log-entry').first()).toBeVisible();
      await check(page, 'log-demo-measurement');
      await page.getByRole('button', { name: /^Correct #8$/ }).click();
      await check(page, 'dialog-correct');
      await page.getByRole('button', { name: 'Cancel' }).click();
      await page.getByRole('link', { name: 'Report' }).click();
      await expect(page.getByRole('heading', { name: 'Method' })).toBeVisible();
      await check(page, 'report-demo-measurement');
    }
  }

  await page.goto('/');
  await expect(page.getByTestId('study-card')).toHaveCount(3);
  await check(page, 'studies-list');

  await page.getByRole('link', { name: 'New study' }).click();
  await check(page, 'new-study');
  await page.getByRole('radio', { name: /^Decide against a limit/ }).check();
  await page.getByRole('radio', { name: /^Limit decision \(SPRT\)/ }).check();
  await page.getByRole('button', { name: 'Start the study' }).click();
  await expect(page.getByRole('alert')).toContainText('fields need attention');
  await check(page, 'new-study-errors');

  // duplicate a setup for the next site, and change a setup (a new version linked to the old study)
  await page.goto('/');
  const first = page.getByTestId('study-card').first();
  const firstName = (await first.locator('.card-name').textContent()) ?? '';
  await first.getByRole('link', { name: 'Duplicate setup' }).click();
  await expect(page.getByLabel('Study name')).toHaveValue(`${firstName} (copy)`);
  await check(page, 'new-study-duplicate');
  await page.goto('/');
  await page.getByTestId('study-card').first().locator('a.card-main').click();
  await page.getByRole('link', { name: 'Report' }).click();
  await page.getByRole('link', { name: /^Change setup/ }).click();
  await expect(page.getByText('as a new study linked to')).toBeVisible();
  await page.getByLabel('I have read the cautions').check();
  await page.getByRole('button', { name: 'Start the study' }).click();
  await expect(page.getByTestId('verdict')).toHaveText('keep going');
  await expect(page.getByTestId('n')).toHaveText('0');
  await page.getByRole('link', { name: 'Report' }).click();
  await expect(page.getByText('version 2, created')).toBeVisible();

  await page.goto('/');
  await expect(page.getByTestId('study-card')).toHaveCount(4);
  await page.getByTestId('study-card').first().getByRole('button', { name: 'Archive' }).click();
  await page.getByRole('link', { name: 'Archived studies (1)' }).click();
  await expect(page.getByRole('button', { name: 'Bring back' })).toBeVisible();
  await check(page, 'studies-archived');

  // sun theme
  await page.goto('/');
  await page.getByRole('button', { name: 'Sun' }).click();
  await expect(page.locator('html.sun')).toHaveCount(1);
  await check(page, 'studies-sun');
  await page.getByTestId('study-card').first().locator('a.card-main').click();
  await expect(page.getByTestId('verdict')).toBeVisible();
  await check(page, 'field-sun');
  await page.goto('/#/nowhere');
  await check(page, 'not-found-sun');
});
