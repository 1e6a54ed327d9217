// @vitest-environment happy-dom
// The crew button and panel against fake-indexeddb and the in-memory crew server
// (test/web/sync-fake-server.ts): the status words, sharing shows the crew code as text in four groups
// (Crockford Base32 shown as groups of four, src/sync/crew-code.ts) and as a QR code of a join link, and
// the crew verdict is the one the core's crewView gives over the same events.
import 'fake-indexeddb/auto';
import { cleanup, fireEvent, render, screen, waitFor } from '@testing-library/preact';
import { IDBFactory } from 'fake-indexeddb';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { crewView, type StudySetup } from '../../src/index.ts';
import { CrewChip } from '../../web/app/components/crew-chip.tsx';
import { CrewJoin } from '../../web/app/components/crew-join.tsx';
import { getLink, listCrewEvents } from '../../web/storage/crew.ts';
import { resetDbForTests } from '../../web/storage/db.ts';
import { deviceId } from '../../web/storage/meta.ts';
import { appendDemoEntries, listObservations } from '../../web/storage/observations.ts';
import { createStudy, getStudy } from '../../web/storage/studies.ts';
import { deps, setSyncDeps } from '../../web/sync/deps.ts';
import { resetSyncForTests, syncStudy } from '../../web/sync/engine.ts';
import { FakeCrewServer } from './sync-fake-server.ts';

const setup: StudySetup = {
  kind: 'measurement',
  unit: 'mg/L',
  level: 0.95,
  sided: 'two',
  rule: 'naive',
  min: 3,
  target: { kind: 'margin', value: 0.5 },
};
const original = { ...deps };
let server: FakeCrewServer;

beforeEach(() => {
  resetDbForTests();
  resetSyncForTests();
  globalThis.indexedDB = new IDBFactory();
  server = new FakeCrewServer();
  setSyncDeps({ fetch: server.fetch, setTimer: () => null, clearTimer: () => undefined });
});
afterEach(() => {
  cleanup();
  resetSyncForTests();
  setSyncDeps(original);
});

describe('crew panel', () => {
  it('share: the code as text in four groups and as a QR code; the status says synced; the crew verdict is crewView’s', async () => {
    const s = await createStudy({ name: 'Well 3', setup }, 'dev');
    const me = await deviceId();
    await appendDemoEntries(s.id, [5.1, 4.9, 5.3], 1000, me);
    render(<CrewChip studyId={s.id} />);
    const chip = await screen.findByRole('button', { name: 'Crew' });
    fireEvent.click(chip);
    fireEvent.click(await screen.findByRole('button', { name: 'Share with crew' }));
    await waitFor(() => expect(screen.getByTestId('crew-code').textContent).toBe('ABCD-EFGH-JKMN-PQRS'));
    const qr = screen.getByRole('img', { name: /QR code to join this study/ });
    expect(qr.querySelector('path')?.getAttribute('d')).toMatch(/^M\d+ \d+h1v1h-1z/);
    // another phone's entries arrive with the next sync
    const b = server.addPhone('phone-B');
    for (const [i, value] of [5.0, 5.2].entries())
      server.events.push({
        id: crypto.randomUUID(),
        studyId: s.id,
        seq: i + 1,
        at: '2026-05-04T08:00:00+02:00',
        device: b.device,
        value,
      });
    fireEvent.click(screen.getByRole('button', { name: 'Sync now' }));
    await waitFor(() => expect(screen.getByTestId('crew-n').textContent).toBe('n 5 from 2 phones'));
    expect(screen.getByTestId('crew-sync-status').textContent).toMatch(/^synced · last sync \d\d:\d\d$/);
    // the button is short (it shares the status row); the time of the last sync is in the panel's line
    expect(screen.getByRole('button', { name: 'Crew · synced' })).toBeTruthy();
    const expected = crewView((await getStudy(s.id))!, [
      ...(await listObservations(s.id)),
      ...(await listCrewEvents(s.id)),
    ]);
    expect(screen.getByTestId('crew-verdict').textContent).toBe(expected.assessment!.verdict.status);
    expect(screen.getAllByTestId('crew-phone').map((li) => li.textContent)).toEqual(
      expected.phones.map(
        (p) => `${p.device === me ? 'This phone' : `Phone ${p.device.slice(0, 8)}`}: ${p.counted} counted`,
      ),
    );
    // stop the code: no code is shown any more
    fireEvent.click(screen.getByRole('button', { name: 'Stop code' }));
    await waitFor(() => expect(screen.getByTestId('crew-code').textContent).toContain('No code works now'));
    expect((await getLink(s.id))?.crewCode).toBeNull();
  });

  it('waiting and refused: "N waiting" on the button; a refusal is shown with "Try again"', async () => {
    const s = await createStudy({ name: 'Well 4', setup }, 'dev');
    const me = await deviceId();
    render(<CrewChip studyId={s.id} />);
    fireEvent.click(await screen.findByRole('button', { name: 'Crew' }));
    fireEvent.click(await screen.findByRole('button', { name: 'Share with crew' }));
    await waitFor(() => screen.getByTestId('crew-code'));
    await syncStudy(s.id, 'manual');
    server.faults.push({ kind: 'network' });
    await appendDemoEntries(s.id, [5.1, 4.9, 5.3], 1000, me);
    await syncStudy(s.id, 'manual');
    await waitFor(() =>
      expect(screen.getByTestId('crew-sync-status').textContent).toMatch(/^offline — 3 waiting/),
    );
    expect(screen.getByRole('button', { name: /^Crew · offline — 3 waiting/ })).toBeTruthy();
    server.faults.push({ kind: 'status', status: 409, error: 'event held with other content' });
    fireEvent.click(screen.getByRole('button', { name: 'Sync now' }));
    await waitFor(() => expect(screen.getByTestId('crew-sync-status').textContent).toContain('Sync stopped'));
    expect(screen.getByRole('button', { name: /^Crew · sync stopped/ })).toBeTruthy();
    // the panel's own request is over when its buttons are enabled again
    await waitFor(() =>
      expect((screen.getByRole('button', { name: 'Try again' }) as HTMLButtonElement).disabled).toBe(false),
    );
    fireEvent.click(screen.getByRole('button', { name: 'Try again' }));
    await waitFor(() => expect(screen.getByTestId('crew-sync-status').textContent).toMatch(/^synced/));
    expect(server.events).toHaveLength(3);
  });
});

describe('join a crew', () => {
  it('a scanned link fills the code; something that is not a code is refused with a message', async () => {
    window.location.hash = '#/?join=ABCD-EFGH-JKMN-PQR';
    render(<CrewJoin />);
    const field = screen.getByLabelText('Crew code') as HTMLInputElement;
    expect(field.value).toBe('ABCD-EFGH-JKMN-PQR');
    fireEvent.click(screen.getByRole('button', { name: 'Join' }));
    await waitFor(() => expect(screen.getByRole('alert').textContent).toContain('not a crew code'));
    expect(server.log).toHaveLength(0);
  });
});
