/**
 * The field screen's running snapshot (web/storage/snapshots.ts, SCHEMA-v3.md) in real Chromium on the
 * production build: it is written after saves, the field screen reopens from it with the same figures, and
 * a damaged snapshot or a log that moved on without it (another tab's entry) is rebuilt from the log —
 * nothing lost, nothing written at start. What is on disk is read and changed with raw IndexedDB calls.
 */
import { expect, type Page, test } from '@playwright/test';
import { expectSaved, rawLog, readStore, studyIdOf, typeAndSave } from './fixtures/browser.ts';
import { createMeasurementStudy } from './helpers.ts';

interface Snap {
  studyId: string;
  count: number;
  lastId: string | null;
  running: { values: number[] };
}

async function snapshotOf(page: Page, id: string): Promise<Snap | undefined> {
  return (await readStore<Snap>(page, 'snapshots')).find((s) => s.studyId === id);
}

/** Puts one record into a store with plain IndexedDB calls (the app is not involved). */
function rawWrite(page: Page, store: string, value: unknown): Promise<void> {
  return page.evaluate(
    ({ store, value }) =>
      new Promise<void>((resolve, reject) => {
        const req = indexedDB.open('sure-enough');
        req.onsuccess = () => {
          const tx = req.result.transaction(store, 'readwrite');
          tx.objectStore(store).put(value);
          tx.oncomplete = () => {
            req.result.close();
            resolve();
          };
          tx.onerror = () => reject(tx.error);
        };
      }),
    { store, value },
  );
}

test('the field screen reopens from its snapshot; a damaged or outdated one is rebuilt from the log', async ({
  page,
}) => {
  await page.goto('/');
  await createMeasurementStudy(page, { name: 'Snapshot check', unit: 'mg/L', margin: '0,5', min: 3 });
  const id = studyIdOf(page);
  const values = ['4,1', '4,4', '3,9', '4,6'];
  for (const [i, v] of values.entries()) {
    await typeAndSave(page, v);
    await expectSaved(page, i + 1);
  }
  await expect(page.getByTestId('n')).toHaveText('4');
  // written once saves pause, naming the log it was taken from
  await expect.poll(async () => (await snapshotOf(page, id))?.count, { timeout: 10_000 }).toBe(4);
  const log = await rawLog(page, id);
  const snap = (await snapshotOf(page, id)) as Snap;
  expect(snap.lastId).toBe(log.at(-1)?.id);
  expect(snap.running.values).toEqual([4.1, 4.4, 3.9, 4.6]);

  const verdict = await page.getByTestId('verdict').textContent();
  await page.reload();
  await expect(page.getByTestId('n')).toHaveText('4');
  await expect(page.getByTestId('verdict')).toHaveText(verdict ?? '');
  // nothing written at start: the snapshot is the same record
  expect(await snapshotOf(page, id)).toEqual(snap);

  // a damaged snapshot: the screen is rebuilt from the log, with the same figures
  await rawWrite(page, 'snapshots', { ...snap, running: { ...snap.running, values: 'damaged' } });
  await page.reload();
  await expect(page.getByTestId('n')).toHaveText('4');
  await expect(page.getByTestId('verdict')).toHaveText(verdict ?? '');

  // another tab's entry after the snapshot: the log moved on, the screen counts it
  await rawWrite(page, 'snapshots', snap);
  await rawWrite(page, 'observations', {
    ...log.at(-1),
    id: crypto.randomUUID(),
    seq: 5,
    value: 4.2,
    device: 'phone-B',
  });
  await page.reload();
  await expect(page.getByTestId('n')).toHaveText('5');
  // and this tab's next save goes after it (seq 6), not over it
  await typeAndSave(page, '4,0');
  await expectSaved(page, 6);
  expect((await rawLog(page, id)).map((r) => r.seq)).toEqual([1, 2, 3, 4, 5, 6]);
});
