// The theme's script on a calculator page, run after the first result (issue 12: quick start).
//
// The theme's bundle (mkdocs-material: header, search, palette, instant navigation) takes about
// 40-70 ms of the page's main thread to run, and the search index it starts builds in another
// 0.1-0.25 s: on a phone of few cores, time taken from the engine's start. Nothing of it is needed
// for a result; its drawer and links work without it. So on a calculator page the build holds
// the script back (build/theme_later.py: a data block naming it) and this module runs it:
//   - after the page's first result or the engine's failure (fluxbook.js calls loadTheme);
//   - at once when the user reaches for the theme first: a touch or the focus in the header,
//     the tabs, the navigation or the footer, the search box opened, a key pressed outside a
//     form field;
//   - LATEST_MS after the page's modules ran, at the latest.
// Until it runs, the page is as the theme serves a browser without scripts, but for its search
// button and box (fluxbook.css, fb-theme-later). The theme starts when the document is loaded:
// run later, it is told so again, once.
// Other pages run the theme's script as the theme wrote it.

const HELD = 'script[type="text/x-fluxbook-later"][data-fluxbook-theme]'; // build/theme_later.py
const LATEST_MS = 3000; // its palette toggle and its search results wait for it
// Touched or focused first, these run the theme at once: a tap's pointerdown comes about 0.1 s
// before its click, by when the theme takes a link in its navigation.
const THEME_PARTS = ".md-header, .md-tabs, .md-sidebar, .md-footer";
const SEARCH_TOGGLE = "__search"; // the theme's search overlay checkbox
const SEARCH_QUERY = '[data-md-component="search-query"]';

let loading = null;
const waiting = [];

// Whether this page holds the theme's script back (and it has not run yet).
function held() {
  return !loading && Boolean(document.querySelector(HELD));
}

// Runs the held script, once; a promise settled when it has run (or failed to load).
export function loadTheme() {
  if (loading) return loading;
  const holder = document.querySelector(HELD);
  if (!holder) {
    loading = Promise.resolve(false);
    return loading;
  }
  const script = document.createElement("script");
  script.src = new URL(holder.dataset.fluxbookTheme, document.baseURI).href;
  loading = new Promise((resolve) => {
    script.addEventListener("load", () => {
      // The theme builds its page from DOMContentLoaded, which has fired already.
      document.dispatchEvent(new Event("DOMContentLoaded"));
      for (const callback of waiting.splice(0)) callback(window.document$);
      resolve(true);
    }, { once: true });
    script.addEventListener("error", () => {
      console.warn("Fluxbook: the theme's script could not be loaded; the page works without it.");
      resolve(false);
    }, { once: true });
  });
  holder.replaceWith(script);
  return loading;
}

// callback(document$) once the held script has run and set up the theme's document stream.
export function whenLoaded(callback) {
  waiting.push(callback);
}

function isFormField(target) {
  return target instanceof Element && Boolean(target.closest("input, select, textarea, [contenteditable]"));
}

// The user's first reach for the theme's parts runs it at once; LATEST_MS at the latest.
export function wireTriggers() {
  if (!held()) return;
  const reach = (event) => {
    const target = event.target;
    if (target instanceof Element && target.closest(THEME_PARTS)) loadTheme();
  };
  document.addEventListener("pointerdown", reach, true);
  document.addEventListener("focusin", reach, true);
  document.addEventListener("keydown", (event) => {
    if (!isFormField(event.target)) loadTheme();
  }, true);
  document.addEventListener("change", (event) => {
    const target = event.target;
    if (!(target instanceof HTMLInputElement) || target.id !== SEARCH_TOGGLE || !target.checked) return;
    // Opened before the theme ran: the box takes what is typed meanwhile, and the theme
    // searches for it once its index is ready.
    const query = document.querySelector(SEARCH_QUERY);
    if (query) query.focus();
    loadTheme();
  }, true);
  setTimeout(loadTheme, LATEST_MS);
}
