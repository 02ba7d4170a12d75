// Loaded only by pages that `cosmoledger serve` renders. Listens to the preview server (Server-Sent Events, same
// origin): reloads this page when a save changed it, and shows the scenarios' located errors over the last good
// numbers (marked stale) until the next good save. Warnings show as a quieter strip at the bottom.
(() => {
  const here = location.pathname.replace(/^\/+/, "").replace(/index\.html$/, "");
  const overlay = document.createElement("section");
  overlay.className = "preview-overlay";
  overlay.setAttribute("role", "alert");
  overlay.hidden = true;
  const strip = document.createElement("details");
  strip.className = "preview-warnings";
  strip.hidden = true;
  document.body.append(overlay, strip);

  const lines = (items) => {
    const pre = document.createElement("pre");
    pre.textContent = items.join("\n");
    return pre;
  };

  function show(status) {
    const errors = status.errors ?? [];
    const warnings = status.warnings ?? [];
    overlay.replaceChildren();
    overlay.hidden = errors.length === 0;
    document.body.classList.toggle("preview-stale", errors.length > 0);
    if (errors.length > 0) {
      const h = document.createElement("h2");
      h.textContent = status.summary;
      const note = document.createElement("p");
      note.textContent =
        "The page below keeps the numbers of the last good build and is stale. Fix the file and save: this message clears itself.";
      overlay.append(h, lines(errors), note);
    }
    strip.replaceChildren();
    strip.hidden = warnings.length === 0;
    if (warnings.length > 0) {
      const s = document.createElement("summary");
      s.textContent = `${warnings.length} warning${warnings.length === 1 ? "" : "s"} in the scenarios`;
      strip.append(s, lines(warnings));
    }
  }

  const events = new EventSource("/_cosmoledger/events");
  // Says when the page listens (a save before that moment is not seen by this page; tests wait for it).
  events.addEventListener("open", () => {
    document.documentElement.dataset.previewListening = "true";
  });
  events.addEventListener("status", (e) => show(JSON.parse(e.data)));
  events.addEventListener("reload", (e) => {
    const { paths } = JSON.parse(e.data);
    if (paths.includes(here)) location.reload();
  });
})();
