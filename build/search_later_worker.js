// The theme's search worker, loaded late on calculator pages (issue 12: quick start; see
// build/search_later.py). The theme starts its search worker as soon as a page loads and sends
// it the site's index at once; building the index took 0.1-0.25 s of a core here, in the middle
// of the engine's start. This stand-in holds the theme's messages and loads the theme's worker
// (THEME_WORKER, beside this file, so the paths it resolves against its own location still
// hold) when the page asks for it on the channel: after the calculator's first result, or as
// soon as the search box gets the focus. LATEST_MS after the index arrived it loads anyway (a
// page that never says, a browser without BroadcastChannel).
(() => {
  const THEME_WORKER = "__THEME_WORKER__";
  const CHANNEL = "__CHANNEL__";
  const LATEST_MS = 8000;
  let held = [];
  let timer = null;
  let channel = null;

  function load() {
    if (!held) return;
    const messages = held;
    held = null;
    clearTimeout(timer);
    if (channel) channel.close();
    importScripts(new URL(THEME_WORKER, self.location.href).href);
    // The theme's listener, added while this one runs, hears what it was sent meanwhile, in order.
    for (const data of messages) self.dispatchEvent(new MessageEvent("message", { data }));
  }

  self.addEventListener("message", (event) => {
    if (!held) return; // loaded: the theme's own listener has it
    held.push(event.data);
    if (timer === null) timer = setTimeout(load, LATEST_MS);
  });

  if (typeof BroadcastChannel === "function") {
    channel = new BroadcastChannel(CHANNEL);
    channel.onmessage = (event) => { if (event.data === "load") load(); };
  }
})();
