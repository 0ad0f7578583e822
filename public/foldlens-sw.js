// Foldlens demo service worker: keeps every same-origin file the demo has loaded, so the demo
// opens and works with the network cut after a first visit (field use). Network first, so a
// new build is picked up whenever the network is there; the cache answers when it is not.
const CACHE = 'foldlens-demo-v1';

self.addEventListener('install', () => self.skipWaiting());
self.addEventListener('activate', (event) => event.waitUntil(self.clients.claim()));

// The page sends the files it loaded before this worker took control; keep them all.
self.addEventListener('message', (event) => {
  const data = event.data || {};
  if (data.type !== 'foldlens-cache' || !Array.isArray(data.urls)) return;
  const sameOrigin = data.urls.filter((u) => typeof u === 'string' && new URL(u, self.location.href).origin === self.location.origin);
  event.waitUntil(
    caches
      .open(CACHE)
      .then((cache) => Promise.all(sameOrigin.map((u) => cache.add(u).catch(() => undefined))))
      .then(() => event.source && event.source.postMessage({ type: 'foldlens-cached', count: sameOrigin.length })),
  );
});

self.addEventListener('fetch', (event) => {
  const request = event.request;
  if (request.method !== 'GET' || new URL(request.url).origin !== self.location.origin) return;
  event.respondWith(
    fetch(request)
      .then((response) => {
        if (response.ok) {
          const copy = response.clone();
          event.waitUntil(caches.open(CACHE).then((cache) => cache.put(request, copy)));
        }
        return response;
      })
      .catch(() => caches.match(request, { ignoreSearch: true, ignoreVary: true }).then((hit) => hit || Response.error())),
  );
});
