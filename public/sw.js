/*
 * Ampwright's offline shell. The app's data lives in IndexedDB; this worker only keeps the files
 * of the web app itself, so the page opens in a basement with no signal. API calls are never
 * cached here: the sync engine decides what is current.
 */
const CACHE = 'ampwright-shell-v1';

self.addEventListener('install', (event) => {
  event.waitUntil(caches.open(CACHE).then((cache) => cache.add('/')).then(() => self.skipWaiting()));
});

self.addEventListener('activate', (event) => {
  event.waitUntil(
    caches
      .keys()
      .then((names) => Promise.all(names.filter((n) => n !== CACHE).map((n) => caches.delete(n))))
      .then(() => self.clients.claim()),
  );
});

// the page lists what it loaded before this worker took control; keep those files too
self.addEventListener('message', (event) => {
  if (event.data?.type !== 'cache-urls') return;
  const urls = event.data.urls.filter((u) => new URL(u).origin === self.location.origin);
  event.waitUntil(
    caches
      .open(CACHE)
      .then((cache) => Promise.all(urls.map((u) => cache.add(u).catch(() => undefined))))
      .then(() => event.source?.postMessage({ type: 'cached', count: urls.length })),
  );
});

self.addEventListener('fetch', (event) => {
  const request = event.request;
  const url = new URL(request.url);
  if (request.method !== 'GET' || url.origin !== self.location.origin || url.pathname.startsWith('/api/')) return;

  if (request.mode === 'navigate') {
    // pages: the network first (a new build), the cached shell when there is none
    event.respondWith(
      fetch(request)
        .then((response) => {
          const copy = response.clone();
          caches.open(CACHE).then((cache) => cache.put('/', copy));
          return response;
        })
        .catch(() => caches.match('/')),
    );
    return;
  }
  // hashed bundles, fonts and images: the cache first, then the network (and keep a copy)
  event.respondWith(
    caches.match(request).then(
      (hit) =>
        hit ||
        fetch(request).then((response) => {
          if (response.ok) {
            const copy = response.clone();
            caches.open(CACHE).then((cache) => cache.put(request, copy));
          }
          return response;
        }),
    ),
  );
});
