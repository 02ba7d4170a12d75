// Copy-to-clipboard for the Markdown and LaTeX exports. The texts come from exports/copy.js (written at build time);
// nothing is computed here. The buttons are made here, since they need script anyway.
(() => {
  var data = window.cosmoledgerCopy;
  if (!data) return;
  function textFor(button) {
    var id = button.getAttribute("data-copy");
    var format = button.getAttribute("data-copy-format");
    var entry = id === "assumptions" ? data.assumptions : data.tables[id];
    return entry ? entry[format] : null;
  }
  function fallbackCopy(text) {
    var area = document.createElement("textarea");
    area.value = text;
    area.setAttribute("readonly", "");
    area.style.position = "fixed";
    area.style.opacity = "0";
    document.body.appendChild(area);
    area.select();
    var ok = false;
    try {
      ok = document.execCommand("copy");
    } catch {
      ok = false;
    }
    document.body.removeChild(area);
    return ok;
  }
  function say(button, message) {
    var label = button.getAttribute("data-label") || button.textContent;
    button.setAttribute("data-label", label);
    button.textContent = message;
    setTimeout(() => {
      button.textContent = label;
    }, 1500);
  }
  // One pair of buttons per export paragraph that has copy texts: Markdown (plain text for the assumptions) and LaTeX.
  document.querySelectorAll("p.exports[data-export]").forEach((p) => {
    var id = p.getAttribute("data-export");
    if (id !== "assumptions" && !data.tables[id]) return;
    var formats = [
      ["md", id === "assumptions" ? "Copy text" : "Copy Markdown"],
      ["tex", "Copy LaTeX"],
    ];
    if (data.tables[id]?.txt) formats.push(["txt", "Copy plain text"]);
    formats.forEach((pair) => {
      var button = document.createElement("button");
      button.type = "button";
      button.className = "copy";
      button.setAttribute("data-copy", id);
      button.setAttribute("data-copy-format", pair[0]);
      button.textContent = pair[1];
      p.appendChild(document.createTextNode(" "));
      p.appendChild(button);
    });
  });
  document.querySelectorAll("button.copy").forEach((button) => {
    var text = textFor(button);
    if (text === null || text === undefined) return;
    button.addEventListener("click", () => {
      var done = () => {
        button.setAttribute("data-copied", "true");
        say(button, "Copied");
      };
      var fail = () => {
        if (fallbackCopy(text)) done();
        else say(button, "Copy failed: use the download");
      };
      if (navigator.clipboard?.writeText) navigator.clipboard.writeText(text).then(done, fail);
      else fail();
    });
  });
})();
