// Copy-to-clipboard for the Markdown and LaTeX exports. The texts come from exports/copy.js (written at build time);
// nothing is computed here. Buttons stay hidden when there is nothing to copy.
(function () {
  "use strict";
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
    try { ok = document.execCommand("copy"); } catch (e) { ok = false; }
    document.body.removeChild(area);
    return ok;
  }
  function say(button, message) {
    var label = button.getAttribute("data-label") || button.textContent;
    button.setAttribute("data-label", label);
    button.textContent = message;
    setTimeout(function () { button.textContent = label; }, 1500);
  }
  document.querySelectorAll("button.copy").forEach(function (button) {
    var text = textFor(button);
    if (text === null || text === undefined) return;
    button.hidden = false;
    button.addEventListener("click", function () {
      var done = function () { button.setAttribute("data-copied", "true"); say(button, "Copied"); };
      var fail = function () { if (fallbackCopy(text)) done(); else say(button, "Copy failed: use the download"); };
      if (navigator.clipboard && navigator.clipboard.writeText) navigator.clipboard.writeText(text).then(done, fail);
      else fail();
    });
  });
})();
