// The what-if panel in headless Chromium, on the demo site opened from file:// (as an archived site is read) under the
// pages' content security policy. Expectations come from outside the page: the numbers the build wrote for the
// model a what-if starts from, and `check` and `compute` run on the scenario file with the copied block pasted in.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { cpSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import type { BrowserContext, Page } from "playwright-core";
import { parse, parseDocument, type YAMLSeq } from "yaml";
import { ROOT, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { chromiumPath, launchChromium } from "../helpers/chromium.js";
import { presentDocument } from "../../src/presentation/presentDocument.js";
import { presentationTables, rowKeys } from "../../src/presentation/presentTables.js";
import type { StoredTablesDocument } from "../../src/contract/tablesDocument.js";

const required = process.env.COSMOLEDGER_REQUIRE_BROWSER === "1";
if (!chromiumPath && !required) console.warn("what-if browser tests SKIPPED: chromium not found");

/** The what-if column of a page table, as text per row key (the cell's own text, then its difference). */
const whatIfColumn = (page: Page, table: string) =>
  page.evaluate((table) => {
    const rows = [...document.querySelectorAll<HTMLTableRowElement>(`table[data-table="${table}"] tbody tr`)];
    const seen = new Map<string, number>();
    return rows.map((tr) => {
      const base = tr.dataset.row ?? "";
      const n = seen.get(base) ?? 0;
      seen.set(base, n + 1);
      const td = tr.querySelector("td.what-if-cell");
      return {
        key: n === 0 ? base : `${base}|${n}`,
        text: td ? (td.firstChild?.textContent ?? "") : null,
        difference: td?.querySelector(".diff")?.textContent ?? null,
      };
    });
  }, table);

/** The build's own column of model `index` in a page table (the numbers the CLI wrote), cell text only. */
const pageColumn = (page: Page, table: string, index: number) =>
  page.evaluate(
    ({ table, index }) =>
      [...document.querySelectorAll<HTMLTableRowElement>(`table[data-table="${table}"] tbody tr`)].map(
        (tr) => tr.querySelectorAll("td:not(.what-if-cell)")[index]?.firstChild?.textContent ?? "",
      ),
    { table, index },
  );

const runsOf = async (page: Page) => Number((await page.getAttribute("#what-if", "data-runs")) ?? 0);
/** Waits for a computation after the `before`-th that ended in `state` (any state when null). */
async function nextRun(page: Page, before: number, state: string | null = "computed") {
  await page.waitForFunction(
    ({ before, state }) => {
      const p = document.getElementById("what-if")!;
      return Number(p.dataset.runs) > before && (state === null || p.dataset.state === state);
    },
    { before, state },
    { timeout: 60_000 },
  );
}

describe.skipIf(!chromiumPath)("the what-if panel in Chromium", () => {
  let site: string;
  let scenarios: string;
  let context: BrowserContext;
  const problems: string[] = [];

  beforeAll(async () => {
    compileProject();
    const dir = tempDir();
    scenarios = join(dir, "scenarios");
    cpSync(join(ROOT, "scenarios"), scenarios, { recursive: true });
    site = join(dir, "site");
    const r = runCli(["build", "--scenarios", scenarios, "--out", site, "--quiet", "--skip-images"]);
    if (r.code !== 0) throw new Error(r.stderr);
    context = await launchChromium({ viewport: { width: 1280, height: 900 } });
    await context.grantPermissions(["clipboard-read", "clipboard-write"]);
  }, 300_000);

  afterAll(async () => {
    await context?.close();
  });

  /** The ids of the demo scenarios (each has a page). */
  const demoIds = () =>
    readdirSync(scenarios)
      .filter((x) => x.endsWith(".yaml"))
      .map((f) => (parse(readFileSync(join(scenarios, f), "utf8")) as { id: string }).id);

  async function open(path: string): Promise<Page> {
    const page = await context.newPage();
    // A blocked script or style (the content security policy) is reported as a violation event.
    await page.addInitScript(() => {
      document.addEventListener("securitypolicyviolation", (e) =>
        console.error(`CSP violation: ${e.violatedDirective} ${e.blockedURI}`),
      );
    });
    page.on("console", (m) => {
      if (m.type() === "error") problems.push(`${path}: ${m.text()}`);
    });
    page.on("pageerror", (e) => problems.push(`${path}: ${e.message}`));
    await page.goto(`file://${join(site, path)}`);
    await page.waitForSelector("#what-if:not([hidden])", { timeout: 60_000 });
    return page;
  }

  it("opens from the keyboard and shows the starting model's own numbers, labelled as a what-if, in every table and chart", {
    timeout: 300_000,
  }, async () => {
    const page = await open("lantern-deep-field/index.html");
    expect(await page.locator("td.what-if-cell").count()).toBe(0);
    // Keyboard: the panel's summary takes focus and opens with Enter; the next stop is the starting point.
    await page.focus("#what-if summary");
    await page.keyboard.press("Enter");
    await nextRun(page, 0);
    await page.keyboard.press("Tab");
    expect(await page.evaluate(() => document.activeElement?.id)).toBe("what-if-start");
    // Every input of the panel has a label.
    const unlabelled = await page.evaluate(() =>
      [...document.querySelectorAll<HTMLInputElement | HTMLSelectElement>("#what-if input, #what-if select")]
        .filter((e) => (e.labels?.length ?? 0) === 0)
        .map((e) => e.id),
    );
    expect(unlabelled).toEqual([]);

    // Started from the first model with nothing changed: the build's numbers of that model (column 0).
    for (const table of ["key-numbers", "target-1", "surveys", "z-luminosity_distance_Mpc"]) {
      const shown = await whatIfColumn(page, table);
      expect(
        shown.map((c) => c.text),
        table,
      ).toEqual(await pageColumn(page, table, 0));
    }
    const head = await page.textContent('table[data-table="key-numbers"] thead th.what-if-head');
    expect(head).toContain("What-if (not archived)");
    expect(await page.locator(".geometry-cards .what-if-cell").count()).toBe(1);

    // Charts: the curve is added to a chart once it is in view.
    await page.evaluate(() => document.querySelector("figure.chart")!.scrollIntoView());
    await page.waitForFunction(
      () => {
        const id = document.querySelector<HTMLElement>("figure.chart")!.dataset.chart!;
        const chart = (
          window as unknown as { cosmoledgerCharts: Record<string, { data: { datasets: { label: string }[] } }> }
        ).cosmoledgerCharts[id];
        return chart.data.datasets.some((d) => d.label === "What-if (not archived)");
      },
      null,
      { timeout: 30_000 },
    );

    // Not part of the archive: the copy buttons' texts do not hold it; printing leaves it out.
    const copies = await page.evaluate(() =>
      JSON.stringify((window as unknown as { cosmoledgerCopy: unknown }).cosmoledgerCopy),
    );
    expect(copies).not.toContain("What-if");
    await page.emulateMedia({ media: "print" });
    const printed = await page.evaluate(
      () =>
        [...document.querySelectorAll("#what-if, td.what-if-cell, th.what-if-cell, .geo-card.what-if-cell")].filter(
          (e) => getComputedStyle(e).display !== "none",
        ).length,
    );
    expect(printed).toBe(0);
    await page.emulateMedia({ media: "screen" });
    expect(problems).toEqual([]);
    await page.close();
  });

  it("a changed parameter gives the numbers compute gives the pasted block, and a bad value check's message", {
    timeout: 300_000,
  }, async () => {
    const page = await open("lantern-deep-field/index.html");
    await page.click("#what-if summary");
    await nextRun(page, 0);
    let runs = await runsOf(page);
    await page.selectOption("#what-if-curvature-key", "Omega_k");
    await nextRun(page, runs);
    runs = await runsOf(page);
    await page.fill("#what-if-curvature-value", "-0.012");
    await page.fill("#what-if-H0", "71.5");
    await page.waitForFunction(() => document.querySelector(".what-if-yaml")?.textContent?.includes("71.5"), null, {
      timeout: 60_000,
    });
    await nextRun(page, runs);

    // Copy as YAML: the block on the clipboard is the one shown.
    await page.click('[data-what-if="copy"]');
    const block = await page.evaluate(() => navigator.clipboard.readText());
    expect(block).toBe(await page.textContent(".what-if-yaml"));
    expect(parse(block)).toEqual([
      { id: "what-if", label: "What-if", extends: "reference", Omega_k: -0.012, H0: 71.5 },
    ]);

    // Pasted into the scenario file: check accepts it and compute gives the numbers the panel shows.
    const file = join(scenarios, "lantern-deep-field.yaml");
    const d = parseDocument(readFileSync(file, "utf8"));
    (d.get("models") as YAMLSeq).add(d.createNode((parse(block) as unknown[])[0]));
    const dir = tempDir();
    writeFileSync(join(dir, "lantern-deep-field.yaml"), String(d));
    expect(runCli(["check", "lantern-deep-field.yaml"], dir).code).toBe(0);
    const computed = runCli(["compute", "lantern-deep-field.yaml", "--json"], dir);
    expect(computed.code, computed.stderr).toBe(0);
    const doc = JSON.parse(computed.stdout) as StoredTablesDocument;
    const index = doc.models.findIndex((m) => m.id === "what-if");
    const tables = presentationTables(presentDocument(doc));
    for (const id of ["key-numbers", "glance", "target-1", "target-3", "surveys", "z-age_Gyr"]) {
      const t = tables.find((x) => x.id === id)!;
      const lead = t.columns.length % doc.models.length;
      const keys = rowKeys(t.rows);
      const expected = t.rows.map((r, i) => ({
        key: keys[i],
        text: r.cells[lead + index].text,
        difference: r.cells[lead + index].difference?.text ?? null,
      }));
      expect(await whatIfColumn(page, id), id).toEqual(expected);
    }

    // Out of the verified box: check's warning under the panel, as many times as check prints it, however often
    // the value changes.
    const counts: number[] = [];
    for (const w0 of ["-2.5", "-2.6"]) {
      runs = await runsOf(page);
      await page.fill("#what-if-w0", w0);
      await nextRun(page, runs);
      counts.push(await page.locator(".what-if-notes li").count());
    }
    const notes = await page.locator(".what-if-notes li").allTextContents();
    expect(counts[0]).toBe(counts[1]);
    expect(
      notes.filter((n) =>
        /^warning: lantern-deep-field\.what-if\.yaml:\d+:\d+: models\[1\].*w0 = -2\.6 lies outside/.test(n),
      ),
    ).toHaveLength(1);

    // A value out of the schema's range: check's words, the field marked, the what-if taken off the tables.
    runs = await runsOf(page);
    await page.fill("#what-if-H0", "-5");
    await nextRun(page, runs, "problems");
    const shownProblems = (await page.locator(".what-if-problems li").allTextContents()).map((s) => s.trim());
    const computedText = (await page.textContent(".what-if-text"))!
      .split("\n")
      .map((l) => l.replace(/^ *\d+ {2}/, ""))
      .join("\n");
    const file2 = (await page.textContent(".what-if-file"))!;
    const checkDir = tempDir();
    writeFileSync(join(checkDir, file2), `${computedText}\n`);
    const check = runCli(["check", file2], checkDir);
    expect(check.code).toBe(2);
    expect(shownProblems).toEqual(check.stderr.split("\n").filter((l) => /^(error|warning):/.test(l)));
    expect(shownProblems.join("\n")).toContain("models[1].H0");
    expect(await page.getAttribute("#what-if-H0", "aria-invalid")).toBe("true");
    // The field names the element that says what is wrong with it.
    const named = await page.getAttribute("#what-if-H0", "aria-errormessage");
    expect(await page.locator(`#${named}`).textContent()).toContain("models[1].H0");
    expect(await page.locator("td.what-if-cell").count()).toBe(0);

    // Removed: nothing of it is left on the page, and the keyboard is back on the panel's summary.
    runs = await runsOf(page);
    await page.fill("#what-if-H0", "70");
    await nextRun(page, runs);
    expect(await page.locator(".what-if-cell").count()).toBeGreaterThan(0);
    await page.focus('[data-what-if="remove"]');
    await page.keyboard.press("Enter");
    expect(await page.locator(".what-if-cell").count()).toBe(0);
    expect(await page.evaluate(() => document.activeElement?.tagName)).toBe("SUMMARY");
    expect(problems).toEqual([]);
    await page.close();
  });

  it("every starting point it offers computes, on every demo page", { timeout: 300_000 }, async () => {
    for (const id of demoIds()) {
      const page = await open(`${id}/index.html`);
      await page.click("#what-if summary");
      await nextRun(page, 0);
      const starts = await page.$$eval("#what-if-start option", (os) => os.map((o) => (o as HTMLOptionElement).value));
      expect(starts.some((s) => s.startsWith("published:"))).toBe(true);
      for (const s of starts) {
        const runs = await runsOf(page);
        await page.selectOption("#what-if-start", s);
        await nextRun(page, runs, null);
        expect(`${id} ${s}: ${await page.getAttribute("#what-if", "data-state")}`).toBe(`${id} ${s}: computed`);
      }
      await page.close();
    }
    expect(problems).toEqual([]);
  });

  it("rows the page has for other models' quantities are blank for a what-if without them, as for its start", {
    timeout: 300_000,
  }, async () => {
    // Harbor Lights: the phantom model rips, so the page has big rip rows; the first model (a cosmological
    // constant) has none, and neither has a what-if started from it, which is computed without the phantom model.
    const page = await open("harbor-lights-census/index.html");
    await page.click("#what-if summary");
    await nextRun(page, 0);
    const shown = await whatIfColumn(page, "glance");
    expect(shown.some((c) => c.key.startsWith("Big rip"))).toBe(true);
    expect(shown.map((c) => c.text)).toEqual(await pageColumn(page, "glance", 0));
    await page.close();
    expect(problems).toEqual([]);
  });

  it("warms up in the background on every demo page, without an error", { timeout: 300_000 }, async () => {
    for (const id of demoIds()) {
      const page = await open(`${id}/index.html`);
      await page.waitForSelector("#what-if[data-warm=ready]", { timeout: 120_000 });
      await page.close();
    }
    expect(problems).toEqual([]);
  });

  it("works on a frozen version page without touching its version banner, and fits 390 px", {
    timeout: 300_000,
  }, async () => {
    const page = await open("lantern-deep-field/v1/index.html");
    await page.setViewportSize({ width: 390, height: 800 });
    const banner = await page.textContent(".scenario-head");
    await page.click("#what-if summary");
    await nextRun(page, 0);
    expect(await page.getAttribute("#what-if", "data-state")).toBe("computed");
    expect(await page.locator('table[data-table="key-numbers"] td.what-if-cell').count()).toBeGreaterThan(0);
    expect(await page.textContent(".scenario-head")).toBe(banner);
    // Nothing of the panel reaches past the screen's width (the page itself does not scroll sideways).
    const wide = await page.evaluate(() => ({
      page: document.documentElement.scrollWidth,
      controls: [...document.querySelectorAll("#what-if input, #what-if select, #what-if button")]
        .map((e) => e.getBoundingClientRect().right)
        .filter((r) => r > 390),
    }));
    expect(wide).toEqual({ page: 390, controls: [] });
    expect(problems).toEqual([]);
    await page.close();
  });
});
