// Exports checked against independent readers: markdown-it (CommonMark + GFM tables), csv-parse (RFC 4180),
// pngjs (PNG decoder), linkedom (HTML and SVG parser), and the LaTeX rules for special characters
// (The LaTeX Companion / LaTeX2e manual: & % $ # _ { } are escaped with a backslash, ~ ^ \ need \textasciitilde{},
// \textasciicircum{}, \textbackslash{}; | in text needs \textbar{}).
import { beforeAll, describe, expect, it } from "vitest";
import { existsSync, mkdirSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import MarkdownIt from "markdown-it";
import { parse as parseCsv } from "csv-parse/sync";
import { PNG } from "pngjs";
import { parseHTML } from "linkedom";
import { HOSTILE_SCENARIO, ROOT, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";

/** The demo lantern scenario's newest frozen version (it is frozen again when an engine change moves its numbers). */
const LATEST = Math.max(
  ...readdirSync(join(ROOT, "scenarios/archive/lantern-deep-field")).map((f) =>
    Number(/^v(\d+)\.json$/.exec(f)?.[1] ?? 0),
  ),
);

const md = new MarkdownIt();
const squash = (s: string) => s.replace(/\s+/g, " ").trim();

/** A page cell's text as the page prints it, without the difference annotation and the model id and badges of a header. */
function pageCell(el: Element): string {
  const copy = el.cloneNode(true) as Element;
  copy.querySelectorAll(".diff, .badge, .model-id, .extends").forEach((d) => d.remove());
  return squash(copy.textContent ?? "");
}
function pageTable(doc: Document, id: string): string[][] {
  const table = doc.querySelector(`table[data-export-table="${id}"]`);
  if (!table) throw new Error(`no table ${id} on the page`);
  return [...table.querySelectorAll("tr")].map((tr) => [...tr.querySelectorAll("th, td")].map(pageCell));
}
function markdownTable(text: string): string[][] {
  const { document } = parseHTML(`<div>${md.render(text)}</div>`);
  return [...document.querySelectorAll("table tr")].map((tr) =>
    [...tr.querySelectorAll("th, td")].map((c) => squash(c.textContent ?? "")),
  );
}

/** LaTeX cell text back to page text: the inverse of the escapes named above and of $-1.2\times10^{-5}$. */
const SUPER: Record<string, string> = {
  "-": "\u207b",
  "0": "\u2070",
  "1": "\u00b9",
  "2": "\u00b2",
  "3": "\u00b3",
  "4": "\u2074",
  "5": "\u2075",
  "6": "\u2076",
  "7": "\u2077",
  "8": "\u2078",
  "9": "\u2079",
};
function latexToText(s: string): string {
  return (
    s
      // Long text wraps in a ragged-right box of the export's own making: the box is layout, its content the text.
      .replace(/^\\parbox\[t\]\{[^}]*\}\{\\raggedright (.*)\}$/s, "$1")
      .replace(
        /\$(-?)([0-9.]+)\\times10\^\{(-?\d+)\}\$/g,
        (_, sign, m, e) => `${sign ? "\u2212" : ""}${m} \u00d7 10${[...e].map((c: string) => SUPER[c]).join("")}`,
      )
      .replace(/\$-([0-9.]+)\$/g, "\u2212$1")
      .replace(/^---$/, "\u2014")
      .replace(/\\textbackslash\{\}/g, "\\")
      .replace(/\\textasciitilde\{\}/g, "~")
      .replace(/\\textasciicircum\{\}/g, "^")
      .replace(/\\textbar\{\}/g, "|")
      .replace(/\\textless\{\}/g, "<")
      .replace(/\\textgreater\{\}/g, ">")
      .replace(/\\textsuperscript\{(\d)\}/g, (_, d) => SUPER[d])
      .replace(/\\([&%$#_{}])/g, "$1")
      .replace(/\$-\$/g, "\u2212")
      .replace(/\$\\times\$/g, "\u00d7")
      .replace(/\$\\pi\$/g, "\u03c0")
      .trim()
  );
}
/** Rows of a tabular: between \midrule and \bottomrule, split on unescaped & and the row end \\. */
function latexRows(tex: string): string[][] {
  const body = tex.slice(tex.indexOf("\\midrule") + 8, tex.indexOf("\\bottomrule"));
  return body
    .split(/\\\\\s*\n/)
    .map((r) => r.trim())
    .filter(Boolean)
    .map((r) => r.split(/(?<!\\)&/).map((c) => latexToText(c.trim())));
}
function latexHeader(tex: string): string[] {
  const lines = tex
    .slice(tex.indexOf("\\toprule"), tex.indexOf("\\midrule"))
    .split("\n")
    .filter((l) => l.trim().endsWith("\\\\") && !l.includes("multicolumn"));
  return lines[0]
    .replace(/\\\\\s*$/, "")
    .split(/(?<!\\)&/)
    .map((c) => latexToText(c.trim()));
}
/** Environments opened and closed in order, braces balanced outside escapes, an even number of unescaped $. */
function latexBalanced(tex: string): boolean {
  const body = tex
    .split("\n")
    .filter((l) => !l.startsWith("%"))
    .join("\n");
  const stack: string[] = [];
  for (const m of body.matchAll(/\\(begin|end)\{([a-z*]+)\}/g)) {
    if (m[1] === "begin") stack.push(m[2]);
    else if (stack.pop() !== m[2]) return false;
  }
  let depth = 0;
  const unescaped = body.replace(/\\[{}$&%#_]/g, "");
  for (const c of unescaped) {
    if (c === "{") depth++;
    if (c === "}" && --depth < 0) return false;
  }
  return stack.length === 0 && depth === 0 && (unescaped.match(/\$/g)?.length ?? 0) % 2 === 0;
}

describe("exports of the demo site", () => {
  let site: string;
  let page: Document;
  let tables: {
    models: { id: string; summary: Record<string, number | null>; redshifts: Record<string, number | null>[] }[];
  };
  const exportsDir = () => join(site, "lantern-deep-field/exports");
  beforeAll(() => {
    compileProject();
    site = join(tempDir(), "site");
    const r = runCli(["build", "--out", site, "--quiet"]);
    if (r.code !== 0) throw new Error(r.stderr);
    page = parseHTML(readFileSync(join(site, "lantern-deep-field/index.html"), "utf8")).document;
    tables = JSON.parse(readFileSync(join(site, "lantern-deep-field/tables.json"), "utf8"));
  }, 120_000);

  it("every table on the page has its five exports, linked beside it", () => {
    const ids = [...page.querySelectorAll("table[data-export-table]")].map((t) => t.getAttribute("data-export-table")!);
    expect(ids).toContain("models");
    expect(ids).toContain("glance");
    expect(ids).toContain("z-luminosity_distance_Mpc");
    expect(ids).toContain("early");
    expect(ids).toContain("target-1");
    expect(ids).toContain("surveys");
    for (const id of ids) {
      const links = [...page.querySelectorAll(`p.exports[data-export="${id}"] a`)].map((a) => a.getAttribute("href"));
      expect(links, id).toEqual(["csv", "json", "md", "tex", "html"].map((f) => `exports/${id}.${f}`));
      for (const l of links) expect(existsSync(join(site, "lantern-deep-field", l!)), l!).toBe(true);
    }
  });

  it("Markdown parsed back with markdown-it gives the page's cells", () => {
    for (const id of [
      "models",
      "glance",
      "z-luminosity_distance_Mpc",
      "z-kpc_per_arcsec_proper",
      "early",
      "target-1",
    ]) {
      const fromMd = markdownTable(readFileSync(join(exportsDir(), `${id}.md`), "utf8"));
      const fromPage = pageTable(page, id);
      // The page's redshift tables carry the quantity in the caption; headers are the models.
      expect(fromMd, id).toEqual(fromPage);
    }
  });

  it("CSV parsed back (RFC 4180, # comments) gives the tables document's numbers at full precision", () => {
    const rows: string[][] = parseCsv(readFileSync(join(exportsDir(), "z-luminosity_distance_Mpc.csv"), "utf8"), {
      comment: "#",
    });
    expect(rows[0][0]).toBe("z");
    rows.slice(1).forEach((r, i) => {
      expect(Number(r[0])).toBe(tables.models[0].redshifts[i].z);
      tables.models.forEach((m, j) => expect(Number(r[j + 1])).toBe(m.redshifts[i].luminosity_distance_Mpc));
    });
    const glance: string[][] = parseCsv(readFileSync(join(exportsDir(), "glance.csv"), "utf8"), { comment: "#" });
    const age = glance.find((r) => r[0] === "Age today [Gyr]")!;
    tables.models.forEach((m, j) => expect(Number(age[j + 1])).toBe(m.summary.age_Gyr));
    const event = glance.find((r) => r[0] === "Comoving event horizon [Mpc]")!;
    tables.models.forEach((m, j) =>
      expect(event[j + 1]).toBe(m.summary.event_horizon_Mpc === null ? "" : String(m.summary.event_horizon_Mpc)),
    );
  });

  it("LaTeX: booktabs rules, balanced environments and braces, units in the header, the page's cells", () => {
    for (const id of ["glance", "z-luminosity_distance_Mpc", "early", "models"]) {
      const tex = readFileSync(join(exportsDir(), `${id}.tex`), "utf8");
      expect(latexBalanced(tex), id).toBe(true);
      for (const rule of ["\\toprule", "\\midrule", "\\bottomrule"]) expect(tex, id).toContain(rule);
      const fromPage = pageTable(page, id);
      expect([latexHeader(tex), ...latexRows(tex)], id).toEqual(fromPage);
    }
    expect(readFileSync(join(exportsDir(), "z-luminosity_distance_Mpc.tex"), "utf8")).toContain(
      "\\multicolumn{5}{c}{Luminosity distance D\\_L [Mpc]}",
    );
  });

  it("a whole redshift group exports as one table: a column block per quantity, \\multicolumn headers in LaTeX", () => {
    expect(page.querySelector('p.exports[data-export="group-distances"] a')?.getAttribute("href")).toBe(
      "exports/group-distances.csv",
    );
    const keys = [
      "comoving_distance_Mpc",
      "transverse_comoving_distance_Mpc",
      "angular_diameter_distance_Mpc",
      "luminosity_distance_Mpc",
      "distance_modulus_mag",
    ];
    const rows: string[][] = parseCsv(readFileSync(join(exportsDir(), "group-distances.csv"), "utf8"), {
      comment: "#",
    });
    expect(rows[0][1]).toBe("Comoving distance D_C [Mpc]: Flat reference (demo values)");
    expect(rows[0].length).toBe(1 + keys.length * tables.models.length);
    rows
      .slice(1)
      .forEach((r, i) =>
        keys.forEach((k, qi) =>
          tables.models.forEach((m, j) => expect(Number(r[1 + qi * tables.models.length + j])).toBe(m.redshifts[i][k])),
        ),
      );
    const tex = readFileSync(join(exportsDir(), "group-distances.tex"), "utf8");
    expect(latexBalanced(tex)).toBe(true);
    // Five quantities of five models are 25 value columns: too wide for a page, so one tabular per quantity, each
    // with its \multicolumn header over its own five model columns.
    expect(tex.match(/\\multicolumn\{5\}\{c\}/g)?.length).toBe(5);
    expect(tex.match(/\\begin\{tabular\}\{lrrrrr\}/g)?.length).toBe(5);
    expect(tex.match(/\\cmidrule\(lr\)\{2-6\}/g)?.length).toBe(5);
    expect(tex).toMatch(/^% in 5 tabulars of at most 8 value columns/m);
    const mdRows = markdownTable(readFileSync(join(exportsDir(), "group-distances.md"), "utf8"));
    expect(mdRows[0]).toEqual(rows[0]);
  });

  it("the HTML fragment is self-contained (no script, no outside link) and holds the page's cells", () => {
    const html = readFileSync(join(exportsDir(), "glance.html"), "utf8");
    const { document } = parseHTML(`<body>${html}</body>`);
    expect(document.querySelectorAll("script, link, img").length).toBe(0);
    const rows = [...document.querySelectorAll("table tr")].map((tr) =>
      [...tr.querySelectorAll("th, td")].map((c) => squash(c.textContent ?? "")),
    );
    expect(rows).toEqual(pageTable(page, "glance"));
  });

  it("PNGs decode (pngjs) at print size with drawn pixels, and carry provenance and alt text in iTXt chunks", () => {
    const pngs = readdirSync(exportsDir()).filter((f) => f.endsWith(".png"));
    // 4 distances, H/(1+z), age and lookback, scale, volume, 3 BAO ratios, and the linear growth (f sigma8, f and D:
    // the scenario gives sigma8): each as values and as a ratio to baseline.
    expect(pngs.length).toBe(30);
    expect(pngs.filter((f) => f.endsWith("-ratio.png"))).toHaveLength(15);
    for (const f of [
      ...pngs.slice(0, 3),
      "chart-scale-kpc_per_arcsec_proper.png",
      "chart-distances-luminosity_distance_Mpc-ratio.png",
    ]) {
      const bytes = readFileSync(join(exportsDir(), f));
      const png = PNG.sync.read(bytes);
      expect([png.width, png.height]).toEqual([1800, 1020]);
      let drawn = 0;
      for (let i = 0; i < png.data.length; i += 4)
        if (png.data[i] < 200 || png.data[i + 1] < 200 || png.data[i + 2] < 200) drawn++;
      expect(drawn, f).toBeGreaterThan(20_000);
      // Walk the chunks as the PNG specification lays them out: length, type, data, CRC.
      const text: Record<string, string> = {};
      let pixelsPerMetre: number[] = [];
      for (let at = 8; at < bytes.length; ) {
        const length = bytes.readUInt32BE(at);
        const type = bytes.toString("latin1", at + 4, at + 8);
        const data = bytes.subarray(at + 8, at + 8 + length);
        // pHYs: pixels per unit on x and y, unit 1 = metre (PNG specification 11.3.5.3).
        if (type === "pHYs") pixelsPerMetre = [data.readUInt32BE(0), data.readUInt32BE(4), data[8]];
        if (type === "iTXt") {
          const nul = data.indexOf(0);
          const rest = data.subarray(nul + 3);
          const afterLang = rest.indexOf(0) + 1;
          const afterKey = rest.indexOf(0, afterLang) + 1;
          text[data.toString("latin1", 0, nul)] = rest.subarray(afterKey).toString("utf8");
        }
        at += 12 + length;
      }
      expect(text.Source).toMatch(new RegExp(`^cosmoledger .*lantern-deep-field.*version ${LATEST}`));
      expect(text.Description).toMatch(/^Line chart of .* for 5 models/);
      // 300 dpi = 300 / 0.0254 m = 11811 pixels per metre, as "1800 x 1020 px: 6 x 3.4 inches at 300 dpi" claims.
      expect(pixelsPerMetre, f).toEqual([11811, 11811, 1]);
      // A title says each thing once ("Proper scale", not "Proper scale: Proper scale").
      const parts = text.Title.split(/: |, /);
      expect(new Set(parts).size, text.Title).toBe(parts.length);
      // Redshifts are written as a reader gives them (no padded zeros such as 20.0000).
      const zs = [
        ...(/redshift z from (\S+) to (\S+) /.exec(text.Description)?.slice(1) ?? []),
        ...(/At z = (\S+) /.exec(text.Description)?.slice(1) ?? []),
      ];
      expect(zs.length, text.Description).toBe(3);
      for (const z of zs) expect(z, text.Description).not.toMatch(/\.\d*0$|\.$/);
      if (f.includes("-ratio")) expect(text.Title).toMatch(/ratio to the baseline$/);
    }
  });

  it("SVGs are vector drawings with a title and an alt-text description", () => {
    const svg = readFileSync(join(exportsDir(), "chart-distances-luminosity_distance_Mpc.svg"), "utf8");
    const { document } = parseHTML(svg);
    const root = document.querySelector("svg")!;
    expect(root.getAttribute("role")).toBe("img");
    expect(document.querySelector("title")?.textContent).toBe("Distances: D_L");
    expect(document.querySelector("desc")?.textContent).toMatch(
      /^Line chart of D_L \[Mpc\] against redshift z .* for 5 models/,
    );
    expect(document.querySelectorAll("path").length).toBeGreaterThan(10);
    expect(document.querySelectorAll("image").length).toBe(0); // no embedded bitmap
  });

  it("every export names scenario, version, hash, engine and page", () => {
    const version = JSON.parse(readFileSync(join(site, `lantern-deep-field/v${LATEST}/version.json`), "utf8"));
    for (const f of readdirSync(exportsDir())) {
      if (f === "copy.js") continue;
      const text = readFileSync(join(exportsDir(), f)).toString("latin1");
      expect(text, f).toContain("lantern-deep-field");
      expect(text, f).toContain(`version ${LATEST}`);
      // LaTeX may break the hash every 16 digits (\allowbreak): the same digits.
      expect(text.replace(/\\allowbreak\{\}/g, ""), f).toContain(version.sha256);
      // The engine that computed the version, as its record says.
      expect(text, f).toContain(`engine ${version.engine.version}`);
      expect(text, f).toMatch(/lantern-deep-field\/index\.html/);
    }
    const draft = readFileSync(join(site, "tidewater-geometry/exports/glance.md"), "utf8");
    expect(draft).toContain("unfrozen draft");
    const frozen = readFileSync(join(site, "lantern-deep-field/v1/exports/glance.tex"), "utf8");
    expect(frozen).toContain("version 1");
    expect(frozen).toContain("page lantern-deep-field/v1/index.html#glance");
  });

  it("the assumptions paragraph names every model, the parameters set, the defaults, the versions and the hash", () => {
    const text = readFileSync(join(exportsDir(), "assumptions.txt"), "utf8");
    expect(text).toMatch(/"Mildly closed": as "Flat reference \(demo values\)" but Omega_k = -0\.015/);
    expect(text).toMatch(/H0 = 68\.2 km\/s\/Mpc/);
    expect(text).toMatch(/Defaults applied: .*T_cmb = 2\.7255 K, N_eff = 3\.044 in every model/);
    expect(text).toMatch(
      new RegExp(
        `cosmoledger \\d+\\.\\d+\\.\\d+ \\(engine \\d+\\.\\d+\\.\\d+\\); scenario lantern-deep-field, version ${LATEST} \\(SHA-256 [0-9a-f]{64}\\)`,
      ),
    );
    const tex = readFileSync(join(exportsDir(), "assumptions.tex"), "utf8");
    expect(latexBalanced(tex)).toBe(true);
    expect(tex).toContain("$\\Omega_k = -0.015$");
  });
});

describe("special characters in labels", { timeout: 180_000 }, () => {
  const NASTY = "A&B 5% $x$ #1 a_b {c} ~d ^e \\f |g";
  let out: string;
  beforeAll(() => {
    compileProject();
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    const yaml = (s: string) => JSON.stringify(s); // a JSON string is a valid double-quoted YAML scalar
    writeFileSync(
      join(dir, "scenarios/nasty.yaml"),
      [
        "id: nasty",
        `title: ${yaml(`Title ${NASTY}`)}`,
        "redshifts: [1]",
        "grid: { z_max: 2, points: 10 }",
        "models:",
        `  - { id: m1, label: ${yaml(NASTY)}, H0: 70, Omega_m: 0.3, flat: true }`,
        `  - { id: m2, label: ${yaml(`${NASTY} 2`)}, H0: 65, Omega_m: 0.3, flat: true }`,
        `targets:`,
        `  - { name: ${yaml(`Target ${NASTY}`)}, z: 1 }`,
        "",
      ].join("\n"),
    );
    const r = runCli(["export", "scenarios/nasty.yaml", "--format", "csv,json,md,tex,html", "--out", "ex"], dir);
    if (r.code !== 0) throw new Error(r.stderr);
    out = join(dir, "ex/nasty/draft");
  });

  it("Markdown: markdown-it reads the labels back exactly", () => {
    const rows = markdownTable(readFileSync(join(out, "glance.md"), "utf8"));
    expect(rows[0]).toEqual(["Quantity", NASTY, `${NASTY} 2`]);
    const title = md.render(readFileSync(join(out, "target-1.md"), "utf8").split("\n")[0]);
    expect(squash(parseHTML(`<div>${title}</div>`).document.querySelector("div")!.textContent!)).toBe(
      `Target: Target ${NASTY} (placed by z)`,
    );
  });

  it("LaTeX: every special character escaped, and the escapes read back to the label", () => {
    const tex = readFileSync(join(out, "glance.tex"), "utf8");
    expect(latexBalanced(tex)).toBe(true);
    const header = tex.split("\n").find((l) => l.startsWith("Quantity &"))!;
    expect(header).toContain(
      "A\\&B 5\\% \\$x\\$ \\#1 a\\_b \\{c\\} \\textasciitilde{}d \\textasciicircum{}e \\textbackslash{}f \\textbar{}g",
    );
    expect(latexHeader(tex)).toEqual(["Quantity", NASTY, `${NASTY} 2`]);
  });

  it("numbers survive the export path: c/H0 in the CSV at full precision and in LaTeX to six figures (closed form, c = 299792.458 km/s by SI definition)", () => {
    const csv: string[][] = parseCsv(readFileSync(join(out, "glance.csv"), "utf8"), { comment: "#" });
    const row = csv.find((r) => r[0] === "Hubble distance c/H0 [Mpc]")!;
    expect(Number(row[1])).toBeCloseTo(299792.458 / 70, 9);
    expect(Number(row[2])).toBeCloseTo(299792.458 / 65, 9);
    const tex = readFileSync(join(out, "glance.tex"), "utf8");
    expect(tex).toContain(
      `Hubble distance c/H0 [Mpc] & ${(299792.458 / 70).toPrecision(6)} & ${(299792.458 / 65).toPrecision(6)} \\\\`,
    );
  });

  it("CSV, JSON and the HTML fragment keep the labels exactly", () => {
    const csv: string[][] = parseCsv(readFileSync(join(out, "glance.csv"), "utf8"), { comment: "#" });
    expect(csv[0]).toEqual(["Quantity", NASTY, `${NASTY} 2`]);
    const json = JSON.parse(readFileSync(join(out, "glance.json"), "utf8"));
    expect(json.table.columns.map((c: { label: string }) => c.label)).toEqual([NASTY, `${NASTY} 2`]);
    const { document } = parseHTML(`<body>${readFileSync(join(out, "glance.html"), "utf8")}</body>`);
    expect([...document.querySelectorAll("thead th")].map((th) => th.textContent)).toEqual([
      "Quantity",
      NASTY,
      `${NASTY} 2`,
    ]);
  });
});

describe("hostile strings in exports", { timeout: 180_000 }, () => {
  it("HTML fragments and Markdown rendered by markdown-it (raw HTML on, as some wikis allow) carry no element or handler from a label", () => {
    compileProject();
    const dir = tempDir();
    writeFileSync(join(dir, "hostile.yaml"), HOSTILE_SCENARIO);
    const r = runCli(["export", "hostile.yaml", "--format", "md,html", "--out", "ex"], dir);
    expect(r.code, r.stderr).toBe(0);
    const out = join(dir, "ex/hostile/draft");
    const permissive = new MarkdownIt({ html: true });
    for (const f of readdirSync(out).filter((x) => x.endsWith(".html") || x.endsWith(".md"))) {
      const text = readFileSync(join(out, f), "utf8");
      const html = f.endsWith(".md") ? permissive.render(text) : text;
      const { document } = parseHTML(`<body>${html}</body>`);
      expect(document.querySelectorAll("script, img, svg, iframe").length, f).toBe(0);
      for (const el of document.querySelectorAll("*"))
        for (const a of el.getAttributeNames()) expect(a.startsWith("on"), `${f}: ${a}`).toBe(false);
    }
  });
});

describe("cosmoledger export", { timeout: 180_000 }, () => {
  it("exports a frozen version's stored tables, only the formats asked for, and refuses bad options with exit 2", () => {
    compileProject();
    const dir = tempDir();
    const r = runCli([
      "export",
      "scenarios/lantern-deep-field.yaml",
      "--version",
      "1",
      "--format",
      "tex",
      "--out",
      join(dir, "ex"),
    ]);
    expect(r.code, r.stderr).toBe(0);
    const files = readdirSync(join(dir, "ex/lantern-deep-field/v1")).filter((f) => !f.startsWith("."));
    expect(files.every((f) => f.endsWith(".tex") || f === "assumptions.txt")).toBe(true);
    const v1 = JSON.parse(readFileSync(join(ROOT, "scenarios/archive/lantern-deep-field/v1.json"), "utf8"));
    // Version 1 had no heavier-neutrino model (see its frozen source), so its glance table has four model columns.
    expect(v1.tables.models.length).toBe(4);
    expect(readFileSync(join(dir, "ex/lantern-deep-field/v1/glance.tex"), "utf8")).toContain("\\begin{tabular}{lrrrr}");
    expect(runCli(["export", "scenarios/lantern-deep-field.yaml", "--format", "docx"]).code).toBe(2);
    const empty = runCli(["export", "scenarios/lantern-deep-field.yaml", "--format", ",", "--out", join(dir, "ex3")]);
    expect(empty.code).toBe(2);
    expect(empty.stderr).toMatch(/--format names no format/);
    expect(existsSync(join(dir, "ex3"))).toBe(false);
    const missing = runCli([
      "export",
      "scenarios/lantern-deep-field.yaml",
      "--version",
      "99",
      "--out",
      join(dir, "ex2"),
    ]);
    expect(missing.code).toBe(2);
    expect(missing.stderr).toMatch(/has no version 99/);
    expect(existsSync(join(dir, "ex2"))).toBe(false);
  });
});
