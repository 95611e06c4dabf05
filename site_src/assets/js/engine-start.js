// Loaded (classic, right after the meta tags it reads) from the head of a calculator page: starts the calculator worker while
// the page, its styles and its modules still load, about 0.15 s before engine.js could (issue 12:
// quick start). engine.js adopts the worker and the events it sent meanwhile from
// window.fluxbookEngineStart. A classic script cannot import messages.js: the boot message below
// (given as the worker's name) is messages.boot's shape, written out
// (tests/browser/test_snapshot.py checks that it boots).
(() => {
  const meta = (name) => document.querySelector(`meta[name="${name}"]`);
  const pyodide = meta("fluxbook-pyodide");
  const calcZip = meta("fluxbook-calc-zip");
  const sha = meta("fluxbook-calc-zip-sha256");
  if (!pyodide || !calcZip || typeof Worker !== "function" || window.fluxbookEngineStart) return;
  const absolute = (element) => new URL(element.content, document.baseURI).href;
  try {
    const boot = { type: "boot", indexURL: absolute(pyodide), calcZipURL: absolute(calcZip),
      calcSha256: sha ? sha.content : "", snapshot: "use" };
    // The boot message as the worker's name: it boots as soon as its module runs (calc-worker.js).
    const worker = new Worker(new URL("calc-worker.js", document.currentScript.src),
      { type: "module", name: JSON.stringify(boot) });
    const early = { worker, events: [] };
    const keep = (event) => early.events.push(event);
    const types = ["message", "error", "messageerror"];
    for (const type of types) worker.addEventListener(type, keep);
    early.release = () => { for (const type of types) worker.removeEventListener(type, keep); };
    window.fluxbookEngineStart = early;
  } catch (error) {
    // No early start (a browser without module workers): engine.js starts it as usual.
  }
})();
