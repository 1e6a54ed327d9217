/**
 * Service-worker registration (production builds only). A new version never takes over by itself:
 * when it waits, `updateWaiting` holds an accept function; the prompt shows it only while nothing is
 * half-typed, and the page reloads only after the user accepted.
 */
import { Workbox } from 'workbox-window';
import { offlineReady, updateWaiting } from '../state/app-state.ts';

export function registerServiceWorker(): void {
  if (!import.meta.env.PROD || !('serviceWorker' in navigator)) return;
  const wb = new Workbox(`${import.meta.env.BASE_URL}sw.js`, { scope: import.meta.env.BASE_URL });
  let accepted = false;
  wb.addEventListener('waiting', () => {
    updateWaiting.set(() => {
      accepted = true;
      wb.messageSkipWaiting();
    });
  });
  wb.addEventListener('controlling', () => {
    // Reload only when this page asked for the new version (never under someone mid-entry). Not gated
    // on `isUpdate`: workbox-window sets that from whether the page was controlled when it registered,
    // so in the session that first installed the app an accepted update would never reload.
    if (accepted) window.location.reload();
  });
  // said once per page: after OK it must not come back when the same install also activates
  let announced = false;
  const announce = () => {
    if (announced) return;
    announced = true;
    offlineReady.set(true);
  };
  wb.addEventListener('installed', (e) => {
    if (!e.isUpdate) announce();
  });
  // A first install can finish before workbox-window watches it (a fast install on a busy phone): then no
  // 'installed' event comes. A page that no service worker controlled at load, once one is active, is the
  // same news: ready to work offline.
  const firstInstall = navigator.serviceWorker.controller === null;
  void wb
    .register()
    .then(() => navigator.serviceWorker.ready)
    .then(() => {
      if (firstInstall) announce();
    });
}
