// Units and intervals as a reader sees them in Chromium: every cell of every table on a page in h units with a
// spread prints the text of its export (the same presented table), and the chart's 68 % band of a length that the
// varied H0 does not move has no width in h^-1 Mpc (closed form: for a flat model without radiation, E(z) does not
// depend on H0, so h D_L is the same for every draw; common practice).
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import type { BrowserContext } from "playwright-core";
import { compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { chromiumPath, launchChromium } from "../helpers/chromium.js";
import { unitText } from "../../src/presentation/formatNumber.js";

const SCENARIO = `title: h units in the browser
id: h-browser
h_units: true
redshifts: [0.5, 2]
grid: { z_max: 4, points: 60 }
draws: { count: 150, seed: 9 }
models:
  - id: flat
    H0: 70
    Omega_m: 0.3
    radiation: none
    spread: { normal: { H0: 3 } }
  - { id: other, H0: 60, Omega_m: 0.35, radiation: none }
targets:
  - { name: Old light, lookback_Gyr: 9 }
surveys:
  - { name: Shell, area_deg2: 500, z_min: 0.5, z_max: 1, density_per_Mpc3: 1.0e-4 }
`;

describe.skipIf(!chromiumPath)("the presentation in Chromium", () => {
  let site: string;
  let context: BrowserContext;

  beforeAll(async () => {
    compileProject();
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    writeFileSync(join(dir, "scenarios/h.yaml"), SCENARIO);
    site = join(dir, "site");
    const r = runCli(["build", "--scenarios", "scenarios", "--out", site, "--skip-images", "--quiet"], dir);
    if (r.code !== 0) throw new Error(r.stderr);
    context = await launchChromium({ viewport: { width: 1280, height: 900 } });
  }, 180_000);

  afterAll(async () => {
    await context?.close();
  });

  it("every rendered cell prints its export's text and interval, units in h", async () => {
    const page = await context.newPage();
    await page.goto(`file://${join(site, "h-browser/index.html")}`, { waitUntil: "load" });
    const rendered = await page.evaluate(() =>
      [...document.querySelectorAll("table[data-export-table]")].map((t) => ({
        id: t.getAttribute("data-export-table")!,
        rows: [...t.querySelectorAll("tbody tr")].map((tr) => ({
          head: (tr.querySelector("th") as HTMLElement).textContent ?? "",
          cells: [...tr.querySelectorAll("td")].map((td) => ({
            own: [...td.childNodes]
              .filter((n) => n.nodeType === Node.TEXT_NODE)
              .map((n) => n.textContent)
              .join(""),
            band: td.querySelector(".band")?.textContent ?? null,
          })),
        })),
      })),
    );
    expect(rendered.length).toBeGreaterThan(20);
    for (const table of rendered) {
      const exported = JSON.parse(readFileSync(join(site, `h-browser/exports/${table.id}.json`), "utf8")).table;
      expect(table.rows.length, table.id).toBe(exported.rows.length);
      table.rows.forEach((row, i) => {
        const e = exported.rows[i];
        if (e.unit) expect(row.head, table.id).toContain(unitText(e.unit));
        row.cells.forEach((c, j) => {
          expect(c.own, `${table.id} ${e.label} ${j}`).toBe(e.text[j]);
          const interval = e.intervals_68?.[j];
          expect(c.band, `${table.id} ${e.label} ${j}`).toBe(interval ? `68 %: ${interval.text}` : null);
        });
      });
    }
    const key = rendered.find((t) => t.id === "key-numbers")!;
    const dl = key.rows.find((r) => r.head.startsWith("z = 0.5: D_L"))!;
    expect(dl.head).toContain("h⁻¹ Mpc");
    expect(dl.cells[0].band).toBe("68 %: no spread at the digits shown");
    const age = key.rows.find((r) => r.head.startsWith("Age today"))!;
    expect(age.cells[0].band).toMatch(/^68 %: \d+\.\d+ \+\d/);
    await page.close();
  });

  it("the chart's D_L band in h^-1 Mpc has no width, and its axis says h^-1 Mpc", async () => {
    const page = await context.newPage();
    await page.goto(`file://${join(site, "h-browser/index.html")}`, { waitUntil: "load" });
    await page.selectOption('figure[data-chart="distances"] select[data-series]', "luminosity_distance_Mpc");
    const chart = await page.evaluate(() => {
      const c = (window as unknown as { cosmoledgerCharts: Record<string, any> }).cosmoledgerCharts.distances;
      const sets = c.data.datasets as { label: string; isBand?: boolean; data: { y: number | null }[] }[];
      return {
        title: c.options.scales.y.title.text as string,
        curve: sets[0].data.map((p) => p.y),
        lo: sets.filter((d) => d.isBand)[0].data.map((p) => p.y),
        hi: sets.filter((d) => d.isBand)[1].data.map((p) => p.y),
      };
    });
    expect(chart.title).toBe("D_L [h⁻¹ Mpc]");
    let compared = 0;
    chart.curve.forEach((y, i) => {
      if (y === null || y === 0) return;
      // The page's chart data are rounded to six figures for drawing.
      expect(Math.abs((chart.hi[i] as number) - y) / y).toBeLessThan(1e-5);
      expect(Math.abs((chart.lo[i] as number) - y) / y).toBeLessThan(1e-5);
      compared++;
    });
    expect(compared).toBeGreaterThan(20);
    await page.close();
  });
});
