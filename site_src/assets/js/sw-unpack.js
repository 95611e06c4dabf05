// Imported by the service worker (sw.js) before Workbox's own handlers, after the list the build
// writes (sw-packed-list.js, build/packed.py). Our text files are precached as gzipped twins
// (<path>.gz): a request for one of them (a page by its folder too, any query ignored, as the
// precache does) is answered from its twin, unpacked, with the file's Content-Type. A twin not
// stored yet goes to the network. A host that sent the twin with Content-Encoding: gzip left it
// unpacked in the cache already (the header stays with it): it is served as it is.
self.addEventListener("fetch", (event) => {
  const packed = self.FLUXBOOK_PACKED;
  const request = event.request;
  if (!packed || request.method !== "GET" || typeof DecompressionStream !== "function") return;
  const scope = new URL(self.registration.scope);
  const url = new URL(request.url);
  if (url.origin !== scope.origin || !url.pathname.startsWith(scope.pathname)) return;
  let path;
  try {
    path = decodeURIComponent(url.pathname.slice(scope.pathname.length));
  } catch (error) {
    return; // not a path this site has
  }
  if (path === "" || path.endsWith("/")) path += "index.html";
  if (!Object.prototype.hasOwnProperty.call(packed, path)) return;
  event.respondWith(fromTwin(new URL(path + ".gz", scope).href, packed[path], request));
});

// Workbox's precache (cacheId "fluxbook" in build/service_worker.py): looked in first, by name,
// as a lookup that ignores the query scans every entry of every cache it is given.
const PRECACHE = `fluxbook-precache-v2-${self.registration ? self.registration.scope : ""}`;
let precache = null;

async function stored(url) {
  precache ||= caches.has(PRECACHE).then((has) => (has ? caches.open(PRECACHE) : null));
  const cache = await precache.catch(() => null);
  return (cache && (await cache.match(url, { ignoreSearch: true }))) ||
    caches.match(url, { ignoreSearch: true });
}

async function fromTwin(twinURL, type, request) {
  const cached = await stored(twinURL);
  if (!cached) {
    precache = null; // perhaps not made yet when first looked for
    return fetch(request);
  }
  const unpacked = /gzip/i.test(cached.headers.get("Content-Encoding") || "");
  const headers = new Headers(cached.headers);
  for (const name of ["Content-Encoding", "Content-Length"]) headers.delete(name);
  headers.set("Content-Type", type);
  const body = unpacked ? cached.body : cached.body.pipeThrough(new DecompressionStream("gzip"));
  return new Response(body, { status: 200, statusText: "OK", headers });
}
