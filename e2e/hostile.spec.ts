/**
 * Hostile input in the app (production build, phone profile). The rules under test are the app's own,
 * documented in web/input/parse.ts: measurements are digits with one optional leading minus and at most
 * one decimal comma or point (no letters, so no e-notation, NaN or Infinity; no thousands separators),
 * at most 15 digits, |x| ≤ 10¹²; counts are whole numbers 0 … 10⁹; notes at most 500 characters and
 * never shortened silently. Every refusal must show a message, write nothing and keep what was typed;
 * every acceptance must store exactly the typed number. Names, notes and reasons holding HTML or script
 * must show as text on every screen, in the exported report and in the printable-report window.
 */
import { readFileSync } from 'node:fs';
import { expect, type Page, test } from '@playwright/test';
import { openFresh, rawLog, readStore, studyIdOf } from './fixtures/browser.ts';
import { createMeasurementStudy, keepIfAsked } from './helpers.ts';

async function save(page: Page, text: string): Promise<void> {
  await page.locator('#value-input').fill(text);
  await page.getByRole('button', { name: 'Save', exact: true }).click();
}

async function expectRefused(page: Page, typed: string, n: string): Promise<void> {
  const msg = page.getByTestId('pad-msg');
  await expect(msg).toHaveAttribute('role', 'alert');
  await expect(msg).toContainText(/\S/);
  await expect(msg).not.toHaveAttribute('data-committed', '1');
  await expect(page.getByTestId('n')).toHaveText(n);
  // what was typed stays for the user to fix: never silently changed or cleared
  await expect(page.locator('#value-input')).toHaveValue(typed);
}

test('measurement pad: NaN, Infinity, 1e309, "1,2,3" and the like are refused; accepted values are kept exactly', async ({
  page,
}) => {
  test.setTimeout(90_000);
  await openFresh(page);
  await createMeasurementStudy(page, { name: 'Hostile values', unit: 'mg/L', margin: '0,5' });
  const id = studyIdOf(page);
  const refused = [
    'NaN',
    'Infinity',
    '-Infinity',
    '1e309',
    '1e3',
    '1,2,3',
    '1.2.3',
    '1.000,5',
    '12 5',
    '--5',
    '5-',
    '0x1F',
    '１２',
    '٣',
    '1234567890123456',
    '1000000000001',
    '-',
    ',',
    '',
    '   ',
  ];
  for (const bad of refused) {
    await save(page, bad);
    await expectRefused(page, bad, '0');
  }
  expect(await rawLog(page, id)).toEqual([]);

  // accepted under the documented rule, stored as exactly the typed number
  const accepted: [string, number][] = [
    ['-0,25', -0.25],
    ['1234567,891', 1234567.891],
    ['0', 0],
    ['-0', 0],
    ['999999999999', 999999999999],
    ['.5', 0.5],
    ['7.', 7],
    [' 12,5 ', 12.5],
    ['0,000000000001', 1e-12],
  ];
  for (const [i, [typed]] of accepted.entries()) {
    await save(page, typed);
    // far-off values are questioned ("keep it?") and kept exactly as typed
    await keepIfAsked(page, i + 1);
    const msg = page.getByTestId('pad-msg');
    await expect(msg).toHaveAttribute('data-committed', '1');
    await expect(msg).toContainText(`Saved #${i + 1}`);
    await expect(page.getByTestId('n')).toHaveText(String(i + 1));
  }
  const log = await rawLog(page, id);
  expect(log.map((r) => r.value)).toEqual(accepted.map(([, v]) => v));
  expect(log.every((r) => !Object.is(r.value, -0))).toBe(true);
});

test('notes: 10,000 characters are refused with their length, kept for editing, and 500 are stored whole', async ({
  page,
}) => {
  await openFresh(page);
  await createMeasurementStudy(page, { name: 'Long notes', unit: 'cm', margin: '1' });
  const id = studyIdOf(page);
  await page.getByRole('button', { name: /^Note/ }).click();
  const note = page.getByLabel('Note for the next entry');
  const long = 'Silt and gravel, '.repeat(600).slice(0, 10_000);
  await note.fill(long);
  await save(page, '14');
  const msg = page.getByTestId('pad-msg');
  await expect(msg).toHaveAttribute('role', 'alert');
  await expect(msg).toContainText('10,000 characters');
  await expect(msg).toContainText('500');
  await expect(page.getByTestId('n')).toHaveText('0');
  await expect(note).toHaveValue(long);
  await expect(page.locator('#value-input')).toHaveValue('14');

  const fits = `${'ü→ '.repeat(166)}ok`; // 500 characters, non-ASCII included
  expect(fits.length).toBe(500);
  await note.fill(fits);
  await page.getByRole('button', { name: 'Save', exact: true }).click();
  await expect(msg).toHaveAttribute('data-committed', '1');
  expect((await rawLog(page, id)).map((r) => r.note)).toEqual([fits]);
});

test('count pad: negative, fractional, exponent, NaN, Infinity, empty and "1,2,3" are refused', async ({
  page,
}) => {
  await openFresh(page);
  await page.goto('/#/new');
  await page.getByLabel('Study name').fill('Hostile counts');
  await page.getByRole('radio', { name: /^Count per plot/ }).check();
  await page.getByLabel('Plot area', { exact: true }).fill('1');
  await page.getByRole('radio', { name: /^Relative/ }).check();
  await page.getByLabel('Target: ± % of the estimate').fill('30');
  await page.getByLabel('I have read the cautions').check();
  await page.getByRole('button', { name: 'Start the study' }).click();
  await expect(page.getByTestId('verdict')).toBeVisible();
  const id = studyIdOf(page);
  const input = page.getByLabel('Count in this plot');
  const saveBtn = page.locator('button.save');
  for (const bad of ['-3', '2,5', '2.5', '1e3', 'NaN', 'Infinity', '', '1,2,3', '1000000001', '3 4', '+4']) {
    await input.fill(bad);
    await saveBtn.click();
    const msg = page.getByTestId('pad-msg');
    await expect(msg).toHaveAttribute('role', 'alert');
    await expect(msg).toContainText(/\S/);
    await expect(page.getByTestId('n')).toHaveText('0');
    await expect(input).toHaveValue(bad);
  }
  expect(await rawLog(page, id)).toEqual([]);
  for (const [i, [typed, value]] of (
    [
      ['0', 0],
      ['007', 7],
      ['1000000000', 1e9],
    ] as const
  ).entries()) {
    await input.fill(typed);
    await saveBtn.click();
    await keepIfAsked(page, i + 1); // 1,000,000,000 is above the expected 0–10,000 per plot: kept
    await expect(page.getByTestId('pad-msg')).toContainText(`Saved #${i + 1}`);
    expect((await rawLog(page, id)).at(-1)?.value).toBe(value);
  }
});

test('setup: a hostile target or name is refused field by field and no study is created', async ({
  page,
}) => {
  await openFresh(page);
  await page.goto('/#/new');
  await page.getByLabel('Study name').fill('Setup check');
  await page.getByRole('radio', { name: /^Measurement/ }).check();
  await page.getByLabel('Unit', { exact: true }).fill('mg/L');
  await page.getByRole('radio', { name: /^Margin/ }).check();
  await page.getByLabel('I have read the cautions').check();
  const target = page.getByLabel('Target margin ±');
  const start = page.getByRole('button', { name: 'Start the study' });
  for (const bad of ['NaN', 'Infinity', '1e309', '1,2,3', '-1', '0', '', '١']) {
    await target.fill(bad);
    await start.click();
    await expect(page.locator('#e-targetValue')).toBeVisible();
    await expect(page.getByRole('alert').filter({ hasText: 'Not started' })).toBeVisible();
    await expect(target).toHaveValue(bad);
    expect(page.url()).toContain('#/new');
  }
  await target.fill('0,5');
  await page.getByLabel('Study name').fill('x'.repeat(10_000));
  await start.click();
  await expect(page.locator('#e-name')).toContainText('10000 characters');
  expect(page.url()).toContain('#/new');
  expect(await readStore(page, 'studies')).toEqual([]);
});

const NAME = '<img src=x onerror="window.__pwned=1">Site <b>A</b> & "B"';
const NOTE = '<script>window.__pwned=2</script><svg onload="window.__pwned=3"></svg>turbid';
const REASON = '<iframe src="javascript:window.__pwned=4"></iframe>typo';

/** No injected element exists, no payload ran, and the literal text is on the page. */
async function expectInert(page: Page, literal: string): Promise<void> {
  await expect(page.getByText(literal, { exact: false }).first()).toBeVisible();
  expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
  expect(await page.locator('img[src="x"], svg[onload], iframe, script:not([src])').count()).toBe(0);
}

test('a name, note and reason holding HTML and script show as text everywhere, the report included', async ({
  page,
  context,
}) => {
  test.setTimeout(90_000);
  await openFresh(page);
  await createMeasurementStudy(page, { name: NAME, unit: 'mg/L', margin: '2' });
  const id = studyIdOf(page);
  await expectInert(page, 'Site <b>A</b> & "B"');
  await page.getByRole('button', { name: /^Note/ }).click();
  await page.getByLabel('Note for the next entry').fill(NOTE);
  await save(page, '12');
  await expect(page.getByTestId('pad-msg')).toHaveAttribute('data-committed', '1');
  await save(page, '13');
  await expect(page.getByTestId('pad-msg')).toContainText('Saved #2');
  await page.getByRole('button', { name: 'Undo last' }).click();
  const dialog = page.getByRole('dialog');
  await dialog.getByLabel('Reason in your words').fill(REASON);
  await dialog.getByRole('button', { name: 'Void it' }).click();
  await expect(dialog).toHaveCount(0);

  // stored exactly as typed (nothing stripped or rewritten)
  const studies = await readStore<{ id: string; name: string }>(page, 'studies');
  expect(studies.find((s) => s.id === id)?.name).toBe(NAME);
  const log = await rawLog(page, id);
  expect(log.map((r) => r.note ?? r.reason ?? null)).toEqual([NOTE, null, REASON]);

  for (const hash of ['#/', `#/s/${id}`, `#/s/${id}/log`, `#/s/${id}/report`]) {
    await page.goto(`/${hash}`);
    await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
    await expectInert(page, hash === '#/' || hash.endsWith('report') ? 'Site <b>A</b>' : 'Site <b>A</b>');
    if (hash.endsWith('/log')) {
      await expectInert(page, 'window.__pwned=2');
      await expectInert(page, 'javascript:window.__pwned=4');
    }
  }

  // the exported report file, opened WITHOUT the app's CSP: only escaping protects it here
  const dl = page.waitForEvent('download');
  await page.getByTestId('export-report').click();
  const html = readFileSync((await (await dl).path())!, 'utf8');
  const bare = await context.newPage();
  await bare.setContent(html);
  await expectInert(bare, 'Site <b>A</b> & "B"');
  await expect(bare.getByText('javascript:window.__pwned=4').first()).toBeVisible();
  await bare.close();

  // the printable-report window
  const popupP = context.waitForEvent('page');
  await page.getByTestId('open-report').click();
  const popup = await popupP;
  await popup.waitForLoadState();
  await expectInert(popup, 'Site <b>A</b> & "B"');
  expect(await page.evaluate(() => (window as unknown as { __pwned?: number }).__pwned)).toBeUndefined();
});
