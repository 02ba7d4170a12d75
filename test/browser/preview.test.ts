// `cosmoledger serve` in headless Chromium: the page follows a save by itself, an invalid save shows check's located
// errors over the last good numbers (marked stale) and clears on the next good save, warnings show apart, and the
// server listens on loopback, writes nothing into the scenarios folder and stops cleanly on Ctrl-C. Expectations
// are the command's own contract (cosmoledger serve --help) and check's output for the same file.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import type { BrowserContext, Page } from "playwright-core";
import { compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { chromiumPath, launchChromium } from "../helpers/chromium.js";
import { servePreview, type ServedPreview } from "../helpers/servePreview.js";

const required = process.env.COSMOLEDGER_REQUIRE_BROWSER === "1";
if (!chromiumPath && required) throw new Error("chromium not found; .ci/run must install it");

const live = (label: string, h0: string) =>
  `title: Live\nid: live\nmodels:\n  - { id: a, label: ${label}, H0: ${h0}, Omega_m: 0.3 }\n  - { id: b, extends: a, Omega_k: 0.1 }\n`;

describe.skipIf(!chromiumPath)("cosmoledger serve in headless Chromium", { timeout: 300_000 }, () => {
  let context: BrowserContext;
  let served: ServedPreview;
  let dir: string;
  let file: string;
  let page: Page;
  const text = () => page.evaluate(() => document.querySelector("main")?.textContent ?? "");
  /** The page listens to the server (a save before that is not this page's to see). */
  const listening = () => page.waitForSelector("html[data-preview-listening]", { timeout: 60_000 });

  beforeAll(async () => {
    compileProject();
    dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    file = join(dir, "scenarios/live.yaml");
    writeFileSync(file, live("Before", "70"));
    writeFileSync(
      join(dir, "scenarios/other.yaml"),
      "title: Other\nid: other\nmodels:\n  - { id: a, H0: 68, Omega_m: 0.3 }\n",
    );
    served = await servePreview(["--scenarios", "scenarios"], dir);
    await served.waitForOutput(/built the preview/);
    context = await launchChromium();
    page = await context.newPage();
    await page.goto(`${served.url}live/index.html`);
  });
  afterAll(async () => {
    await context?.close();
    await served?.stop();
  });

  it("listens on loopback and says where", () => {
    expect(served.url).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/$/);
  });

  it("pages may connect to the server only (connect-src 'self')", async () => {
    const csp = await page.evaluate(
      () => document.querySelector('meta[http-equiv="Content-Security-Policy"]')?.getAttribute("content") ?? "",
    );
    expect(csp).toContain("connect-src 'self';");
  });

  it("a save changes the open page by itself; only the changed scenario is rendered", async () => {
    const before = served.stdout().length;
    await listening();
    writeFileSync(file, live("After", "71"));
    await page.waitForFunction(() => document.querySelector("main")?.textContent?.includes("After"), null, {
      timeout: 60_000,
    });
    await served.waitForOutput(/rebuilt \d+ pages? in \d+ ms/, before);
    // The index and live/ are rendered; other/ is not.
    expect(served.stdout().slice(before)).toMatch(/rebuilt 2 pages in \d+ ms \(1 unchanged\)/);
  });

  it("an invalid save shows check's located errors over the last good numbers, marked stale", async () => {
    await listening();
    writeFileSync(file, live("After", "seventy"));
    const check = runCli(["check", "scenarios/live.yaml"], dir);
    expect(check.code).toBe(2);
    const lines = check.stderr.split("\n").filter((l) => l.startsWith("error: "));
    expect(lines.length).toBeGreaterThan(0);
    // check names the file as it was given (scenarios/live.yaml); the server as it watches it (absolute): same words
    // after it. Waited for, not read once: a save seen half-written shows its own (different) errors first.
    const strip = (l: string) => l.replace(/^error: \S*live\.yaml:/, "");
    const expected = lines.map(strip).join("\n");
    await page
      .waitForFunction(
        (want) =>
          (document.querySelector(".preview-overlay:not([hidden]) pre")?.textContent ?? "")
            .split("\n")
            .map((l) => l.replace(/^error: \S*live\.yaml:/, ""))
            .join("\n") === want,
        expected,
        { timeout: 60_000 },
      )
      .catch(() => undefined);
    const overlay = await page.textContent(".preview-overlay pre");
    expect((overlay ?? "").split("\n").map(strip).join("\n")).toBe(expected);
    expect(await page.evaluate(() => document.body.classList.contains("preview-stale"))).toBe(true);
    expect(await text()).toContain("After"); // the last good page stays underneath
    expect(await page.getAttribute(".preview-overlay", "role")).toBe("alert");
    expect(served.stderr()).not.toMatch(/\n\s+at /); // no stack trace in the terminal
  });

  it("the next good save clears the errors and shows the new numbers", async () => {
    await listening();
    writeFileSync(file, live("Again", "72"));
    await page.waitForFunction(() => document.querySelector("main")?.textContent?.includes("Again"), null, {
      timeout: 60_000,
    });
    await page.waitForSelector(".preview-overlay", { state: "hidden", timeout: 60_000 });
    expect(await page.evaluate(() => document.body.classList.contains("preview-stale"))).toBe(false);
  });

  it("warnings show in a quieter strip, not as the errors' overlay", async () => {
    await listening();
    writeFileSync(file, live("Warned", "160")); // H0 outside 20 to 150 is a warning (cosmoledger check --help)
    await page.waitForFunction(() => document.querySelector("main")?.textContent?.includes("Warned"), null, {
      timeout: 60_000,
    });
    await page.waitForSelector(".preview-warnings:not([hidden])", { timeout: 60_000 });
    expect(await page.textContent(".preview-warnings summary")).toMatch(/^\d+ warnings? in the scenarios$/);
    expect(await page.isHidden(".preview-overlay")).toBe(true);
  });

  it("writes nothing into the scenarios folder, and Ctrl-C stops it cleanly, removing its own pages", async () => {
    const out = /pages are written to (\S+)/.exec(served.stdout())![1];
    expect(existsSync(join(out, "live/index.html"))).toBe(true);
    expect(readdirSync(join(dir, "scenarios")).sort()).toEqual(["live.yaml", "other.yaml"]);
    expect(readFileSync(file, "utf8")).toBe(live("Warned", "160"));
    const code = await served.stop();
    expect(code).toBe(0);
    expect(served.stdout()).toMatch(/stopped\n$/);
    expect(existsSync(out)).toBe(false);
  });
});
