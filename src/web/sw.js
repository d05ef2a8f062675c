// Keeps Doubleprime for offline reuse once it has been served over http(s) or localhost (browsers
// refuse service workers on file://, where the page needs none: it is one self-contained file).
// The page is all there is to keep: dist/index.html holds the glue, the module and the styles.
// Navigations go to the network first, so a new build shows as soon as the server has it, and
// fall back to the kept copy when the server cannot be reached.
const CACHE = 'doubleprime-page-v1';
const PAGE = './';

self.addEventListener('install', (event) => {
  event.waitUntil(caches.open(CACHE).then((cache) => cache.add(PAGE)).then(() => self.skipWaiting()));
});

self.addEventListener('activate', (event) => {
  event.waitUntil(
    caches.keys()
      .then((names) => Promise.all(names.filter((name) => name !== CACHE).map((name) => caches.delete(name))))
      .then(() => self.clients.claim()),
  );
});

self.addEventListener('fetch', (event) => {
  const request = event.request;
  if (request.method !== 'GET' || request.mode !== 'navigate') {
    return;
  }
  event.respondWith(
    fetch(request)
      .then((response) => {
        if (response.ok) {
          const copy = response.clone();
          event.waitUntil(caches.open(CACHE).then((cache) => cache.put(PAGE, copy)));
        }
        return response;
      })
      .catch(() => caches.match(PAGE).then((kept) => kept || Response.error())),
  );
});
