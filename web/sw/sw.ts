/// <reference lib="webworker" />
/**
 * The service worker: precaches the app shell so the app opens offline, serves index.html for every
 * navigation (deep links work offline), and activates a new version only when the page asks
 * (SKIP_WAITING after the user accepted "update") — never on its own, so nothing reloads mid-entry.
 */
import { clientsClaim } from 'workbox-core';
import { cleanupOutdatedCaches, createHandlerBoundToURL, precacheAndRoute } from 'workbox-precaching';
import { NavigationRoute, registerRoute } from 'workbox-routing';

declare const self: ServiceWorkerGlobalScope & {
  __WB_MANIFEST: Array<{ url: string; revision: string | null }>;
};

precacheAndRoute(self.__WB_MANIFEST);
cleanupOutdatedCaches();
// Control the first visit too, so the app is offline-ready without a second load.
clientsClaim();
registerRoute(new NavigationRoute(createHandlerBoundToURL('index.html')));

self.addEventListener('message', (event) => {
  if ((event.data as { type?: string } | null)?.type === 'SKIP_WAITING') void self.skipWaiting();
});
