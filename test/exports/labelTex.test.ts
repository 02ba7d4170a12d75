// What `check` accepts as a LaTeX label, every output can set: refused labels are located errors (exit 2, no stack
// trace) for the faults TeX and the page's math renderer reject; accepted labels render with Temml (errors thrown,
// as the site calls it) and compile with pdflatex using exactly the packages the LaTeX export names.
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import temml from "temml";
import { compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";
import { labelTexProblem } from "../../src/scenario/labelTex.js";

const PDFLATEX = ["/usr/bin/pdflatex", "/usr/local/bin/pdflatex"].find((p) => existsSync(p)) ?? null;
const required = process.env.COSMOLEDGER_REQUIRE_BROWSER === "1";

/** Labels TeX or Temml would reject, with the words of the refusal (the faults TeX reports; common practice). */
const REFUSED: [string, RegExp][] = [
  ["x\\", /lone backslash/],
  ["\\frac", /\\frac needs an argument/],
  ["\\frac{a}", /\\frac needs an argument/],
  ["\\sqrt", /\\sqrt needs an argument/],
  ["x^1^2", /double superscript/],
  ["x_1_2", /double subscript/],
  ["x_", /a subscript needs an argument/],
  ["^2", /superscript with nothing before it/],
  ["\\text{\\alpha}", /holds text only/],
  ["\\text{a_b}", /holds text only/],
  ["\\text x", /needs its text in braces/],
  ["{x", /\{ without its \}/],
  ["x}", /\} without its \{/],
  ["\\input{x}", /may not use \\input/],
];

/** Labels both renderers set; those using \text or \tfrac need amsmath, which the export names. */
const ACCEPTED = [
  "\\Lambda\\mathrm{CDM}",
  "w_0 w_a\\text{CDM}",
  "\\tfrac{1}{2}\\Omega_k",
  "\\sqrt[3]{x}+\\sqrt{y}",
  "x_1^2",
  "{x^1}^2",
  "H_0'",
  "\\Omega_{\\rm m} = 0.3",
  "\\hat{H}\\,\\vec{v}",
];

describe("a LaTeX label that check accepts renders everywhere", { timeout: 300_000 }, () => {
  it("refuses, located, what TeX or the page's renderer would reject", () => {
    for (const [tex, why] of REFUSED) expect(labelTexProblem(tex), tex).toMatch(why);
    compileProject();
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    writeFileSync(
      join(dir, "scenarios/l.yaml"),
      "title: L\nid: l\nmodels:\n  - { id: a, H0: 70, Omega_m: 0.3, label_tex: 'x^1^2' }\n",
    );
    const r = runCli(["check", "scenarios/l.yaml"], dir);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/l\.yaml:4:\d+: models\[0\]\.label_tex: .*double superscript/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
  });

  it.skipIf(!PDFLATEX && !required)(
    "accepts labels that Temml renders and pdflatex compiles with the named packages",
    () => {
      expect(PDFLATEX, "pdflatex must be installed").not.toBeNull();
      for (const tex of ACCEPTED) {
        expect(labelTexProblem(tex), tex).toBeNull();
        expect(() => temml.renderToString(tex, { displayMode: false, throwOnError: true }), tex).not.toThrow();
      }
      const dir = tempDir();
      mkdirSync(join(dir, "scenarios"));
      const models = ACCEPTED.map(
        (tex, i) => `  - { id: m${i}, H0: ${60 + i}, Omega_m: 0.3, label_tex: ${JSON.stringify(tex)} }`,
      ).join("\n");
      writeFileSync(join(dir, "scenarios/l.yaml"), `title: L\nid: l\nredshifts: [1]\nmodels:\n${models}\n`);
      const r = runCli(["export", "scenarios/l.yaml", "--format", "tex", "--out", "exp"], dir);
      expect(r.code, r.stderr).toBe(0);
      const fragment = readFileSync(join(dir, "exp/l/draft/models.tex"), "utf8");
      const needs = /^% needs (.*)$/m.exec(fragment)![1];
      expect(needs).toBe("\\usepackage{booktabs} \\usepackage{amsmath}");
      writeFileSync(
        join(dir, "doc.tex"),
        `\\documentclass{article}\n${needs}\n\\begin{document}\n${fragment}\n\\end{document}\n`,
      );
      const tex = spawnSync(PDFLATEX!, ["-interaction=nonstopmode", "-halt-on-error", "doc.tex"], {
        cwd: dir,
        encoding: "utf8",
        timeout: 120_000,
      });
      expect(tex.status, tex.stdout.slice(-1500)).toBe(0);
    },
  );
});
