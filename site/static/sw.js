// Linesmith service worker: keeps every file of one build in one cache, so the
// page opens and computes with no network after its first visit.
//
// build.py fills in BUILD (the build hash of dist/manifest.json) and FILES (every
// file of dist/ with its sha256 as a Subresource Integrity value). The cache is
// named after the build; a request is answered only from the cache of this
// worker's own build, never from another build's cache. A new build has a new
// sw.js: the browser installs it beside the old one (fetching every file against
// its hash, so a file of another build is refused), and it takes over once no
// page of the old build is open (or when the page asks, see offline.js); on
// activation it deletes the caches of every other build.
//
// The engine snapshot (the file FILES marks "snapshot") is only a faster start: a build is kept
// without it when it cannot be fetched, and the page asks this worker to drop it when the engine
// could not start from it ("drop-snapshot"). A dropped snapshot is remembered in the cache as a
// 404 answer, so later visits of this build boot plainly without fetching it again.
const BUILD = "__LINESMITH_BUILD__";
const FILES = /*__LINESMITH_FILES__*/[];

const PREFIX = "linesmith-";
const CACHE = `${PREFIX}${BUILD}`;
const SCOPE = new URL("./", self.location.href);
const INTEGRITY = new Map(FILES.map((f) => [f.path, f.integrity]));
const PARALLEL = 4;
const SNAPSHOTS = FILES.filter((f) => f.snapshot).map((f) => f.path);

function droppedAnswer(reason) {
  return new Response(`dropped: ${reason}`, { status: 404, headers: { "Content-Type": "text/plain", "X-Linesmith-Dropped": "1" } });
}

function urlOf(path) {
  return new URL(path, SCOPE).href;
}

async function precache() {
  const cache = await caches.open(CACHE);
  const queue = FILES.slice();
  async function next() {
    while (queue.length) {
      const file = queue.shift();
      const url = urlOf(file.path);
      if (await cache.match(url)) continue; // an earlier, interrupted install got it
      // "no-cache" revalidates with the server (a 304 costs a few bytes when
      // the browser already holds the file); the integrity value refuses any
      // file that is not this build's.
      // The page itself is fetched as "./", the address it was opened at, so the
      // browser's copy from this visit can be revalidated instead of fetched again.
      const from = file.path === "index.html" ? SCOPE.href : url;
      const request = new Request(from, { cache: "no-cache", integrity: file.integrity || "" });
      let response;
      try {
        response = await fetch(request);
        if (!response.ok) throw new Error(`${file.path} answered ${response.status}`);
      } catch (error) {
        if (!file.snapshot) throw error;
        await cache.put(url, droppedAnswer(String(error.message || error))); // the build works without it
        continue;
      }
      if (file.path === "manifest.json") {
        // Written after this file, so it has no integrity value: check its build instead.
        const manifest = await response.clone().json();
        if (manifest.build !== BUILD) throw new Error("manifest.json is of another build");
      }
      await cache.put(url, response);
    }
  }
  try {
    await Promise.all(Array.from({ length: PARALLEL }, next));
  } catch (error) {
    await caches.delete(CACHE); // never keep half a build
    throw error;
  }
}

self.addEventListener("install", (event) => {
  event.waitUntil(precache());
});

self.addEventListener("activate", (event) => {
  event.waitUntil((async () => {
    for (const name of await caches.keys()) {
      if (name.startsWith(PREFIX) && name !== CACHE) await caches.delete(name);
    }
    await self.clients.claim();
  })());
});

self.addEventListener("message", (event) => {
  // Sent by offline.js's applyUpdate(): take over now; the page reloads itself.
  if (event.data && event.data.type === "skip-waiting") self.skipWaiting();
  // Sent by start.js when the engine could not start from the stored snapshot.
  if (event.data && event.data.type === "drop-snapshot") {
    event.waitUntil((async () => {
      const cache = await caches.open(CACHE);
      for (const path of SNAPSHOTS) await cache.put(urlOf(path), droppedAnswer(String(event.data.reason || "")));
    })());
  }
});

function pathOf(url) {
  if (url.origin !== SCOPE.origin || !url.pathname.startsWith(SCOPE.pathname)) return null;
  const path = decodeURIComponent(url.pathname.slice(SCOPE.pathname.length));
  return path === "" ? "index.html" : path;
}

self.addEventListener("fetch", (event) => {
  const request = event.request;
  if (request.method !== "GET") return;
  const path = pathOf(new URL(request.url));
  if (path === null || !INTEGRITY.has(path)) return; // not a file of this build: browser as usual
  event.respondWith((async () => {
    const cache = await caches.open(CACHE);
    const hit = await cache.match(urlOf(path));
    if (hit) return hit;
    // Only while installing (the cache is complete once installed): ask the
    // server for exactly this build's file.
    return fetch(new Request(urlOf(path), { integrity: INTEGRITY.get(path) }));
  })());
});
