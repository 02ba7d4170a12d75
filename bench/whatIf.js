// The what-if panel in headless Chromium (pages opened from file://, as a reader opens an archived site): the size of
// the engine bundle; the time from opening the panel to the first numbers on screen, cold (engine script loaded,
// parsed and run for the first time, column, card and curve placed, next frame painted) in fresh browsers, and
// after the page's idle warm-up; and the time of each later change of a parameter (from the input event to the
// next painted frame), with the panel in view and with a chart in view. On the demo page with 200 grid points and one massive neutrino, and on the
// same page without neutrinos (the Fermi-Dirac tables of the neutrino energy density are built on the first
// massive model: the difference between the two cold figures).
import { spawnSync } from "node:child_process";
import { cpSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join, resolve } from "node:path";
import { gzipSync } from "node:zlib";

const ROOT = resolve(import.meta.dirname, "..");
const BIN = join(ROOT, "bin/cosmoledger.js");
const chromiumPath = spawnSync("sh", ["-c", "command -v chromium"], { encoding: "utf8" }).stdout.trim();
const median = (xs) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

/** In the page: opens the panel and resolves with the milliseconds until the first what-if is placed. */
function openPanel() {
  return new Promise((done) => {
    const panel = document.getElementById("what-if");
    const t0 = performance.now();
    new MutationObserver((_, observer) => {
      if (panel.dataset.runs === "1" && panel.dataset.state) {
        observer.disconnect();
        requestAnimationFrame(() => setTimeout(() => done(performance.now() - t0), 0));
      }
    }).observe(panel, { attributes: true });
    panel.querySelector("details.what-if-open").open = true;
  });
}

/** In the page: sets Omega_k to each value in turn; per change, the milliseconds from the input event to the placed column. */
async function changeCurvature(values) {
  const panel = document.getElementById("what-if");
  const key = document.getElementById("what-if-curvature-key");
  const value = document.getElementById("what-if-curvature-value");
  key.value = "Omega_k";
  key.dispatchEvent(new Event("input", { bubbles: true }));
  const out = [];
  for (const v of values) {
    const before = Number(panel.dataset.runs);
    await new Promise((r) => setTimeout(r, 0));
    const t0 = performance.now();
    const placed = new Promise((done) => {
      new MutationObserver((_, observer) => {
        if (Number(panel.dataset.runs) > before && panel.dataset.state === "computed") {
          observer.disconnect();
          done();
        }
      }).observe(panel, { attributes: true });
    });
    value.value = String(v);
    value.dispatchEvent(new Event("input", { bubbles: true }));
    await placed;
    // Until the next frame has been laid out and painted: the reader sees the numbers then.
    await new Promise((r) => requestAnimationFrame(() => setTimeout(r, 0)));
    out.push(performance.now() - t0);
  }
  return out;
}

export async function runWhatIfBench({ browsers = 5, changes = 20 } = {}) {
  const engineBytes = readFileSync(join(ROOT, "dist/bundle/what-if-engine.js"));
  const panelBytes = readFileSync(join(ROOT, "dist/bundle/what-if-panel.js"));
  const sizes = {
    engineKB: engineBytes.length / 1024,
    engineGzipKB: gzipSync(engineBytes, { level: 9 }).length / 1024,
    panelGzipKB: gzipSync(panelBytes, { level: 9 }).length / 1024,
  };
  if (!chromiumPath) return { sizes, pages: null };

  const dir = mkdtempSync(join(tmpdir(), "cosmoledger-bench-whatif-"));
  const scenarios = join(dir, "scenarios");
  cpSync(join(ROOT, "scenarios/lantern-deep-field.yaml"), join(scenarios, "lantern-deep-field.yaml"));
  const plain = readFileSync(join(ROOT, "scenarios/lantern-deep-field.yaml"), "utf8")
    .replace(/^id: lantern-deep-field$/m, "id: lantern-without-neutrinos")
    .replace(/^ {4}m_nu_eV: .*\n/gm, "");
  writeFileSync(join(scenarios, "lantern-without-neutrinos.yaml"), plain);
  const site = join(dir, "site");
  const built = spawnSync(
    process.execPath,
    [BIN, "build", "--scenarios", scenarios, "--out", site, "--quiet", "--skip-images"],
    {
      encoding: "utf8",
    },
  );
  if (built.status !== 0) throw new Error(built.stderr);

  const { chromium } = await import("playwright-core");
  const pages = {};
  for (const id of ["lantern-deep-field", "lantern-without-neutrinos"]) {
    const url = `file://${join(site, id, "index.html")}`;
    const cold = [];
    const afterWarmUp = [];
    let warm = [];
    let warmWithChart = [];
    for (let b = 0; b < browsers; b++) {
      const context = await chromium.launchPersistentContext(mkdtempSync(join(dir, "profile-")), {
        executablePath: chromiumPath,
        headless: true,
        viewport: { width: 1280, height: 900 },
        args: ["--headless", "--no-sandbox", "--disable-gpu", "--disable-background-networking", "--no-first-run"],
      });
      const page = await context.newPage();
      // Cold: the page as a connection that asks to save data sees it, with no warm-up: nothing of the engine is
      // loaded or computed before the panel opens.
      await page.addInitScript(() =>
        Object.defineProperty(navigator, "connection", { value: { saveData: true }, configurable: true }),
      );
      await page.goto(url);
      await page.waitForSelector("#what-if:not([hidden])");
      cold.push(await page.evaluate(openPanel));
      // A second page of the same browser, opened once its warm-up is done (the engine script then comes from
      // the browser's cache, as on any later page of a site).
      const later = await context.newPage();
      await later.goto(url);
      await later.waitForSelector("#what-if[data-warm=ready]", { timeout: 60_000 });
      afterWarmUp.push(await later.evaluate(openPanel));
      await later.close();
      if (b === 0) {
        const values = Array.from({ length: changes }, (_, i) => -0.02 + (0.04 * i) / (changes - 1));
        warm = await page.evaluate(changeCurvature, values);
        // The same changes with a chart on screen: it is redrawn with each change (charts out of view wait).
        await page.evaluate(() => document.querySelector("figure.chart").scrollIntoView());
        warmWithChart = await page.evaluate(
          changeCurvature,
          values.map((v) => v / 2),
        );
      }
      await context.close();
    }
    pages[id] = {
      coldMedianMs: median(cold),
      coldMs: cold,
      afterWarmUpMedianMs: median(afterWarmUp),
      warmMedianMs: median(warm),
      warmMaxMs: Math.max(...warm),
      warmWithChartMedianMs: median(warmWithChart),
      warmWithChartMaxMs: Math.max(...warmWithChart),
    };
  }
  return { sizes, pages };
}

if (import.meta.url === `file://${process.argv[1]}`)
  console.log(JSON.stringify(await runWhatIfBench({ browsers: Number(process.env.BROWSERS ?? 5) }), null, 2));
