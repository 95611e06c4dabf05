// Imported by the service worker (sw.js) before Workbox's own handlers.
// Material's instant navigation follows only links listed in sitemap.xml, and the build writes
// that file with a placeholder site URL because a team may host the folder anywhere. Answer
// sitemap.xml with the placeholder replaced by this copy's own scope, so links match and the
// calculator engine stays booted from page to page.
const FLUXBOOK_SITE_URL = "https://fluxbook.invalid/"; // = site_url in mkdocs.yml (tested)

self.addEventListener("fetch", (event) => {
  const sitemap = new URL("sitemap.xml", self.registration.scope).href;
  if (event.request.url.split("?")[0] !== sitemap) return;
  event.respondWith((async () => {
    const response = (await caches.match(sitemap, { ignoreSearch: true })) || (await fetch(event.request));
    const text = await response.text();
    return new Response(text.split(FLUXBOOK_SITE_URL).join(self.registration.scope), {
      headers: { "Content-Type": "application/xml" },
    });
  })());
});
