/**
 * Bootstrap: the storage open, the statistics core's fetch and the first render start together (nothing
 * waits for another); the device id is read, never written after the first run, and persistent storage is
 * asked for at first run only. The service worker registers in production builds only.
 */
// first: the database open starts before the rest of the app's modules are evaluated
import './storage/early.ts';
import { render } from 'preact';
import { App } from './app/App.tsx';
import { loadCore } from './core-loader.ts';
import './handover/index.ts';
import { registerServiceWorker } from './pwa/register.ts';
import { applyTheme, dbBlocked, deviceFrom, persistState } from './state/app-state.ts';
import { getDb, onConnectionEvent } from './storage/db.ts';
import { deviceId, ensurePersistence } from './storage/meta.ts';
import { startSync } from './sync/index.ts';
import './sync/register.ts';
import './styles/app.css';

function init(): void {
  applyTheme();
  onConnectionEvent((e) => {
    if (e === 'blocking') dbBlocked.set(true);
  });
  const root = document.getElementById('app') as HTMLElement;
  const opened = getDb();
  // the core is its own chunk (core-loader.ts): fetched now, in parallel with the storage open
  void loadCore();
  deviceFrom(opened.then(() => deviceId()));
  render(<App />, root);
  opened.then(
    () => {
      registerServiceWorker();
      // crew server sync (web/sync): linked studies sync now, after saves and when the phone is back online
      startSync();
      void ensurePersistence()
        .catch(() => ({ answer: 'refused' as const, firstRun: false }))
        .then((p) => persistState.set(p));
    },
    (err: Error) => {
      render(null, root);
      root.textContent = `Sure Enough cannot open the phone's storage (${err.message}). Check that the browser allows site data, then reload.`;
    },
  );
}

init();
