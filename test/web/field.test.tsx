// @vitest-environment happy-dom
// The field screen against fake-indexeddb: the pad is unusable until the first load has finished,
// "Saved" appears only after the commit, and a storage failure keeps the typed value.
import 'fake-indexeddb/auto';
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/preact';
import { IDBFactory } from 'fake-indexeddb';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { assess, type StudySetup } from '../../src/index.ts';
import { FieldScreen } from '../../web/app/screens/field.tsx';
import { LogScreen } from '../../web/app/screens/log.tsx';
import { resetDbForTests } from '../../web/storage/db.ts';
import { addEntry, listObservations } from '../../web/storage/observations.ts';
import { createStudy } from '../../web/storage/studies.ts';

const setup: StudySetup = {
  kind: 'measurement',
  unit: 'mg/L',
  level: 0.95,
  sided: 'two',
  rule: 'standard',
  min: 3,
  target: { kind: 'margin', value: 0.5 },
};

beforeEach(() => {
  resetDbForTests();
  globalThis.indexedDB = new IDBFactory();
});
afterEach(() => {
  cleanup();
  vi.restoreAllMocks();
});

const input = () => screen.getByLabelText(/^Value/) as HTMLInputElement;

async function save(text: string) {
  fireEvent.input(input(), { target: { value: text } });
  fireEvent.click(screen.getByRole('button', { name: 'Save' }));
}

describe('field screen', () => {
  it('no enabled Save before the first load; then saves, shows "Saved #n" after commit, updates n', async () => {
    const s = await createStudy({ name: 'Well 3', setup }, 'dev');
    for (const v of [5.1, 4.9]) await addEntry(s.id, { value: v }, 'dev');
    render(<FieldScreen id={s.id} />);
    expect(screen.queryByRole('button', { name: 'Save' })).toBeNull();
    await waitFor(() => expect(screen.getByTestId('n').textContent).toBe('2'));
    expect((screen.getByRole('button', { name: 'Save' }) as HTMLButtonElement).disabled).toBe(false);
    await save('5,3');
    // the study writes numbers one way: its separator (the test phone's locale, en-US: a point), whatever was typed
    await waitFor(() => expect(screen.getByTestId('pad-msg').textContent).toBe('Saved #3: 5.3 mg/L'));
    // the statistics follow the acknowledged save, after the next frame
    await waitFor(() => expect(screen.getByTestId('n').textContent).toBe('3'));
    const log = await listObservations(s.id);
    expect(log.map((r) => r.value)).toEqual([5.1, 4.9, 5.3]);
    // the screen shows the core's own verdict for these points
    const a = assess([{ value: 5.1 }, { value: 4.9 }, { value: 5.3 }], setup);
    expect(screen.getByTestId('verdict').textContent).toBe(a.verdict.status);
    expect(screen.getByTestId('backup').textContent).toBe('3 entries not yet exported');
  });

  it('a quota failure shows the message, keeps the value, saves nothing', async () => {
    const s = await createStudy({ name: 'Well 4', setup }, 'dev');
    render(<FieldScreen id={s.id} />);
    await waitFor(() => screen.getByRole('button', { name: 'Save' }));
    vi.spyOn(globalThis.IDBObjectStore.prototype, 'add').mockImplementation(() => {
      throw new DOMException('quota', 'QuotaExceededError');
    });
    await save('7,25');
    await waitFor(() =>
      expect(screen.getByTestId('pad-msg').textContent).toMatch(/^Not saved: .*no storage space/),
    );
    expect(input().value).toBe('7,25');
    expect(screen.getByTestId('n').textContent).toBe('0');
    vi.restoreAllMocks();
    expect(await listObservations(s.id)).toHaveLength(0);
  });

  it('undo last asks for a reason, voids, and the log keeps the original struck through', async () => {
    const s = await createStudy({ name: 'Well 5', setup }, 'dev');
    for (const v of [5.1, 4.9, 5.6]) await addEntry(s.id, { value: v }, 'dev');
    render(<FieldScreen id={s.id} />);
    await waitFor(() => expect(screen.getByTestId('n').textContent).toBe('3'));
    fireEvent.click(screen.getByRole('button', { name: 'Undo last' }));
    fireEvent.click(screen.getByRole('button', { name: 'Void it' }));
    await waitFor(() => expect(screen.getByRole('alert').textContent).toMatch(/^Reason: say why/));
    fireEvent.click(screen.getByRole('button', { name: 'wrong key' }));
    fireEvent.click(screen.getByRole('button', { name: 'Void it' }));
    await waitFor(() => expect(screen.getByTestId('n').textContent).toBe('2'));
    cleanup();
    render(<LogScreen id={s.id} />);
    await waitFor(() => screen.getAllByTestId('log-entry'));
    const voided = screen.getAllByTestId('log-entry').find((li) => li.querySelector('del'));
    expect(voided?.textContent).toMatch(/#3.*5\.6 mg\/L.*voided: wrong key/);
    expect(screen.getByTestId('log-void').textContent).toMatch(/void of #3: wrong key/);
  });
});
