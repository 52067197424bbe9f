// The site's service worker: keeps every file of the site in the browser's cache on the first
// visit, so that reloads and every page work with no network. Written into the site's root by
// the builder, which fills in VERSION (a digest of every file it built) and FILES (every file,
// relative to the root), so that a rebuilt site has a new worker that replaces the old cache.
//
// A module worker from the site's own folder, under the pages' policy. Everything is resolved
// against this script's own address, so the site works under any sub-path of a host; two sites
// under two sub-paths of one host keep separate caches.

const VERSION = "@VERSION@";
const FILES = @FILES@;

const ROOT = new URL("./", self.location.href);
const PREFIX = `modebench ${ROOT.pathname} `;
const CACHE = PREFIX + VERSION;

self.addEventListener("install", (event) => {
  event.waitUntil(
    (async () => {
      const cache = await caches.open(CACHE);
      // Fetched past the HTTP cache, so that the new version's files are the ones kept; one at a
      // time, each tried up to three times a moment apart, so that a small server that turns
      // away a burst of requests does not leave the site uncached. A version that cannot be kept
      // whole is not kept at all: the worker fails to install, and the next visit tries again.
      try {
        for (const file of FILES) {
          const request = new Request(new URL(file, ROOT), { cache: "reload" });
          let response = null;
          for (let attempt = 0; attempt < 3 && !(response && response.ok); attempt += 1) {
            if (attempt > 0) {
              await new Promise((resolve) => setTimeout(resolve, 250 * attempt));
            }
            response = await fetch(request).catch(() => null);
          }
          if (!response || !response.ok) {
            throw new Error(`the site could not be kept for offline use: ${file} did not load`);
          }
          await cache.put(request, response);
        }
      } catch (error) {
        await caches.delete(CACHE);
        throw error;
      }
      await self.skipWaiting();
    })(),
  );
});

self.addEventListener("activate", (event) => {
  event.waitUntil(
    (async () => {
      for (const name of await caches.keys()) {
        if (name.startsWith(PREFIX) && name !== CACHE) {
          await caches.delete(name);
        }
      }
      await self.clients.claim();
    })(),
  );
});

self.addEventListener("fetch", (event) => {
  const request = event.request;
  const url = new URL(request.url);
  if (request.method !== "GET" || url.origin !== ROOT.origin || !url.pathname.startsWith(ROOT.pathname)) {
    return;
  }
  event.respondWith(answer(request, url));
});

// The kept copy of a file of this version, else the network. The site's folder itself is its
// home page. The cache is looked up by name, never opened: opening would create it again, empty,
// should this worker answer a last request after a newer version has deleted it.
async function answer(request, url) {
  const key = url.pathname.endsWith("/") ? new URL("index.html", url) : url;
  const kept = await caches.match(key.href, { cacheName: CACHE, ignoreSearch: true });
  if (kept) {
    return kept;
  }
  return fetch(request);
}
