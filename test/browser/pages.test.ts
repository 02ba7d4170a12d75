import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createServer, type Server } from "node:http";
import { mkdirSync, readFileSync, readdirSync, existsSync, writeFileSync, statSync } from "node:fs";
import { extname, join, resolve } from "node:path";
import type { BrowserContext, Page } from "playwright-core";
import { HOSTILE_SCENARIO, ROOT, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { chromiumPath, launchChromium } from "../helpers/chromium.js";

// Browser tests: playwright-core driving Debian's chromium (apt-get install -y chromium). Without it they are
// skipped, and say so; .ci/run sets COSMOLEDGER_REQUIRE_BROWSER=1, which turns a missing browser into a failure.
const required = process.env.COSMOLEDGER_REQUIRE_BROWSER === "1";
if (!chromiumPath) {
  const message = "browser tests SKIPPED: chromium not found (install it with: apt-get install -y chromium)";
  if (!required) console.warn(message);
}
const SHOTS = join(ROOT, "test-output", "screenshots");

if (!chromiumPath && required) {
  describe("browser requirement", () => {
    it("chromium must be installed when COSMOLEDGER_REQUIRE_BROWSER=1", () => {
      expect(chromiumPath, "chromium not found; .ci/run must install it").not.toBe("");
    });
  });
}

describe.skipIf(!chromiumPath)("pages in headless Chromium", () => {
  let site: string;
  let hostileSite: string;
  let server: Server;
  let base: string;
  let context: BrowserContext;

  beforeAll(async () => {
    compileProject();
    const dir = tempDir();
    site = join(dir, "site");
    let r = runCli(["build", "--out", site, "--quiet"]);
    if (r.code !== 0) throw new Error(r.stderr);
    mkdirSync(join(dir, "hostile-scenarios"));
    writeFileSync(join(dir, "hostile-scenarios", "hostile.yaml"), HOSTILE_SCENARIO);
    hostileSite = join(dir, "hostile-site");
    r = runCli(["build", "--scenarios", join(dir, "hostile-scenarios"), "--out", hostileSite, "--quiet"]);
    if (r.code !== 0) throw new Error(r.stderr);
    // A static file server on the loopback address only.
    const types: Record<string, string> = {
      ".html": "text/html",
      ".js": "text/javascript",
      ".css": "text/css",
      ".json": "application/json",
      ".csv": "text/csv",
    };
    server = createServer((req, res) => {
      const url = new URL(req.url ?? "/", "http://127.0.0.1");
      let file = resolve(site, `.${decodeURIComponent(url.pathname)}`);
      if (!file.startsWith(site)) {
        res.writeHead(403).end();
        return;
      }
      if (existsSync(file) && statSync(file).isDirectory()) file = join(file, "index.html");
      if (!existsSync(file)) {
        res.writeHead(404).end();
        return;
      }
      res
        .writeHead(200, { "content-type": types[extname(file)] ?? "application/octet-stream" })
        .end(readFileSync(file));
    });
    await new Promise<void>((ok) => server.listen(0, "127.0.0.1", ok));
    const address = server.address();
    base = `http://127.0.0.1:${typeof address === "object" && address ? address.port : 0}`;
    context = await launchChromium({ viewport: { width: 1280, height: 900 } });
    mkdirSync(SHOTS, { recursive: true });
  }, 180_000);

  afterAll(async () => {
    await context?.close();
    await new Promise((ok) => server?.close(ok));
  });

  /** Opens a page and collects console errors, page errors, failed requests and HTTP errors. */
  async function open(url: string): Promise<{ page: Page; problems: string[] }> {
    const page = await context.newPage();
    const problems: string[] = [];
    page.on("console", (m) => {
      if (m.type() === "error") problems.push(`console: ${m.text()}`);
    });
    page.on("pageerror", (e) => problems.push(`page error: ${e.message}`));
    page.on("requestfailed", (r) => problems.push(`request failed: ${r.url()}`));
    page.on("response", (r) => {
      if (r.status() >= 400) problems.push(`HTTP ${r.status()}: ${r.url()}`);
    });
    page.on("dialog", (d) => {
      problems.push(`dialog: ${d.message()}`);
      void d.dismiss();
    });
    await page.goto(url, { waitUntil: "load" });
    return { page, problems };
  }

  /** Number of canvas pixels with any opacity, per canvas on the page. */
  const drawnPixels = (page: Page) =>
    page.evaluate(() =>
      [...document.querySelectorAll("canvas")].map((c) => {
        const d = (c as HTMLCanvasElement)
          .getContext("2d")!
          .getImageData(0, 0, (c as HTMLCanvasElement).width, (c as HTMLCanvasElement).height).data;
        let n = 0;
        for (let i = 3; i < d.length; i += 4) if (d[i] !== 0) n++;
        return n;
      }),
    );

  it("every page loads with no console error and no failed request, and every chart canvas has drawn pixels", async () => {
    for (const path of [
      "/index.html",
      "/lantern-deep-field/index.html",
      "/harbor-lights-census/index.html",
      "/tidewater-geometry/index.html",
    ]) {
      const { page, problems } = await open(base + path);
      expect(problems, path).toEqual([]);
      const pixels = await drawnPixels(page);
      expect(pixels.length, path).toBeGreaterThan(0);
      for (const n of pixels) expect(n, path).toBeGreaterThan(2000);
      await page.screenshot({
        path: join(SHOTS, `${path.replace(/\//g, "_").replace(/^_/, "")}.png`),
        fullPage: path === "/index.html",
      });
      await page.close();
    }
  }, 120_000);

  it("each exported HTML fragment opened on its own over http asks for nothing missing (not even /favicon.ico) and fits 390 px", async () => {
    const exports = join(site, "lantern-deep-field", "exports");
    const fragments = readdirSync(exports).filter((f) => f.endsWith(".html") && f !== "charts.html");
    expect(fragments.length).toBeGreaterThan(5);
    for (const f of fragments) {
      const { page, problems } = await open(`${base}/lantern-deep-field/exports/${f}`);
      // A browser's request for the site's icon may come after the load event: wait until the network is idle.
      await page.waitForLoadState("networkidle", { timeout: 60_000 });
      expect(problems, f).toEqual([]);
      await page.setViewportSize({ width: 390, height: 844 });
      const { scrollWidth, clientWidth } = await page.evaluate(() => ({
        scrollWidth: document.documentElement.scrollWidth,
        clientWidth: document.documentElement.clientWidth,
      }));
      expect(scrollWidth, f).toBeLessThanOrEqual(clientWidth);
      await page.close();
    }
  }, 180_000);
  it("version, history and diff pages of the demo archive load cleanly; a version page draws its frozen charts", async () => {
    for (const path of [
      "/lantern-deep-field/v1/index.html",
      "/lantern-deep-field/history/index.html",
      "/lantern-deep-field/diff/v1-v2/index.html",
    ]) {
      const { page, problems } = await open(base + path);
      expect(problems, path).toEqual([]);
      if (path.includes("/v1/")) for (const n of await drawnPixels(page)) expect(n, path).toBeGreaterThan(2000);
      if (path.includes("/history/")) {
        await page.selectOption("form.pair-picker select[name=from]", "v1");
        await page.selectOption("form.pair-picker select[name=to]", "v2");
        await Promise.all([page.waitForURL(/\/diff\/v1-v2\/index\.html$/), page.click("form.pair-picker button")]);
        expect(await page.textContent("h1")).toMatch(/version 1 → version 2/);
      }
      await page.screenshot({ path: join(SHOTS, `${path.replace(/\//g, "_").replace(/^_/, "")}.png`) });
      await page.close();
    }
  }, 120_000);

  it("the copy buttons put the Markdown and LaTeX exports on the clipboard, exactly as the downloads", async () => {
    await context.grantPermissions(["clipboard-read", "clipboard-write"], { origin: base });
    const { page, problems } = await open(`${base}/lantern-deep-field/index.html`);
    for (const [format, file] of [
      ["md", "glance.md"],
      ["tex", "glance.tex"],
    ]) {
      await page.click(`p.exports[data-export="glance"] button[data-copy-format="${format}"]`);
      await page.waitForSelector(
        `p.exports[data-export="glance"] button[data-copy-format="${format}"][data-copied="true"]`,
      );
      const copied = await page.evaluate(() => navigator.clipboard.readText());
      expect(copied).toBe(readFileSync(join(site, "lantern-deep-field/exports", file), "utf8"));
    }
    // The key-number sheet, first section of the page, also copies as plain text: the numbers the page shows and
    // a line naming their source.
    const sheetFirst = await page.evaluate(() => document.querySelector("main section")?.id);
    expect(sheetFirst).toBe("key-numbers");
    for (const [format, file] of [
      ["md", "key-numbers.md"],
      ["tex", "key-numbers.tex"],
    ]) {
      await page.click(`p.exports[data-export="key-numbers"] button[data-copy-format="${format}"]`);
      await page.waitForSelector(
        `p.exports[data-export="key-numbers"] button[data-copy-format="${format}"][data-copied="true"]`,
      );
      expect(await page.evaluate(() => navigator.clipboard.readText())).toBe(
        readFileSync(join(site, "lantern-deep-field/exports", file), "utf8"),
      );
    }
    await page.click('p.exports[data-export="key-numbers"] button[data-copy-format="txt"]');
    await page.waitForSelector(
      'p.exports[data-export="key-numbers"] button[data-copy-format="txt"][data-copied="true"]',
    );
    const plain = await page.evaluate(() => navigator.clipboard.readText());
    const shown = await page.evaluate(() =>
      [...document.querySelectorAll("table.key-numbers tbody tr")].slice(0, 12).map((tr) => ({
        label: tr.querySelector("th")!.textContent!.trim(),
        cells: [...tr.querySelectorAll("td")].map((td) => td.textContent!.trim()),
      })),
    );
    for (const r of shown) {
      const line = plain.split("\n").find((l) => l.startsWith(r.label));
      expect(line, r.label).toBeDefined();
      for (const c of r.cells) expect(line).toContain(c);
    }
    expect(plain).toMatch(/\nSource: cosmoledger .* scenario lantern-deep-field .*(version \d+|unfrozen draft)/);
    await page.click('p.exports[data-export="assumptions"] button[data-copy-format="md"]');
    await page.waitForSelector(
      'p.exports[data-export="assumptions"] button[data-copy-format="md"][data-copied="true"]',
    );
    expect(await page.evaluate(() => navigator.clipboard.readText())).toBe(
      readFileSync(join(site, "lantern-deep-field/exports/assumptions.txt"), "utf8"),
    );
    expect(problems).toEqual([]);
    await page.close();
  }, 180_000);

  it("the log/linear control changes the chart", async () => {
    const { page, problems } = await open(`${base}/lantern-deep-field/index.html`);
    const figure = page.locator('figure[data-chart="distances"]');
    await figure.scrollIntoViewIfNeeded();
    const type = () => page.evaluate(() => (window as any).cosmoledgerCharts.distances.scales.x.type);
    const picture = () => figure.locator("canvas").evaluate((c) => (c as HTMLCanvasElement).toDataURL());
    expect(await type()).toBe("logarithmic");
    const before = await picture();
    await figure.locator("[data-log]").uncheck();
    expect(await type()).toBe("linear");
    expect(await picture()).not.toBe(before);
    await figure.locator("[data-ratio]").check();
    expect(await page.evaluate(() => (window as any).cosmoledgerCharts.distances.options.scales.y.title.text)).toMatch(
      /\/ baseline/,
    );
    await page.screenshot({ path: join(SHOTS, "distances-linear-ratio.png") });
    expect(problems).toEqual([]);
    await page.close();
  }, 180_000);

  it("the hostile scenario runs no script", async () => {
    const { page, problems } = await open(`file://${join(hostileSite, "hostile", "index.html")}`);
    await page.mouse.move(100, 200);
    await page.waitForTimeout(300);
    expect(await page.evaluate(() => (window as any).__pwned)).toBeUndefined();
    expect(problems.filter((p) => p.startsWith("dialog") || p.startsWith("page error"))).toEqual([]);
    expect(await page.locator("h1").textContent()).toContain("<script>");
    await page.screenshot({ path: join(SHOTS, "hostile.png") });
    await page.close();
  }, 180_000);

  it("spreads: each spread model's 68 % band is shaded on the charts, the legend lists models only", async () => {
    const { page, problems } = await open(`${base}/saltmarsh-forecast/`);
    const doc = JSON.parse(readFileSync(join(site, "saltmarsh-forecast/tables.json"), "utf8"));
    const withSpread = doc.models.filter((m: { spread?: unknown }) => m.spread).length;
    expect(withSpread).toBe(5);
    const charts = await page.evaluate(() =>
      Object.values((window as unknown as { cosmoledgerCharts: Record<string, unknown> }).cosmoledgerCharts).map(
        (c) => {
          const chart = c as {
            data: { datasets: { isBand?: boolean; fill?: unknown; data: { y: number | null }[] }[] };
            legend: { legendItems: unknown[] };
          };
          return {
            bands: chart.data.datasets.filter((d) => d.isBand).length,
            filled: chart.data.datasets.filter((d) => d.fill === "-1").length,
            legend: chart.legend.legendItems.length,
            values: chart.data.datasets.filter((d) => d.isBand).flatMap((d) => d.data.map((p) => p.y)),
          };
        },
      ),
    );
    expect(charts.length).toBeGreaterThan(0);
    for (const c of charts) {
      expect(c.bands).toBe(2 * withSpread); // a 16th- and an 84th-percentile curve per spread model
      expect(c.filled).toBe(withSpread);
      expect(c.legend).toBe(doc.models.length);
      expect(c.values.some((y) => typeof y === "number")).toBe(true);
    }
    // Every chart canvas has drawn pixels (curves and bands).
    const pixels = await drawnPixels(page);
    for (const n of pixels) expect(n).toBeGreaterThan(2000);
    // Cells show the interval under the value; the published sets are cited with their transcription mark.
    expect(await page.locator(".band").count()).toBeGreaterThan(100);
    expect(await page.locator(".citation").first().textContent()).toMatch(/arXiv:1807\.06209/);
    expect(await page.locator(".recalled").count()).toBeGreaterThan(0);
    expect(await page.locator(".spread-caution").textContent()).toMatch(
      /Marginal uncertainties without their correlations/,
    );
    await page.screenshot({ path: join(SHOTS, "spread-bands.png"), fullPage: false });
    expect(problems).toEqual([]);
    await page.close();
  }, 180_000);

  it("the index opened via file:// draws its charts, with no network at all", async () => {
    const { page, problems } = await open(`file://${join(site, "index.html")}`);
    const pixels = await drawnPixels(page);
    // One small chart per demo scenario.
    expect(pixels.length).toBe(readdirSync(join(ROOT, "scenarios")).filter((f) => f.endsWith(".yaml")).length);
    for (const n of pixels) expect(n).toBeGreaterThan(2000);
    expect(problems).toEqual([]);
    await page.close();
  }, 180_000);
});
