/**
 * Bootstrap: the storage open and the first render start together; the statistics core is loaded by the
 * first screen that needs it (web/core-loader.ts) — the field screen opened from its snapshot only after its
 * first frame. The device id is read, never written after the first run, and persistent storage is asked
 * for at first run only. The service worker registers in production builds only, once the storage opened.
 */
// first: the database open starts before the rest of the app's modules are evaluated
import './storage/early.ts';
import { render } from 'preact';
import { App } from './app/App.tsx';
import './handover/index.ts';
import { registerServiceWorker } from './pwa/register.ts';
import { applyTheme, dbBlocked, deviceFrom, persistState } from './state/app-state.ts';
import { getDb, onConnectionEvent } from './storage/db.ts';
import { deviceId, ensurePersistence } from './storage/meta.ts';
import { startSync } from './sync/index.ts';
import './sync/register.ts';
import './styles/app.css';

/** Runs `fn` once the page is idle (within 2 s), so that it never competes with the first screen. */
function whenIdle(fn: () => void): void {
  const idle = (globalThis as { requestIdleCallback?: (fn: () => void, o?: { timeout: number }) => void })
    .requestIdleCallback;
  if (idle) idle(fn, { timeout: 2_000 });
  else setTimeout(fn, 200);
}

function init(): void {
  applyTheme();
  onConnectionEvent((e) => {
    if (e === 'blocking') dbBlocked.set(true);
  });
  const root = document.getElementById('app') as HTMLElement;
  const opened = getDb();
  deviceFrom(opened.then(() => deviceId()));
  render(<App />, root);
  opened.then(
    () =>
      whenIdle(() => {
        // none of this is drawn in the first frame: after it, when the phone is idle
        registerServiceWorker();
        // crew server sync (web/sync): linked studies sync now, after saves and when the phone is back online
        startSync();
        void ensurePersistence()
          .catch(() => ({ answer: 'refused' as const, firstRun: false }))
          .then((p) => persistState.set(p));
      }),
    (err: Error) => {
      render(null, root);
      root.textContent = `Sure Enough cannot open the phone's storage (${err.message}). Check that the browser allows site data, then reload.`;
    },
  );
}

init();
