import { runInNewContext } from "node:vm";
import { beforeAll, describe, expect, it } from "vitest";
import { existsSync, readFileSync, readdirSync, statSync, writeFileSync, mkdirSync, copyFileSync } from "node:fs";
import { dirname, join, resolve } from "node:path";
import { parseHTML } from "linkedom";
import { formatNumber } from "../../src/presentation/formatNumber.js";
import { catalogFor } from "../../src/contract/quantityCatalog.js";
import { HOSTILE_SCENARIO, ROOT, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";

let site: string;

function htmlFiles(dir: string): string[] {
  return readdirSync(dir, { recursive: true, encoding: "utf8" })
    .filter((f) => f.endsWith(".html"))
    .map((f) => join(dir, f));
}
const doc = (file: string) => parseHTML(readFileSync(file, "utf8")).document;

beforeAll(() => {
  compileProject();
  site = join(tempDir(), "site");
  const r = runCli(["build", "--out", site, "--quiet"]);
  if (r.code !== 0) throw new Error(r.stderr);
}, 120_000);

describe("the demo site", { timeout: 120_000 }, () => {
  it("has an index and one page per demo scenario, with downloads beside each", () => {
    expect(existsSync(join(site, "index.html"))).toBe(true);
    for (const id of ["lantern-deep-field", "harbor-lights-census", "tidewater-geometry"]) {
      expect(existsSync(join(site, id, "index.html"))).toBe(true);
      expect(existsSync(join(site, id, "tables.json"))).toBe(true);
      expect(existsSync(join(site, id, "redshifts.csv"))).toBe(true);
    }
    expect(existsSync(join(site, "assets", "chart.umd.min.js"))).toBe(true);
  });

  it("redshift-table cells equal the tables document's values as formatted", () => {
    const tables = JSON.parse(readFileSync(join(site, "lantern-deep-field", "tables.json"), "utf8"));
    const page = doc(join(site, "lantern-deep-field", "index.html"));
    let checked = 0;
    // The quantities this document's page shows (the light-travel distance in Mpc, not also in Gly).
    for (const group of catalogFor(tables).REDSHIFT_GROUPS) {
      for (const q of group.quantities) {
        const table = page.querySelector(`table.ztable[data-quantity="${q.key}"]`);
        expect(table, q.key).not.toBeNull();
        const rows = [...table!.querySelectorAll("tbody tr")];
        expect(rows.length).toBe(tables.scenario.redshifts.length);
        rows.forEach((tr, i) => {
          const cells = [...tr.querySelectorAll("td")];
          tables.models.forEach((m: any, j: number) => {
            // The key must exist in the document (a misspelled catalogue key would read undefined on both sides).
            expect(Object.keys(m.redshifts[i]), `${q.key} is not a key of the tables document`).toContain(q.key);
            const shown = cells[j].childNodes[0].textContent;
            expect(shown, `${q.key} z=${tables.scenario.redshifts[i]} ${m.id}`).toBe(
              formatNumber(m.redshifts[i][q.key]),
            );
            checked++;
          });
        });
      }
    }
    expect(checked).toBeGreaterThan(300);
    // Every per-redshift quantity of the document has its table on the page, and no table shows a key it lacks; the
    // light-travel distance once, in Mpc (its Gly key stays in the document for readers of earlier formats).
    const onPage = [...page.querySelectorAll("table.ztable")].map((t) => t.getAttribute("data-quantity")).sort();
    const inDoc = Object.keys(tables.models[0].redshifts[0])
      .filter((k) => k !== "z" && k !== "light_travel_distance_Gly")
      .sort();
    expect(onPage).toEqual(inDoc);
  });

  it("every internal link and asset resolves, and no page refers to an outside URL", () => {
    for (const file of htmlFiles(site)) {
      const page = doc(file);
      for (const el of [...page.querySelectorAll("[href], [src]")]) {
        const url = el.getAttribute("href") ?? el.getAttribute("src")!;
        expect(url, `${file}: ${url}`).not.toMatch(/^(https?:)?\/\//);
        expect(url).not.toMatch(/^javascript:/i);
        if (url.startsWith("#")) {
          expect(page.getElementById(url.slice(1)), `${file}: missing anchor ${url}`).not.toBeNull();
          continue;
        }
        const target = resolve(dirname(file), url.split("#")[0]);
        expect(existsSync(target), `${file}: broken link ${url}`).toBe(true);
      }
    }
  });

  it("puts the Friedmann equation in as MathML and the scenario source verbatim", () => {
    const page = doc(join(site, "lantern-deep-field", "index.html"));
    expect(page.querySelectorAll("#assumptions math").length).toBeGreaterThanOrEqual(1);
    const source = readFileSync(join(ROOT, "scenarios", "lantern-deep-field.yaml"), "utf8");
    const listing = page.querySelector("pre.source")!.textContent!;
    expect(listing).toContain("extends: reference");
    expect(page.querySelectorAll("pre.source .ln").length).toBe(source.replace(/\n$/, "").split("\n").length);
  });

  // Our own budget for a page that loads quickly on a slow connection: 350 KB since the page carries the key-number
  // sheet (about 15 KB for five models) and, with massive neutrinos, their equations.
  it("a scenario page weighs at most 450 KB without the shared Chart.js file (format 6 added the growth tables and chart)", () => {
    for (const id of ["lantern-deep-field", "harbor-lights-census", "tidewater-geometry"]) {
      expect(statSync(join(site, id, "index.html")).size).toBeLessThan(450 * 1024);
    }
  });
});

describe("hostile strings from a scenario are shown as text and run nothing", { timeout: 120_000 }, () => {
  it("no injected element, event handler or javascript: link reaches the page", () => {
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    writeFileSync(join(dir, "scenarios", "hostile.yaml"), HOSTILE_SCENARIO);
    const out = join(dir, "site");
    const r = runCli(["build", "--scenarios", join(dir, "scenarios"), "--out", out, "--quiet"]);
    expect(r.code, r.stderr).toBe(0);
    const html = readFileSync(join(out, "hostile", "index.html"), "utf8");
    const page = parseHTML(html).document;
    const scripts = [...page.querySelectorAll("script")].map(
      (s) => s.getAttribute("src") ?? `${s.getAttribute("type")}#${s.getAttribute("id")}`,
    );
    expect(scripts).toEqual([
      "application/json#what-if-data",
      "application/json#chart-data",
      "../assets/chart.umd.min.js",
      "../assets/charts.js",
      "exports/copy.js",
      "../assets/copy-buttons.js",
      "../assets/what-if-panel.js",
    ]);
    // The what-if panel's data element holds the scenario's source as data: it parses back to the very text.
    const whatIfData = JSON.parse(page.getElementById("what-if-data")?.textContent ?? "{}") as { source?: string };
    expect(whatIfData.source).toBe(readFileSync(join(dir, "scenarios", "hostile.yaml"), "utf8"));
    // The copy texts are data: run in an empty sandbox, the file only assigns window.cosmoledgerCopy, and the labels survive as text.
    const sandbox: { window: Record<string, unknown> } = { window: {} };
    runInNewContext(readFileSync(join(out, "hostile", "exports", "copy.js"), "utf8"), sandbox);
    expect(Object.keys(sandbox.window)).toEqual(["cosmoledgerCopy"]);
    expect(JSON.stringify(sandbox.window.cosmoledgerCopy)).toContain("svg onload=window.__pwned=8");
    for (const el of [...page.querySelectorAll("*")]) {
      for (const attr of [...el.attributes]) expect(attr.name, `${el.tagName} ${attr.name}`).not.toMatch(/^on/i);
    }
    expect(page.querySelectorAll("img, svg, iframe").length).toBe(0);
    for (const a of [...page.querySelectorAll("[href]")])
      expect(a.getAttribute("href")).not.toMatch(/^\s*javascript:/i);
    expect(page.querySelector("h1")!.textContent).toContain("<script>window.__pwned = 1</script>");
    // The inline chart data cannot close its element early.
    expect(page.querySelector("#chart-data")!.textContent).not.toContain("</script");
  });
});

describe("builds that must not touch the previous site", { timeout: 120_000 }, () => {
  it("an invalid scenario stops the build with the compute error, exit 2, and the old site stays", () => {
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    copyFileSync(join(ROOT, "scenarios", "tidewater-geometry.yaml"), join(dir, "scenarios", "ok.yaml"));
    const out = join(dir, "site");
    expect(runCli(["build", "--scenarios", join(dir, "scenarios"), "--out", out, "--quiet"]).code).toBe(0);
    const before = readFileSync(join(out, "tidewater-geometry", "index.html"), "utf8");
    writeFileSync(join(dir, "scenarios", "bad.yaml"), "title: t\nmodels:\n  - id: a\n    H0: 70\n    Omega_M: 0.3\n");
    const r = runCli(["build", "--scenarios", join(dir, "scenarios"), "--out", out, "--quiet"]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/bad\.yaml:5:5: models\[0\]\.Omega_M: unknown key Omega_M\. did you mean Omega_m\?/);
    expect(readFileSync(join(out, "tidewater-geometry", "index.html"), "utf8")).toBe(before);
    expect(readdirSync(dir).sort()).toEqual(["scenarios", "site"]); // no temporary folders left behind
  });

  it("refuses to replace a folder that cosmoledger did not build", () => {
    const dir = tempDir();
    writeFileSync(join(dir, "precious.txt"), "mine");
    const r = runCli(["build", "--out", dir, "--quiet"]);
    expect(r.code).toBe(2);
    expect(readFileSync(join(dir, "precious.txt"), "utf8")).toBe("mine");
  });
});
