// Generates the service worker with workbox-build. Called by build/service_worker.py as the
// very last step of a build: node build/service_worker.mjs CONFIG.json
// Any workbox warning (for example a file too large to precache) fails the build, because a
// file silently left out would be missing offline.
import { readFileSync } from "node:fs";
import { generateSW } from "workbox-build";

const { options, packed } = JSON.parse(readFileSync(process.argv[2], "utf8"));
// JSON cannot carry a RegExp: every URL parameter is ignored when matching the precache, so a
// share link (?kva=75...) is served from the cache like the bare page.
options.ignoreURLParametersMatching = [/.*/];
// A packed file (build/packed.py) is precached as its gzipped twin only; sw-unpack.js serves it.
const packedPaths = new Set(packed);
options.manifestTransforms = [async (entries) => ({
  manifest: entries.filter((entry) => !packedPaths.has(entry.url)), warnings: [] })];
const { count, size, warnings } = await generateSW(options);
if (warnings.length) {
  for (const warning of warnings) console.error(`workbox warning: ${warning}`);
  process.exit(1);
}
console.log(JSON.stringify({ count, size }));
