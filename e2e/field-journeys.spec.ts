/**
 * Issue 5: a full field journey per data kind on the production build (phone profile): set up through the
 * New study form, enter a realistic (invented) sequence with the pads, compare the verdict, the figures and
 * the "more" line with the core's own assessment of the same counted sequence (computed in Node by the
 * command line built from src/), undo and correct (voids that stay in the log and leave the statistics),
 * then reload offline and find everything again. The page clock is installed so that entries are 40 s apart
 * (one 15-minute break, which the pace must ignore): the pace shown is then known.
 */
import { expect, type Page, test } from '@playwright/test';
import { coreAssess, expectMatchesCore, keyIn, screenshot, waitForServiceWorker } from './helpers.ts';

const GAP = 40_000;
const BREAK = 15 * 60_000;

async function start(page: Page) {
  await page.clock.install({ time: new Date('2026-06-02T08:00:00+02:00') });
  await page.goto('/');
  await waitForServiceWorker(page);
}

async function tick(page: Page, ms = GAP) {
  await page.clock.fastForward(ms);
}

async function openTab(page: Page, name: 'Field' | 'Log' | 'Report') {
  await page.getByRole('navigation', { name: 'Study screens' }).getByRole('link', { name }).click();
}

async function undoLast(page: Page, reason: string) {
  const n = Number(await page.getByTestId('n').textContent());
  await page.getByRole('button', { name: 'Undo last' }).click();
  await page.getByRole('dialog').getByRole('button', { name: reason }).click();
  await page.getByRole('button', { name: 'Void it' }).click();
  await expect(page.getByRole('dialog')).toHaveCount(0);
  await expect(page.getByTestId('n')).toHaveText(String(n - 1));
}

async function correctInLog(
  page: Page,
  seq: number,
  fill: (d: ReturnType<Page['getByRole']>) => Promise<void>,
  reason: string,
) {
  await openTab(page, 'Log');
  await page.getByRole('button', { name: `Correct #${seq}` }).click();
  const dialog = page.getByRole('dialog');
  await fill(dialog);
  await dialog.getByRole('button', { name: reason }).click();
  await dialog.getByRole('button', { name: 'Save correction' }).click();
  await expect(dialog).toHaveCount(0);
  await expect(page.getByTestId('log-void').filter({ hasText: `void of #${seq}: ${reason}` })).toHaveCount(1);
  // the new entry keeps its origin
  await expect(page.getByTestId('log-corrects').filter({ hasText: `corrects #${seq}` })).toHaveCount(1);
  await expect(page.getByTestId('log-corrected-by')).toHaveCount(
    await page.getByTestId('log-corrects').count(),
  );
}

async function offlineReload(page: Page) {
  await page.context().setOffline(true);
  const resp = await page.reload();
  expect(resp?.fromServiceWorker()).toBe(true);
}

async function signals(page: Page): Promise<number> {
  return Number((await page.evaluate(() => document.documentElement.dataset.verdictSignals)) ?? 0);
}

test.describe('measurement journey', () => {
  test.use({
    permissions: ['geolocation'],
    geolocation: { latitude: 46.2044, longitude: 6.1432, accuracy: 12 },
  });

  test('lead in topsoil: entries, a typo corrected, a double entry undone, enough, offline', async ({
    page,
  }) => {
    test.setTimeout(150_000);
    // invented concentrations (mg/kg); margin ± 8 mg/kg at 95 %; the default hot-spot share (10 % of the
    // site must not go unseen) is kept, so no verdict comes before 29 entries: ⌈ln 0.05 / ln 0.9⌉ = 29
    // (1 − 0.9²⁹ = 0.953 ≥ 0.95 > 1 − 0.9²⁸ = 0.948, worked by hand)
    const flags = ['--kind', 'measurement', '--target', 'margin:8'];
    await start(page);
    await page.goto('/#/new');
    await page.getByLabel('Study name').fill('Lead, allotment plot 4');
    await page.getByRole('radio', { name: /^Measurement/ }).check();
    await page.getByLabel('Unit', { exact: true }).fill('mg/kg');
    await page.getByLabel('Target margin ±').fill('8');
    await page.getByLabel('I have read the cautions').check();
    await page.getByRole('button', { name: 'Start the study' }).click();
    await expect(page.getByTestId('verdict')).toHaveText('keep going');
    await page.getByRole('button', { name: 'GPS off' }).click();
    await expect(page.getByRole('button', { name: 'GPS ± 12 m' })).toBeVisible();

    const counted: number[] = [];
    for (const [i, v] of [112, 131, 98, 125, 140, 118, 104, 127, 133].entries()) {
      await tick(page);
      await keyIn(page, String(v), i === 0);
      counted.push(v);
    }
    await tick(page);
    // #10, a slip of the finger: 109 was meant. Far from the nine before (median 125, MAD 8: modified z
    // 0.6745 × 965 / 8 ≈ 81, Iglewicz & Hoaglin 1993), so the pad asks "keep it?"; the crew keeps it here
    // and corrects it from the log below
    await keyIn(page, '1090', false, true);
    await tick(page);
    await page.getByRole('button', { name: 'Note' }).click();
    await page.getByLabel('Note for the next entry').fill('near the old fence');
    await keyIn(page, '121'); // #11
    counted.push(121);
    await tick(page, BREAK);
    await keyIn(page, '96'); // #12
    await tick(page);
    await keyIn(page, '138'); // #13
    counted.push(96, 138);
    await tick(page);
    await keyIn(page, '138'); // #14: entered twice
    await tick(page);
    await undoLast(page, 'entered twice');
    await tick(page);
    await correctInLog(page, 10, (d) => d.getByLabel('Correct value').fill('109'), 'wrong key');
    counted.push(109); // the correction is a new entry at the end of the log
    await openTab(page, 'Field');
    await expectMatchesCore(page, coreAssess(counted, flags), GAP);
    await screenshot(page, 'field-measurement-keep-going');

    const before = await signals(page);
    const more = [115, 124, 119, 122, 110, 129, 117, 126, 108, 135, 120, 114, 131, 116, 123];
    for (const v of more) {
      await tick(page);
      await keyIn(page, String(v));
      counted.push(v);
      await expectMatchesCore(page, coreAssess(counted, flags), GAP);
    }
    // 28 counted: the interval is narrow enough, but no verdict before the 29th entry
    expect(counted).toHaveLength(28);
    await expect(page.getByTestId('verdict')).toHaveText('keep going');
    await expect(page.getByTestId('more')).toHaveText('at least 1 more before a verdict');
    await tick(page);
    await keyIn(page, '119');
    counted.push(119);
    await expectMatchesCore(page, coreAssess(counted, flags), GAP);
    await expect(page.getByTestId('verdict')).toHaveText('enough');
    // 1 − 0.05^(1/29) = 0.098: about 10 % of the site could still be unseen
    await expect(page.getByTestId('done')).toContainText(
      'An area of up to about 10 % of the site could still be unseen: 29 random entries',
    );
    expect(await signals(page)).toBeGreaterThan(before);
    await screenshot(page, 'field-measurement-enough');

    await openTab(page, 'Log');
    await expect(page.getByTestId('log-entry')).toHaveCount(31);
    await expect(page.getByTestId('log-void')).toHaveCount(2);
    await expect(page.locator('.log-item.voided del')).toHaveText(['138 mg/kg', '1090 mg/kg']);
    const row = (seq: number) =>
      page
        .getByTestId('log-entry')
        .filter({ has: page.locator('.seq', { hasText: new RegExp(`^#${seq}$`) }) });
    await expect(row(11)).toContainText('Note: near the old fence');
    await expect(row(1)).toContainText('46.20440, 6.14320 ± 12 m');
    await screenshot(page, 'log-measurement');
    await openTab(page, 'Report');
    await expect(page.getByTestId('report-verdict')).toHaveText('enough');
    await expect(page.locator('.method-statement')).toContainText(
      'before 29 entries (an area of 10 % of the site',
    );
    await screenshot(page, 'report-measurement');

    await openTab(page, 'Field');
    await offlineReload(page);
    await expectMatchesCore(page, coreAssess(counted, flags), GAP);
    await openTab(page, 'Log');
    await expect(page.getByTestId('log-entry')).toHaveCount(31);
  });
});

test('count journey: snails per 0.25 m² quadrat, zero plots, undo, correction, offline', async ({ page }) => {
  test.setTimeout(90_000);
  // invented counts; ± 30 % of the mean at 90 %; a hot area of 30 % of the meadow must not go unseen (9 plots,
  // so the minimum of 10 applies: this journey is about zero plots, undo and correction)
  const flags = [
    ...['--kind', 'count', '--target', 'relative:0.3', '--level', '0.9', '--plot-area', '0.25'],
    ...['--hot-spot-share', '0.3'],
  ];
  await start(page);
  await page.goto('/#/new');
  await page.getByLabel('Study name').fill('Snails, north meadow');
  await page.getByRole('radio', { name: /^Count per plot/ }).check();
  await page.getByLabel('Plot area', { exact: true }).fill('0,25');
  await page.getByLabel('What you count (optional)').fill('snails');
  await page.getByRole('radio', { name: /^Relative/ }).check();
  await page.getByLabel('Target: ± % of the estimate').fill('30');
  await page.getByRole('radio', { name: /^90 %/ }).check();
  await page.getByLabel('Smallest share of the site that must not go unseen').fill('30');
  await page.getByLabel('I have read the cautions').check();
  await page.getByRole('button', { name: 'Start the study' }).click();
  await expect(page.getByTestId('verdict')).toHaveText('keep going');

  const counted: number[] = [];
  async function plot(v: number) {
    const n = Number(await page.getByTestId('n').textContent());
    await tick(page);
    if (v <= 5) for (let i = 0; i < v; i++) await page.getByRole('button', { name: 'Plus one' }).click();
    else await page.getByLabel('Count in this plot').fill(String(v));
    await page.getByRole('button', { name: `Save plot: ${v}` }).click();
    await expect(page.getByTestId('n')).toHaveText(String(n + 1));
    await expect(page.getByRole('button', { name: 'Save plot: 0' })).toBeVisible();
  }
  for (const v of [4, 0, 7, 3, 5, 2, 0, 6, 9, 3, 4]) {
    await plot(v);
    counted.push(v);
  }
  await expectMatchesCore(page, coreAssess(counted, flags), GAP);
  await screenshot(page, 'field-count-keep-going');
  const before = await signals(page);
  await plot(5);
  await expectMatchesCore(page, coreAssess([...counted, 5], flags), GAP);
  await expect(page.getByTestId('verdict')).toHaveText('enough');
  expect(await signals(page)).toBe(before + 1);
  await screenshot(page, 'field-count-enough');
  await tick(page);
  await undoLast(page, 'wrong plot or item');
  await expectMatchesCore(page, coreAssess(counted, flags), GAP);
  expect(await signals(page)).toBe(before + 2);
  await plot(5);
  counted.push(5);
  await tick(page);
  await correctInLog(page, 3, (d) => d.getByLabel('Correct count').fill('6'), 'wrong key');
  counted.splice(2, 1);
  counted.push(6);
  await screenshot(page, 'log-count');
  await openTab(page, 'Field');
  await expectMatchesCore(page, coreAssess(counted, flags), GAP);
  await offlineReload(page);
  await expectMatchesCore(page, coreAssess(counted, flags), GAP);
  await openTab(page, 'Log');
  await expect(page.locator('.log-item.voided del')).toHaveText(['5 per plot', '7 per plot']);
});

test('pass/fail journey: cracked welds in a lot of 200 against an entered limit, offline', async ({
  page,
}) => {
  test.setTimeout(90_000);
  // invented items; decide against a tolerable rate of 25 % (typed in with its source and date); a share of 25 %
  // of the lot must not go unseen either (11 items: 1 − 0.75¹¹ = 0.958 ≥ 0.95, by hand)
  const flags = [
    '--kind',
    'pass-fail',
    '--target',
    'limit:0.25',
    '--population',
    '200',
    '--hot-spot-share',
    '0.25',
  ];
  await start(page);
  await page.goto('/#/new');
  await page.getByLabel('Study name').fill('Welds, frame batch 12');
  await page.getByRole('radio', { name: /^Pass\/fail per item/ }).check();
  await page.getByLabel('Counted outcome').fill('cracked weld');
  await page.getByRole('radio', { name: /^Decide against a limit/ }).check();
  await page.getByLabel('Limit value').fill('25');
  await page.getByLabel('Source of the limit').fill('Client acceptance note CA-7 (invented)');
  await page.getByLabel('Date of that source').fill('2026-05-01');
  await page.getByLabel('Lot or population size (optional)').fill('200');
  await page.getByLabel('Smallest share of the lot that must not go unseen').fill('25');
  await page.getByLabel('I have read the cautions').check();
  await page.getByRole('button', { name: 'Start the study' }).click();
  await expect(page.getByTestId('verdict')).toHaveText('keep going');

  const counted: number[] = [];
  async function item(v: 0 | 1) {
    const n = Number(await page.getByTestId('n').textContent());
    await tick(page);
    await page.getByRole('button', { name: v ? 'cracked weld' : 'no cracked weld', exact: true }).click();
    await expect(page.getByTestId('n')).toHaveText(String(n + 1));
  }
  const seq: (0 | 1)[] = [0, 0, 0, 1, 0, 1, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0];
  for (const v of seq) {
    await item(v);
    counted.push(v);
  }
  await item(0); // a double tap
  await tick(page);
  await undoLast(page, 'entered twice');
  await expectMatchesCore(page, coreAssess(counted, flags), GAP);
  await screenshot(page, 'field-pass-fail-keep-going');
  await tick(page);
  await correctInLog(page, 6, (d) => d.getByRole('radio', { name: 'no cracked weld' }).check(), 'wrong key');
  counted.splice(5, 1);
  counted.push(0);
  await screenshot(page, 'log-pass-fail');
  await openTab(page, 'Field');
  await expectMatchesCore(page, coreAssess(counted, flags), GAP);
  // the standard rule checks a limit at 1 − 0.9·0.7·5 % = 96.85 % (src/stop/standard-level.ts): one defect in
  // 17 items is not yet enough; the bound for the lot of 200 drops below 25 % at the 19th item (the core's own
  // figures, compared at every entry)
  for (const _ of [17, 18]) {
    await item(0);
    counted.push(0);
    await expectMatchesCore(page, coreAssess(counted, flags), GAP);
    await expect(page.getByTestId('verdict')).toHaveText('keep going');
  }
  await item(0);
  counted.push(0);
  await expectMatchesCore(page, coreAssess(counted, flags), GAP);
  await expect(page.getByTestId('verdict')).toHaveText('below limit');
  await screenshot(page, 'field-pass-fail-below-limit');
  await offlineReload(page);
  await expectMatchesCore(page, coreAssess(counted, flags), GAP);
  await openTab(page, 'Report');
  await expect(page.getByTestId('report-verdict')).toHaveText('below limit');
  await expect(page.getByText('Client acceptance note CA-7 (invented), 2026-05-01').first()).toBeVisible();
  await screenshot(page, 'report-pass-fail');
});
