/**
 * Hand-over in the browser: import a pooled study bundle, export it from the app, import that export
 * into a fresh browser profile (a new context has its own IndexedDB) — the statistics are identical;
 * a malformed or damaged file leaves the database exactly as it was.
 *
 * Fixture test/fixtures/handover-pooled.bundle.json was made with the command line (two phones, merged):
 *   F='--kind count --target precision:0.2 --plot-area 0.25 --plot-area-unit m2 --taxon "Carex nigra"
 *      --name "Sedge plots, north meadow" --id 0f8fad5b-d9cb-469f-a165-70867728950e'
 *   sure-enough bundle test/fixtures/handover-counts-a.txt $F --device phone-A --at 2026-05-04T09:00:00+02:00 > a.json
 *   sure-enough bundle test/fixtures/handover-counts-b.txt $F --device phone-B --at 2026-05-04T09:00:05+02:00 > b.json
 *   sure-enough merge a.json b.json > test/fixtures/handover-pooled.bundle.json
 * Expected figures come from `sure-enough assess` on the same 17 values (the core the app uses), read off
 * the pooled file here rather than typed in.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect, type Page, test } from '@playwright/test';

const FIXTURE = join(import.meta.dirname, '..', 'test', 'fixtures', 'handover-pooled.bundle.json');
const STUDY_ID = '0f8fad5b-d9cb-469f-a165-70867728950e';

/** Counts of the app's stores, read straight from IndexedDB. */
async function storeCounts(page: Page): Promise<Record<string, number>> {
  return page.evaluate(
    () =>
      new Promise<Record<string, number>>((resolve, reject) => {
        const req = indexedDB.open('sure-enough');
        req.onerror = () => reject(req.error);
        req.onsuccess = () => {
          const db = req.result;
          const names = ['studies', 'observations', 'exports'].filter((n) => db.objectStoreNames.contains(n));
          const out: Record<string, number> = {};
          if (names.length === 0) {
            db.close();
            resolve(out);
            return;
          }
          const tx = db.transaction(names);
          for (const n of names) {
            const c = tx.objectStore(n).count();
            c.onsuccess = () => {
              out[n] = c.result;
            };
          }
          tx.oncomplete = () => {
            db.close();
            resolve(out);
          };
        };
      }),
  );
}

async function importFile(page: Page, path: string): Promise<void> {
  await page.goto('/#/');
  await page.getByTestId('import-file').setInputFiles(path);
}

async function reportFacts(page: Page): Promise<string> {
  await page.goto(`/#/s/${STUDY_ID}/report`);
  await expect(page.getByTestId('report-verdict')).toBeVisible();
  return ((await page.locator('dl.facts').textContent()) ?? '').trim();
}

test('export a bundle, import it into a fresh profile: identical statistics; bad files change nothing', async ({
  browser,
}) => {
  // Phone 1: pool the two collectors' bundle, then export the study from the app.
  const one = await browser.newContext();
  const p1 = await one.newPage();
  await importFile(p1, FIXTURE);
  await expect(p1.getByTestId('import-done')).toContainText('17 added');
  const facts1 = await reportFacts(p1);
  expect(facts1).toContain('17');
  await expect(p1.getByTestId('handover-pending')).toContainText('17 records not yet');
  const [download] = await Promise.all([
    p1.waitForEvent('download'),
    p1.getByTestId('export-bundle').click(),
  ]);
  const exported = join(tmpdir(), `handover-${Date.now()}.bundle.json`);
  await download.saveAs(exported);
  // the counter resets only now that the export completed
  await expect(p1.getByTestId('handover-pending')).toContainText('Everything is in an export');
  expect((await storeCounts(p1)).exports).toBe(1);
  const text = readFileSync(exported, 'utf8');
  const original = JSON.parse(readFileSync(FIXTURE, 'utf8'));
  const mine = JSON.parse(text);
  expect(mine.events.map((e: { id: string; value: number }) => [e.id, e.value])).toEqual(
    original.events.map((e: { id: string; value: number }) => [e.id, e.value]),
  );

  // Phone 2: a fresh profile imports the app's export.
  const two = await browser.newContext();
  const p2 = await two.newPage();
  await importFile(p2, exported);
  await expect(p2.getByTestId('import-done')).toContainText('17 added');
  expect(await reportFacts(p2)).toBe(facts1);

  // Importing the same bundle again changes nothing.
  const before = await storeCounts(p2);
  await importFile(p2, exported);
  await expect(p2.getByTestId('import-done')).toContainText('0 added');
  expect(await storeCounts(p2)).toEqual(before);

  // Malformed files: problems named, database unchanged.
  const damaged = join(tmpdir(), `handover-damaged-${Date.now()}.json`);
  writeFileSync(damaged, text.replace(/"value": 7/, '"value": 8'));
  await importFile(p2, damaged);
  await expect(p2.getByTestId('import-problems')).toContainText('checksum.value: does not match');
  const broken = join(tmpdir(), `handover-broken-${Date.now()}.json`);
  writeFileSync(broken, text.slice(0, 200));
  await importFile(p2, broken);
  await expect(p2.getByTestId('import-problems')).toContainText('file: not valid JSON');
  const badTime = join(tmpdir(), `handover-time-${Date.now()}.json`);
  writeFileSync(badTime, text.replace('"at": "2026-05-04T09:00:03+02:00"', '"at": "04/05/2026 09:00"'));
  await importFile(p2, badTime);
  await expect(p2.getByTestId('import-problems')).toContainText(/events\[\d+\]\.at: not an ISO 8601 time/);
  expect(await storeCounts(p2)).toEqual(before);

  // A malformed file into an empty profile leaves it empty.
  const three = await browser.newContext();
  const p3 = await three.newPage();
  await importFile(p3, damaged);
  await expect(p3.getByTestId('import-problems')).toBeVisible();
  const empty = await storeCounts(p3);
  expect(empty.studies ?? 0).toBe(0);
  expect(empty.observations ?? 0).toBe(0);

  await Promise.all([one.close(), two.close(), three.close()]);
});
