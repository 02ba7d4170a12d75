// Spreads in the exports of a page, read back with independent readers (csv-parse, markdown-it) and compared with
// the tables document's bands: every format carries the same intervals the page shows.
import { beforeAll, describe, expect, it } from "vitest";
import { copyFileSync, mkdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { parse as parseCsv } from "csv-parse/sync";
import MarkdownIt from "markdown-it";
import { parseHTML } from "linkedom";
import { ROOT, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";

type Band = { q: number[]; mc_error: number[] };
type Doc = {
  draws: { percentiles: number[] };
  models: {
    id: string;
    label: string;
    summary: Record<string, number | null>;
    redshifts: Record<string, number>[];
    spread?: { summary: Record<string, Band | null>; redshifts: Record<string, Band | null>[] };
  }[];
};

describe("spreads in the exports", () => {
  let site: string;
  let doc: Doc;
  const file = (name: string) => readFileSync(join(site, "saltmarsh-forecast", name), "utf8");
  beforeAll(() => {
    compileProject();
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    for (const f of ["saltmarsh-forecast.yaml", "saltmarsh-demo-chain.csv"])
      copyFileSync(join(ROOT, "scenarios", f), join(dir, "scenarios", f));
    site = join(dir, "site");
    const r = runCli(["build", "--scenarios", "scenarios", "--out", site, "--quiet", "--skip-images"], dir);
    if (r.code !== 0) throw new Error(r.stderr);
    doc = JSON.parse(file("tables.json"));
  }, 180_000);

  it("spread.csv holds every banded quantity: value, five percentiles and five Monte Carlo errors", () => {
    const rows = parseCsv(file("spread.csv"), { columns: true }) as Record<string, string>[];
    expect(Object.keys(rows[0])).toEqual([
      "model",
      "table",
      "row",
      "quantity",
      "value",
      "p2_5",
      "p16",
      "p50",
      "p84",
      "p97_5",
      "mc_error_p2_5",
      "mc_error_p16",
      "mc_error_p50",
      "mc_error_p84",
      "mc_error_p97_5",
    ]);
    for (const m of doc.models) {
      const age = rows.find((r) => r.model === m.id && r.table === "summary" && r.quantity === "age_Gyr")!;
      const band = m.spread!.summary.age_Gyr!;
      expect(Number(age.value)).toBe(m.summary.age_Gyr);
      expect([age.p2_5, age.p16, age.p50, age.p84, age.p97_5].map(Number)).toEqual(band.q);
      expect(
        [age.mc_error_p2_5, age.mc_error_p16, age.mc_error_p50, age.mc_error_p84, age.mc_error_p97_5].map(Number),
      ).toEqual(band.mc_error);
      // Percentiles are ordered and their Monte Carlo errors are non-negative (order statistics).
      for (let j = 1; j < 5; j++) expect(band.q[j]).toBeGreaterThanOrEqual(band.q[j - 1]);
      for (const e of band.mc_error) expect(e).toBeGreaterThanOrEqual(0);
    }
  });

  it("a table's CSV adds the median and the 16th and 84th percentiles of every model's draws", () => {
    const rows: string[][] = parseCsv(file("exports/z-luminosity_distance_Mpc.csv"), { comment: "#" });
    const header = rows[0];
    doc.models.forEach((m) => {
      const col = header.findIndex((h) => h.endsWith(`${m.label}: median of draws`));
      expect(col, m.label).toBeGreaterThan(0);
      rows.slice(1).forEach((r, i) => {
        const band = m.spread!.redshifts[i].luminosity_distance_Mpc!;
        expect([Number(r[col]), Number(r[col + 1]), Number(r[col + 2])]).toEqual([band.q[2], band.q[1], band.q[3]]);
      });
    });
  });

  it("Markdown and the page show the same interval text; LaTeX writes it as median^{+a}_{-b}", () => {
    const md = new MarkdownIt().render(file("exports/glance.md"));
    const cells = [...parseHTML(`<div>${md}</div>`).document.querySelectorAll("td")].map((c) => c.textContent ?? "");
    const page = parseHTML(file("index.html")).document;
    const bands = [...page.querySelectorAll('table[data-export-table="glance"] .band')].map((b) =>
      (b.textContent ?? "").replace(/\s+/g, " ").trim(),
    );
    expect(bands.length).toBeGreaterThan(10);
    for (const b of bands) expect(cells.some((c) => c.includes(`(${b})`))).toBe(true);
    const tex = file("exports/glance.tex");
    // The age of the first model: the interval's median and half-widths, as the page prints them.
    const first = bands[0].replace("68 %: ", "").split(" ");
    expect(tex).toContain(`$${first[0]}^{${first[1]}}_{${first[2].replace("\u2212", "-")}}$`);
  });

  it("JSON exports carry intervals_68 beside the values", () => {
    const j = JSON.parse(file("exports/glance.json"));
    const age = j.table.rows.find((r: { label: string }) => r.label === "Age today");
    expect(age.intervals_68.map((x: { median: number }) => x.median)).toEqual(
      doc.models.map((m) => m.spread!.summary.age_Gyr!.q[2]),
    );
  });
});
