// The floor's bare service worker: caches the read page and its script, serves them cache-first offline.
const FILES = ['read.html', 'floor-db.js'];
self.addEventListener('install', (e) => {
  e.waitUntil(
    caches
      .open('floor')
      .then((c) => c.addAll(FILES))
      .then(() => self.skipWaiting()),
  );
});
self.addEventListener('activate', (e) => e.waitUntil(self.clients.claim()));
self.addEventListener('fetch', (e) => {
  e.respondWith(caches.match(e.request, { ignoreSearch: true }).then((r) => r ?? fetch(e.request)));
});
