// On a frozen version's page: says whether a later version exists, from ../latest.js (written by each build, data
// only). The page itself never changes after it is rendered, so a new freeze rewrites one small file, not every
// version page. Without script the banner points to the history page.
(() => {
  const latest = window.cosmoledgerLatest;
  const slot = document.querySelector(".later-version");
  if (!latest || !slot) return;
  const n = Number(slot.getAttribute("data-version"));
  const root = slot
    .querySelector("a")
    .getAttribute("href")
    .replace(/[^/]+\/history\/index\.html$/, "");
  slot.replaceChildren();
  if (latest.n > n) {
    const a = document.createElement("a");
    a.href = `${root + latest.path}index.html`;
    a.textContent = `version ${latest.n}`;
    slot.append("A later version exists: ", a, ".");
  } else slot.append("This is the latest version.");
})();
