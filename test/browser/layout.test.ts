// Layout checked in headless Chromium (not by reading HTML): no page kind scrolls sideways at 390 px, tables use
// the page's width at 1400 px, a title is escaped once, and a built site keeps connect-src 'none' (only the pages of
// `cosmoledger serve` may connect, to it: test/browser/preview.test.ts).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import type { BrowserContext } from "playwright-core";
import { ROOT, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { chromiumPath, launchChromium } from "../helpers/chromium.js";

const required = process.env.COSMOLEDGER_REQUIRE_BROWSER === "1";
if (!chromiumPath && required) throw new Error("chromium not found; .ci/run must install it");
const SHOTS = join(ROOT, "test-output", "screenshots");

const SIX_MODELS = `title: "A & B: six models"
id: six-models
redshifts: [0.5, 1, 2, 3]
models:
${Array.from({ length: 6 }, (_, i) => `  - { id: m${i}, label: "Model number ${i} with a long label", H0: ${66 + i}, Omega_m: ${0.28 + 0.01 * i}, omega_b: 0.0224 }`).join("\n")}
targets:
  - { name: Arc, z: 2.3, size_kpc: 5 }
`;

describe.skipIf(!chromiumPath)("layout, titles and live reload in headless Chromium", { timeout: 300_000 }, () => {
  let site: string;
  let context: BrowserContext;

  beforeAll(async () => {
    compileProject();
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    writeFileSync(join(dir, "scenarios/six.yaml"), SIX_MODELS);
    writeFileSync(
      join(dir, "scenarios/deep.yaml"),
      "title: Deep survey\nid: deep\nredshifts: [4, 6, 8, 12]\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.3 }\n  - { id: b, H0: 67, Omega_m: 0.32 }\n",
    );
    for (const f of [
      "lantern-deep-field.yaml",
      "harbor-lights-census.yaml",
      "saltmarsh-forecast.yaml",
      "saltmarsh-demo-chain.csv",
    ])
      writeFileSync(join(dir, "scenarios", f), readFileSync(join(ROOT, "scenarios", f)));
    // A frozen version (for the version, history and diff pages), then a change so that a diff exists.
    const freeze = (m: string) => runCli(["freeze", "scenarios/six.yaml", "-m", m], dir);
    expect(freeze("first").code).toBe(0);
    writeFileSync(join(dir, "scenarios/six.yaml"), SIX_MODELS.replace("H0: 66,", "H0: 66.5,"));
    expect(freeze("second").code).toBe(0);
    // Then a comment-only edit: the file differs from version 2, its numbers do not.
    writeFileSync(
      join(dir, "scenarios/six.yaml"),
      `# a note added after freezing\n${SIX_MODELS.replace("H0: 66,", "H0: 66.5,")}`,
    );
    site = join(dir, "site");
    const r = runCli(["build", "--scenarios", "scenarios", "--out", site, "--quiet", "--skip-images"], dir);
    if (r.code !== 0) throw new Error(r.stderr);
    context = await launchChromium();
    mkdirSync(SHOTS, { recursive: true });
  }, 300_000);

  afterAll(async () => {
    await context?.close();
  });

  const PAGES = [
    "index.html",
    "six-models/index.html",
    "six-models/v1/index.html",
    "six-models/history/index.html",
    "six-models/diff/v1-v2/index.html",
    "lantern-deep-field/index.html",
    "saltmarsh-forecast/index.html",
  ];

  it("at 390 px no page kind scrolls sideways; wide tables scroll inside their own box", async () => {
    const page = await context.newPage();
    await page.setViewportSize({ width: 390, height: 844 });
    for (const p of PAGES) {
      await page.goto(`file://${join(site, p)}`);
      const { scrollWidth, clientWidth } = await page.evaluate(() => ({
        scrollWidth: document.documentElement.scrollWidth,
        clientWidth: document.documentElement.clientWidth,
      }));
      expect(scrollWidth, p).toBeLessThanOrEqual(clientWidth);
    }
    // The history reads as one card per version: every cell inside the screen, none hidden in a scrolled box.
    await page.goto(`file://${join(site, "six-models/history/index.html")}`);
    const cells = await page.evaluate(() =>
      [...document.querySelectorAll("table.versions td, table.versions th")].map(
        (c) => c.getBoundingClientRect().right,
      ),
    );
    expect(cells.length).toBeGreaterThan(0);
    for (const right of cells) expect(right).toBeLessThanOrEqual(390);
    await page.goto(`file://${join(site, "six-models/index.html")}`);
    // The six-model tables are wider than the phone: each scrolls in its .table-wrap.
    const scrolls = await page.evaluate(() =>
      [...document.querySelectorAll(".table-wrap")].some((w) => w.scrollWidth > w.clientWidth),
    );
    expect(scrolls).toBe(true);
    await page.screenshot({ path: join(SHOTS, "six-models-390.png"), fullPage: false });
    await page.close();
  });

  it("at 1400 px each redshift table with its export bar is one cell as wide as its models need (six models: full width)", async () => {
    const page = await context.newPage();
    await page.setViewportSize({ width: 1400, height: 900 });
    await page.goto(`file://${join(site, "six-models/index.html")}`);
    const r = await page.evaluate(() => {
      const grid = document.querySelector(".quantity-grid")!;
      const cells = [...grid.children];
      return {
        gridWidth: grid.getBoundingClientRect().width,
        cellWidths: cells.map((c) => c.getBoundingClientRect().width),
        cellsHoldTheirExports: cells.every((c) => c.querySelector("table") && c.querySelector(".exports")),
        tablesScroll: [...document.querySelectorAll(".quantity-grid .table-wrap")].filter(
          (w) => w.scrollWidth > w.clientWidth,
        ).length,
      };
    });
    expect(r.cellsHoldTheirExports).toBe(true);
    for (const w of r.cellWidths) expect(w).toBeGreaterThan(0.95 * r.gridWidth); // one per row: the page's width
    expect(r.tablesScroll).toBe(0); // and then nothing needs to scroll at 1400 px
    await page.screenshot({ path: join(SHOTS, "six-models-1400.png"), fullPage: false });
    // Nor does any other table of the page (numbers to quote, models, at a glance, early universe, targets,
    // surveys); only the charts' data tables (one column per grid redshift) may scroll in their own box.
    const scrolling = await page.evaluate(() =>
      [...document.querySelectorAll("main .table-wrap")]
        .filter((w) => !w.closest("#charts") && w.scrollWidth > w.clientWidth)
        .map((w) => `${w.querySelector("table")?.className}: ${w.scrollWidth} px in ${w.clientWidth} px`),
    );
    expect(scrolling).toEqual([]);
    await page.close();
  });

  // Printable widths at 96 CSS px per inch (CSS Values 4) with the print style's 14 mm margins on A4 (210 x 297 mm,
  // ISO 216): portrait 182 mm, landscape 269 mm.
  const A4_PORTRAIT_PX = Math.floor((182 / 25.4) * 96);
  const A4_LANDSCAPE_PX = Math.floor((269 / 25.4) * 96);

  it("in print every table fits the printed width: six models on landscape A4, a diff page on portrait A4", async () => {
    const page = await context.newPage();
    await page.emulateMedia({ media: "print" });
    const tooWide = () =>
      page.evaluate(() => {
        const width = document.querySelector("main")!.getBoundingClientRect().width;
        return [...document.querySelectorAll("main table")]
          .filter((t) => t.getClientRects().length > 0 && t.getBoundingClientRect().width > width + 0.5)
          .map((t) => `${t.className}: ${Math.round(t.getBoundingClientRect().width)} px in ${Math.round(width)} px`);
      });
    await page.setViewportSize({ width: A4_LANDSCAPE_PX, height: 800 });
    await page.goto(`file://${join(site, "six-models/index.html")}`);
    expect(await page.locator("table.early").count()).toBe(1);
    expect(await tooWide()).toEqual([]);
    await page.setViewportSize({ width: A4_PORTRAIT_PX, height: 1000 });
    await page.goto(`file://${join(site, "six-models/diff/v1-v2/index.html")}`);
    expect(await page.locator("table.output-changes").count()).toBe(1);
    expect(await tooWide()).toEqual([]);
    await page.close();
  });

  it("a title with & shows & in the browser tab, escaped once", async () => {
    const page = await context.newPage();
    await page.goto(`file://${join(site, "six-models/index.html")}`);
    expect(await page.title()).toBe("A & B: six models · cosmoledger");
    await page.goto(`file://${join(site, "six-models/history/index.html")}`);
    expect(await page.title()).toBe("History of A & B: six models · cosmoledger");
    await page.close();
  });

  it("charts: log y where a quantity spans more than a decade, the redshift range of the scenario, markers per model", async () => {
    const page = await context.newPage();
    await page.goto(`file://${join(site, "lantern-deep-field/index.html")}`);
    const lantern = await page.evaluate(() => {
      const charts = (window as unknown as { cosmoledgerCharts: Record<string, any> }).cosmoledgerCharts;
      const d = charts.distances;
      return {
        yType: d.options.scales.y.type,
        markers: d.data.datasets.map((x: { pointStyle: string }) => x.pointStyle),
        logYChecked: (document.querySelector('figure[data-chart="distances"] [data-logy]') as HTMLInputElement).checked,
      };
    });
    // D_C over the grid from z = 0.01 to 10 spans more than two decades (common practice: log axis).
    expect(lantern.yType).toBe("logarithmic");
    expect(lantern.logYChecked).toBe(true);
    expect(new Set(lantern.markers).size).toBe(lantern.markers.length); // one marker per model
    // The ratio view is linear, and the switch turns the log y axis off.
    await page.check('figure[data-chart="distances"] [data-ratio]');
    expect(await page.evaluate(() => (window as any).cosmoledgerCharts.distances.options.scales.y.type)).toBe("linear");
    await page.uncheck('figure[data-chart="distances"] [data-ratio]');
    await page.uncheck('figure[data-chart="distances"] [data-logy]');
    expect(await page.evaluate(() => (window as any).cosmoledgerCharts.distances.options.scales.y.type)).toBe("linear");
    // A survey at z = 4 to 12 (grid left to its default) is drawn from z = 4 to 12, not from 0.01.
    await page.goto(`file://${join(site, "deep/index.html")}`);
    const deep = await page.evaluate(() => {
      const d = (window as any).cosmoledgerCharts.distances;
      return { min: d.scales.x.min, max: d.scales.x.max };
    });
    expect(deep.min).toBeGreaterThanOrEqual(4);
    expect(deep.max).toBeLessThanOrEqual(12);
    await page.close();
  });

  it("a draft that differs only in comments says so; a page with massive neutrinos shows their terms", async () => {
    const page = await context.newPage();
    await page.goto(`file://${join(site, "six-models/index.html")}`);
    const banner = await page.textContent(".banner-draft");
    expect(banner).toMatch(/only in comments or layout: its inputs and every number are those of version 2/);
    expect(banner).not.toMatch(/Numbers here may change/);
    await page.goto(`file://${join(site, "lantern-deep-field/index.html")}`);
    const assumptions = (await page.textContent("#assumptions")) ?? "";
    expect(assumptions).toMatch(/each of the Nν massive species carries Neff\/3 of the relativistic neutrino density/);
    expect(await page.locator("#assumptions .math").count()).toBe(4); // Friedmann, closure, neutrino terms, F(y)
    expect(await page.textContent(".assumptions-sentence")).toMatch(/Each massive neutrino species carries N_eff\/3/);
    await page.goto(`file://${join(site, "six-models/index.html")}`);
    expect(await page.locator("#assumptions .math").count()).toBe(2); // no massive neutrinos: no neutrino terms
    await page.close();
  });

  it("a frozen page names the latest version from the scenario's latest.js, from file:// under the pages' CSP", async () => {
    const page = await context.newPage();
    await page.goto(`file://${join(site, "six-models/v1/index.html")}`);
    expect((await page.textContent(".later-version"))?.trim()).toBe("A later version exists: version 2.");
    expect(await page.getAttribute(".later-version a", "href")).toBe("../../six-models/v2/index.html");
    await page.goto(`file://${join(site, "six-models/v2/index.html")}`);
    expect((await page.textContent(".later-version"))?.trim()).toBe("This is the latest version.");
    await page.close();
  });

  it("the built site keeps connect-src 'none'", () => {
    const html = readFileSync(join(site, "six-models/index.html"), "utf8");
    expect(html).toContain("connect-src 'none';");
  });
});
