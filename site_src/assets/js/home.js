// The home page's launcher (issue 12, item 4): a filter that finds a calculator by the words a
// technician uses, and the calculations last opened on this device. The tiles and their words
// are written into the page at build time (build/home.py), so this works offline and without
// the Python engine. Everything shown is set as text, never as HTML.

const SITE_ROOT = new URL("../../", import.meta.url); // this file is <root>/assets/js/home.js
const RECENT_KEY = "fluxbook-recent:" + SITE_ROOT.pathname; // one list per copy of the site
const RECENT_MAX = 6;
const SUMMARY_FIELDS = 3;

// Words that say nothing about which calculator is wanted.
const STOP = new Set([
  "a", "an", "the", "my", "our", "is", "it", "its", "are", "was", "be", "when", "will", "would",
  "does", "do", "did", "i", "we", "to", "of", "on", "in", "for", "how", "what", "why", "which",
  "with", "and", "or", "at", "this", "that", "can", "get", "too", "so", "up", "if", "me",
]);

export function words(text) {
  return String(text).toLowerCase().normalize("NFKD").replace(/[\u0300-\u036f]/g, "")
    .split(/[^\p{L}\p{N}²%]+/u).filter((w) => w.length > 1 || /\d/.test(w));
}

// A typed word matches a known one when one begins the other ("dim" finds "dimming"; "trips"
// finds "trip"), the known one being at least three letters when it is the shorter.
function wordMatches(token, known) {
  if (known.startsWith(token)) return true;
  return known.length >= 3 && token.startsWith(known) && token.length - known.length <= 4;
}

const WEIGHTS = { words: 3, question: 3, title: 2, group: 1, summary: 1 };

function tileIndex(tile) {
  const fields = {
    words: tile.dataset.words || "",
    question: tile.querySelector(".fb-tile__question")?.textContent || "",
    title: tile.querySelector(".fb-tile__title")?.textContent || "",
    group: tile.dataset.group || "",
    summary: tile.dataset.summaryText || "",
  };
  const index = {};
  for (const [name, text] of Object.entries(fields)) index[name] = words(text);
  index.phrases = fields.words.split("|").map((p) => words(p).join(" ")).filter(Boolean);
  return index;
}

// Score of one tile for the typed words; 0 when any word is not found anywhere in it.
export function score(index, tokens) {
  if (!tokens.length) return 0;
  let total = 0;
  for (const token of tokens) {
    let best = 0;
    for (const [name, weight] of Object.entries(WEIGHTS)) {
      if (weight > best && index[name].some((known) => wordMatches(token, known))) best = weight;
    }
    if (!best) return 0;
    total += best;
  }
  const phrase = tokens.join(" ");
  if (tokens.length > 1 && index.phrases.some((p) => p.includes(phrase))) total += 5;
  if (index.phrases.includes(phrase)) total += 3;
  // The words a calculator's title begins with name it best ("wire size": Wire size for ...).
  if (index.title.slice(0, tokens.length).join(" ") === phrase) total += 4;
  return total;
}

function filterTiles(finder, tiles, query) {
  const matches = finder.querySelector("[data-matches]");
  const count = finder.querySelector(".fb-finder__count");
  const groups = document.querySelector("[data-groups]");
  const tokens = words(query).filter((w) => !STOP.has(w));
  if (!tokens.length) {
    matches.replaceChildren();
    matches.hidden = true;
    groups.hidden = false;
    count.textContent = "";
    finder.fbFirst = null;
    return;
  }
  const found = tiles
    .map((tile, order) => ({ tile, order, score: score(tile.fbIndex, tokens) }))
    .filter((entry) => entry.score > 0)
    .sort((a, b) => b.score - a.score || a.order - b.order);
  matches.replaceChildren(...found.map(({ tile }) => {
    const item = document.createElement("li");
    item.className = "fb-tiles__item";
    const copy = tile.cloneNode(true);
    copy.removeAttribute("id");
    item.append(copy);
    return item;
  }));
  matches.hidden = !found.length;
  groups.hidden = found.length > 0; // nothing found: every group stays in view to browse
  finder.fbFirst = found.length ? matches.querySelector("a") : null;
  const shown = query.trim();
  count.textContent = found.length === 0
    ? `No calculator matches “${shown}”. Try other words, or pick from the groups below.`
    : `${found.length} calculator${found.length === 1 ? "" : "s"} for “${shown}”` +
      (found.length > 1 ? ", best match first." : ".");
}

function wireFinder(finder) {
  if (finder.fbWired) return;
  finder.fbWired = true;
  const input = finder.querySelector("input");
  const tiles = Array.from(document.querySelectorAll("[data-groups] .fb-tile"));
  for (const tile of tiles) tile.fbIndex = tileIndex(tile);
  const run = () => filterTiles(finder, tiles, input.value);
  input.addEventListener("input", run);
  input.addEventListener("keydown", (event) => {
    if (event.key === "Enter" && finder.fbFirst) {
      event.preventDefault();
      finder.fbFirst.click(); // a link click: instant navigation keeps the engine booted
    }
  });
  if (input.value) run(); // a value the browser kept (back button)
}

// --- the last calculations opened on this device ---------------------------------------------

function readRecent() {
  try {
    const list = JSON.parse(localStorage.getItem(RECENT_KEY) || "[]");
    return Array.isArray(list) ? list.filter((e) => e && typeof e.path === "string") : [];
  } catch {
    return [];
  }
}

function writeRecent(list) {
  try {
    localStorage.setItem(RECENT_KEY, JSON.stringify(list));
  } catch {
    // storage full or refused (private mode): the list is a convenience, never an error
  }
}

function fieldText(element) {
  if (element.tagName === "SELECT") return element.selectedOptions[0]?.textContent.trim() || "";
  const value = element.value.trim();
  const unit = element.dataset.unit;
  return value && unit && /^[-+]?[\d.,]+$/.test(value) ? `${value} ${unit}` : value;
}

// Called after each result: the page's address with its query (the inputs), newest first.
export function remember(root) {
  const here = new URL(window.location.href);
  if (!here.pathname.startsWith(SITE_ROOT.pathname)) return;
  const path = here.pathname.slice(SITE_ROOT.pathname.length);
  let fields = root.querySelectorAll(".fb-form > .fb-field [name]"); // not the folded ones
  if (!fields.length) fields = root.querySelectorAll(".fb-form [name]");
  const summary = Array.from(fields).map(fieldText).filter(Boolean).slice(0, SUMMARY_FIELDS).join(" · ");
  const entry = {
    path,
    search: here.search,
    title: root.getAttribute("aria-label") || document.title,
    summary,
    at: new Date().toISOString(),
  };
  writeRecent([entry, ...readRecent().filter((e) => e.path !== path)].slice(0, RECENT_MAX));
}

function when(iso) {
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return "";
  const time = date.toLocaleTimeString([], { hour: "2-digit", minute: "2-digit" });
  return date.toDateString() === new Date().toDateString()
    ? `today ${time}` : `${date.toLocaleDateString()} ${time}`;
}

function recentItem(entry) {
  const item = document.createElement("li");
  const link = document.createElement("a");
  link.className = "fb-recent__link";
  link.href = new URL(entry.path + (entry.search || ""), SITE_ROOT).href;
  link.dataset.recent = entry.path;
  const title = document.createElement("span");
  title.className = "fb-recent__name";
  title.textContent = entry.title;
  const detail = document.createElement("span");
  detail.className = "fb-recent__detail";
  detail.textContent = [entry.summary, when(entry.at)].filter(Boolean).join(" · ");
  link.append(title, detail);
  item.append(link);
  return item;
}

function showRecent(section) {
  const list = readRecent();
  section.querySelector("[data-recent-list]").replaceChildren(...list.map(recentItem));
  section.hidden = list.length === 0;
  if (!section.fbWired) {
    section.fbWired = true;
    section.querySelector('[data-action="recent-clear"]').addEventListener("click", () => {
      writeRecent([]);
      showRecent(section);
      document.getElementById("fb-find")?.focus(); // the focused button is gone
    });
  }
}

export function initPage() {
  const finder = document.querySelector("[data-finder]");
  if (finder) wireFinder(finder);
  const recent = document.querySelector("[data-recent]");
  if (recent) showRecent(recent);
}
