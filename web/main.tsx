/**
 * Bootstrap: open storage (an explicit init step), learn the device id, ask for persistent storage at
 * first run, then render. The service worker registers in production builds only.
 */
import { render } from 'preact';
import { App } from './app/App.tsx';
import { loadCore } from './core-loader.ts';
import './handover/index.ts';
import { registerServiceWorker } from './pwa/register.ts';
import { applyTheme, dbBlocked, device, persistState } from './state/app-state.ts';
import { getDb, onConnectionEvent } from './storage/db.ts';
import { deviceId, ensurePersistence } from './storage/meta.ts';
import './styles/app.css';

async function init(): Promise<void> {
  applyTheme();
  onConnectionEvent((e) => {
    if (e === 'blocking') dbBlocked.set(true);
  });
  const root = document.getElementById('app') as HTMLElement;
  try {
    await getDb();
    device.set(await deviceId());
  } catch (err) {
    root.textContent = `Sure Enough cannot open the phone's storage (${(err as Error).message}). Check that the browser allows site data, then reload.`;
    return;
  }
  render(<App />, root);
  // Fetch the statistics core right after the first paint (see core-loader.ts).
  void loadCore();
  registerServiceWorker();
  persistState.set(await ensurePersistence().catch(() => ({ answer: 'refused' as const, firstRun: false })));
}

void init();
