// Tallyproof's service worker, used only when the page is served over http(s) (from file:// the
// single file needs none): it keeps the page and itself in a cache after the first visit, so
// the calculator opens offline. It never contacts any other origin.
const CACHE = 'tallyproof-v1';
const PAGE = new URL('tallyproof.html', self.registration.scope).href;

self.addEventListener('install', (event) => {
  event.waitUntil(caches.open(CACHE).then((c) => c.addAll([PAGE, self.location.href])).then(() => self.skipWaiting()));
});

self.addEventListener('activate', (event) => {
  event.waitUntil(caches.keys().then((keys) => Promise.all(keys.filter((k) => k !== CACHE).map((k) => caches.delete(k))))
    .then(() => self.clients.claim()));
});

self.addEventListener('fetch', (event) => {
  const url = new URL(event.request.url);
  if (event.request.method !== 'GET' || url.origin !== self.location.origin) return;
  const key = url.pathname.endsWith('/') ? PAGE : url.href.split('#')[0];
  // Network first (a newer build replaces the cached one), the cache when offline.
  event.respondWith(fetch(event.request).then((response) => {
    if (response.ok) { const copy = response.clone(); caches.open(CACHE).then((c) => c.put(key, copy)); }
    return response;
  }).catch(() => caches.match(key).then((hit) => hit || caches.match(PAGE))));
});
