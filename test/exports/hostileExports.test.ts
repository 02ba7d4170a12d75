// Exports cannot carry code. Every user string of a scenario holds a line break, a lone carriage return, a tab,
// spreadsheet formula prefixes, TeX primitives and non-ASCII letters; each export format is then read by an
// independent reader: pdflatex (TeX Live, with shell escape on and -recorder listing every file it opened),
// csv-parse, markdown-it and linkedom. The rules checked are OWASP's advice on CSV injection, RFC 4180 and GFM.
import { describe, expect, it, beforeAll } from "vitest";
import { spawnSync } from "node:child_process";
import { existsSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { parse as parseCsv } from "csv-parse/sync";
import MarkdownIt from "markdown-it";
import { compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";

const PDFLATEX = ["/usr/bin/pdflatex", "/usr/local/bin/pdflatex"].find((p) => existsSync(p)) ?? null;
const required = process.env.COSMOLEDGER_REQUIRE_BROWSER === "1"; // CI installs TeX Live beside Chromium

let work: string;
let marker: string;
/** A hostile string that also carries a named marker command (for the \write18 check). */
const evil = (tag: string) =>
  `=HYPERLINK("http://example.invalid/${tag}")\n\\input{/etc/passwd}\r\\immediate\\write18{touch ${marker}}\t+1 -2 @3 \u03bb\u039b caf\u00e9 \u00dcber \u00df ${tag}`;

function hostileScenario(): string {
  const q = (s: string) => JSON.stringify(s); // a YAML double-quoted scalar holds \n, \r and \t as escapes
  return [
    `title: ${q(`x${evil("title")}`)}`,
    "id: hostile-exports",
    // h units put every model's label into a note line of every export (a comment in CSV and LaTeX).
    "h_units: true",
    `author: ${q(evil("author"))}`,
    `tags: [${q(`=t\n\\x\r@\u03bb`)}]`,
    `description: ${q(evil("description"))}`,
    "redshifts: [0.5, 2]",
    "grid: { z_max: 3, points: 8 }",
    "draws: { count: 40, seed: 3 }",
    "models:",
    // A spread puts intervals (X^{+a}_{-b} in LaTeX) into every exported table of model a.
    `  - { id: a, label: ${q(evil("label-a"))}, notes: ${q(evil("notes"))}, H0: 70, Omega_m: 0.3, omega_b: 0.0224, spread: { normal: { H0: 1, Omega_m: 0.01 } } }`,
    `  - { id: b, label: ${q(`-${evil("label-b")}`)}, extends: a, w0: -0.9 }`,
    // A LaTeX label (checked to hold mathematics only) is set in math mode in every .tex export and must compile.
    `  - { id: c, label: plain, label_tex: '\\Lambda\\mathrm{CDM}_{\\nu}', extends: a, w0: -1.1 }`,
    "targets:",
    `  - { name: ${q(`@${evil("target")}`)}, z: 1, size_kpc: 5, absolute_magnitude: -21 }`,
    "surveys:",
    `  - { name: ${q(`+${evil("survey")}`)}, area_deg2: 100, z_min: 0.5, z_max: 1, density_per_Mpc3: 1.0e-4 }`,
    "",
  ].join("\n");
}

beforeAll(() => {
  compileProject();
  work = tempDir();
  marker = join(work, "write18-ran");
  writeFileSync(join(work, "hostile.yaml"), hostileScenario());
  const r = runCli(["export", "hostile.yaml", "--format", "csv,md,tex,html,json", "--out", "exp"], work);
  expect(r.code, r.stderr).toBe(0);
});

const files = (ext: string) => {
  const dir = join(work, "exp/hostile-exports/draft");
  return readdirSync(dir)
    .filter((f) => f.endsWith(ext))
    .map((f) => join(dir, f));
};

describe("exports of a hostile scenario", { timeout: 600_000 }, () => {
  it("CSV: no text cell starts a formula, numbers stay numbers, line breaks stay inside quoted fields", () => {
    const csvs = files(".csv");
    expect(csvs.length).toBeGreaterThan(10);
    for (const f of csvs) {
      const text = readFileSync(f, "utf8");
      // Exactly the three provenance comment lines and one line per note: a newline in the title or a label made no
      // line of its own.
      const notes = JSON.parse(readFileSync(f.replace(/\.csv$/, ".json"), "utf8")).table.notes.length;
      expect(notes, f).toBeGreaterThan(0);
      expect(text.split("\r\n").filter((l) => l.startsWith("#")).length, f).toBe(3 + notes);
      const rows = parseCsv(text, { comment: "#", relax_column_count: true }) as string[][];
      for (const row of rows)
        for (const cell of row) {
          if (cell === "" || Number.isFinite(Number(cell))) continue; // numbers (negative ones too) are numbers
          expect(cell, `${f}: ${JSON.stringify(cell)}`).not.toMatch(/^[=+\-@\t\r]/);
        }
    }
    // The compute CSVs (targets, surveys) follow the same rule.
    const r = runCli(["compute", "hostile.yaml", "--out", "tables"], work);
    expect(r.code, r.stderr).toBe(0);
    for (const name of ["targets.csv", "surveys.csv", "parameters.csv"]) {
      const rows = parseCsv(readFileSync(join(work, "tables/hostile-exports", name), "utf8")) as string[][];
      for (const cell of rows.flat()) {
        if (cell === "" || Number.isFinite(Number(cell))) continue;
        expect(cell, `${name}: ${JSON.stringify(cell)}`).not.toMatch(/^[=+\-@\t\r]/);
      }
    }
  });

  it("Markdown: every file renders as exactly one table with all its rows (markdown-it, GFM tables)", () => {
    const md = new MarkdownIt();
    for (const f of files(".md").filter((f) => !f.endsWith("charts.md"))) {
      const text = readFileSync(f, "utf8");
      const tokens = md.parse(text, {});
      expect(tokens.filter((t) => t.type === "table_open").length, f).toBe(1);
      const bodyRows = text.split("\n").filter((l) => l.startsWith("| ")).length - 1; // header row, then body rows
      expect(tokens.filter((t) => t.type === "tr_open").length, f).toBe(bodyRows);
    }
  });

  it.skipIf(!PDFLATEX && !required)(
    "LaTeX: every .tex compiles with pdflatex, reads no file of ours or the system's, and runs nothing",
    () => {
      expect(
        PDFLATEX,
        "pdflatex must be installed (apt-get install texlive-latex-base texlive-latex-recommended)",
      ).not.toBeNull();
      const texs = files(".tex");
      expect(texs.length).toBeGreaterThan(10);
      for (const f of texs) {
        const doc = join(work, "doc.tex");
        const fragment = readFileSync(f, "utf8");
        // Exactly the packages the fragment names on its "% needs" line (none when it has none).
        const packages = /^% needs (.*)$/m.exec(fragment)?.[1] ?? "";
        writeFileSync(doc, `\\documentclass{article}\n${packages}\n\\begin{document}\n${fragment}\n\\end{document}\n`);
        // Shell escape on, as some users' TeX is configured: a \write18 that reached TeX would create the marker.
        const r = spawnSync(
          PDFLATEX!,
          ["-interaction=nonstopmode", "-halt-on-error", "-shell-escape", "-recorder", "doc.tex"],
          {
            cwd: work,
            encoding: "utf8",
            timeout: 120_000,
          },
        );
        expect(r.status, `${f}\n${r.stdout.slice(-1500)}`).toBe(0);
        const opened = readFileSync(join(work, "doc.fls"), "utf8")
          .split("\n")
          .filter((l) => l.startsWith("INPUT "))
          .map((l) => l.slice(6));
        const outside = opened.filter(
          (p) =>
            !p.startsWith("/usr/share/") &&
            !p.startsWith("/var/lib/texmf") &&
            !p.startsWith("/etc/texmf") &&
            !/^(\.\/)?doc\.(tex|aux)$/.test(p) &&
            !p.startsWith(work),
        );
        expect(outside, f).toEqual([]);
        expect(
          opened.some((p) => p.includes("passwd")),
          f,
        ).toBe(false);
        expect(existsSync(marker), `${f} ran a shell command`).toBe(false);
      }
    },
  );

  it("HTML fragments and JSON carry the text as text", () => {
    for (const f of files(".json")) expect(() => JSON.parse(readFileSync(f, "utf8")), f).not.toThrow();
    for (const f of files(".html")) expect(readFileSync(f, "utf8"), f).not.toMatch(/<script|<iframe|onerror=/i);
  });
});
