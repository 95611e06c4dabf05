// Offline use: registers the service worker, says when the site is stored for offline use,
// and offers a new version only when the user says so (never a half-old, half-new site).
import { Workbox } from "../vendor/workbox/workbox-window.prod.mjs";

const UPDATE_CHECK_MS = 60 * 60 * 1000; // instant navigation never reloads, so ask hourly

export const offline = { state: "checking", listeners: new Set() };

function setOffline(state) {
  offline.state = state;
  document.documentElement.dataset.offline = state;
  for (const listener of offline.listeners) listener(state);
}

export function onOffline(listener) {
  offline.listeners.add(listener);
  listener(offline.state);
}

function showUpdatePrompt(workbox) {
  if (document.querySelector(".fb-update")) return;
  const bar = document.createElement("div");
  bar.className = "fb-update";
  bar.setAttribute("role", "alert");
  const text = document.createElement("span");
  text.textContent = "A new version of Fluxbook is ready.";
  const now = document.createElement("button");
  now.type = "button";
  now.className = "fb-button";
  now.dataset.action = "update-now";
  now.textContent = "Reload with the new version";
  const later = document.createElement("button");
  later.type = "button";
  later.className = "fb-button fb-button--quiet";
  later.textContent = "Later";
  now.addEventListener("click", () => {
    now.disabled = true;
    // Reload only once the new worker controls the page, so every file comes from one version.
    workbox.addEventListener("controlling", () => window.location.reload());
    workbox.messageSkipWaiting();
  });
  later.addEventListener("click", () => bar.remove());
  bar.append(text, now, later);
  document.body.append(bar);
}

export function startOffline() {
  // Browsers keep a site for offline use only from a secure address: https://, or localhost.
  if (!window.isSecureContext) {
    setOffline("insecure");
    return;
  }
  if (!("serviceWorker" in navigator)) {
    setOffline("unsupported");
    return;
  }
  const workbox = new Workbox(new URL("../../sw.js", import.meta.url).href);
  workbox.addEventListener("waiting", () => showUpdatePrompt(workbox));
  workbox.register().then(async (registration) => {
    if (!registration) { setOffline("unsupported"); return; }
    await navigator.serviceWorker.ready;
    setOffline("stored");
    if (navigator.storage && navigator.storage.persist) navigator.storage.persist().catch(() => {});
    setInterval(() => workbox.update(), UPDATE_CHECK_MS);
  }).catch(() => setOffline("unsupported"));
}

// A plain report for the home page: is the site stored here, how much space, will it be kept.
export async function reportStorage(element) {
  const lines = [];
  const words = {
    checking: "Checking whether Fluxbook is stored on this device…",
    stored: "Fluxbook is stored on this device and works with no network.",
    unsupported: "This browser cannot keep Fluxbook for offline use; it needs a connection.",
    insecure: `Fluxbook cannot be kept for offline use from this address (${location.origin}): ` +
      "browsers keep a site offline only from an https:// address, or from localhost. Ask " +
      "whoever hosts it for the https:// address; until then it needs a connection.",
  };
  lines.push(words[offline.state] || words.checking);
  if (navigator.storage && navigator.storage.estimate) {
    try {
      const { usage, quota } = await navigator.storage.estimate();
      const mb = (bytes) => `${(bytes / 1e6).toFixed(1)} MB`;
      lines.push(`Storage used by this site: ${mb(usage || 0)} of ${mb(quota || 0)} the browser allows.`);
    } catch (error) { /* no estimate in this browser */ }
  }
  if (navigator.storage && navigator.storage.persisted) {
    const kept = await navigator.storage.persisted().catch(() => false);
    lines.push(kept ? "The browser has agreed to keep it (persistent storage)."
      : "The browser may clear it when space runs low or after weeks without a visit; open it now and then while online.");
  }
  element.replaceChildren(...lines.map((line) => {
    const p = document.createElement("p");
    p.textContent = line;
    return p;
  }));
}
