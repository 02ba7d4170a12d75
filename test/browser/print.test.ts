// Printing to A4 and Letter puts every number of every table on paper, for up to 8 models. Checked by
// printing to PDF in Chromium and reading the text back with pdftotext (Debian's poppler-utils), never by reading
// HTML: a clipped cell is missing from the PDF's text.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import type { BrowserContext } from "playwright-core";
import { ROOT, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { chromiumPath, launchChromium } from "../helpers/chromium.js";

const which = (cmd: string) => spawnSync("sh", ["-c", `command -v ${cmd}`], { encoding: "utf8" }).stdout.trim();
const pdftotext = which("pdftotext");
const required = process.env.COSMOLEDGER_REQUIRE_BROWSER === "1";
if (required && (!chromiumPath || !pdftotext))
  throw new Error("chromium and pdftotext (poppler-utils) must be installed; .ci/run installs them");

const EIGHT = `title: Eight models in print
id: eight
redshifts: [0.1, 0.5, 1, 2, 3, 5]
models:
${Array.from({ length: 8 }, (_, i) => `  - { id: m${i}, label: "Model ${i} with a label", H0: ${65 + i}, Omega_m: ${(0.27 + 0.01 * i).toFixed(2)}, omega_b: 0.0224 }`).join("\n")}
targets:
  - { name: Arc, z: 2.3, size_kpc: 5 }
surveys:
  - { name: Shell, area_deg2: 100, z_min: 0.5, z_max: 1, density_per_Mpc3: 1.0e-4 }
`;

const squeeze = (s: string) => s.replace(/\s+/g, " ");

describe.skipIf(!chromiumPath || !pdftotext)("printing to A4 and Letter", { timeout: 300_000 }, () => {
  let site: string;
  let dir: string;
  let context: BrowserContext;

  beforeAll(async () => {
    compileProject();
    dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    writeFileSync(join(dir, "scenarios/eight.yaml"), EIGHT);
    writeFileSync(join(dir, "scenarios/lantern.yaml"), readFileSync(join(ROOT, "scenarios/lantern-deep-field.yaml")));
    // A page with spreads: every cell has an interval line under its value.
    for (const f of ["saltmarsh-forecast.yaml", "saltmarsh-demo-chain.csv"])
      writeFileSync(join(dir, "scenarios", f), readFileSync(join(ROOT, "scenarios", f)));
    site = join(dir, "site");
    const r = runCli(["build", "--scenarios", "scenarios", "--out", site, "--quiet", "--skip-images"], dir);
    if (r.code !== 0) throw new Error(r.stderr);
    context = await launchChromium();
  }, 300_000);

  afterAll(async () => {
    await context?.close();
  });

  for (const [page, format] of [
    ["eight/index.html", "A4"],
    ["eight/index.html", "Letter"],
    ["lantern-deep-field/index.html", "A4"],
    ["saltmarsh-forecast/index.html", "A4"],
  ] as const) {
    it(`${page} on ${format}: every number of every table is in the PDF's text, and no table overlaps another`, async () => {
      const tab = await context.newPage();
      await tab.goto(`file://${join(site, page)}`);
      await tab.emulateMedia({ media: "print" });
      // Every number the tables print (the value of each cell, not its difference line).
      const numbers = await tab.evaluate(() =>
        // Tables shown in print (the charts' data tables are hidden there, by design).
        [...document.querySelectorAll("main table td.num")]
          .filter((td) => td.getClientRects().length > 0)
          .map((td) => {
            const copy = td.cloneNode(true) as HTMLElement;
            for (const d of copy.querySelectorAll(".diff, .band")) d.remove();
            return copy.textContent!.trim();
          }),
      );
      // And every interval line of a spread (its numbers; the line may wrap in print).
      const bands = await tab.evaluate(() =>
        [...document.querySelectorAll("main table td.num .band")]
          .filter((b) => b.getClientRects().length > 0)
          .map((b) => b.textContent!.replace("68 %:", "").trim()),
      );
      const overlaps = await tab.evaluate(() => {
        const boxes = [...document.querySelectorAll("main table")].map((t) => t.getBoundingClientRect());
        let n = 0;
        for (let i = 0; i < boxes.length; i++)
          for (let j = i + 1; j < boxes.length; j++) {
            const a = boxes[i];
            const b = boxes[j];
            if (a.left < b.right - 1 && b.left < a.right - 1 && a.top < b.bottom - 1 && b.top < a.bottom - 1) n++;
          }
        return n;
      });
      expect(overlaps).toBe(0);
      const pdf = join(dir, `${page.replace(/\W/g, "-")}-${format}.pdf`);
      await tab.pdf({ path: pdf, format, printBackground: true });
      await tab.close();
      const text = spawnSync(pdftotext, ["-layout", pdf, "-"], { encoding: "utf8" });
      expect(text.status, text.stderr).toBe(0);
      const printed = squeeze(text.stdout);
      const missing = numbers.filter((n) => n && n !== "—" && !printed.includes(squeeze(n)));
      expect(numbers.length).toBeGreaterThan(100);
      expect(missing, `${missing.length} of ${numbers.length} numbers missing`).toEqual([]);
      const missingBands = bands.filter((b) => !printed.includes(squeeze(b)));
      expect(missingBands, `${missingBands.length} of ${bands.length} intervals missing`).toEqual([]);
      if (page.startsWith("saltmarsh")) expect(bands.length).toBeGreaterThan(100);
    });
  }
});
