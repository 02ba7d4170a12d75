// Text set in LaTeX reads back as written: a label holding every character TeX treats specially is escaped by the
// exports' escaping, compiled with pdflatex and read back from the PDF with pdftotext (poppler), which must give
// the label again. An unescaped < would print as an inverted exclamation mark in TeX's default font encoding, an
// unescaped & or # would stop the compilation (TeX's category codes; common practice).
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { existsSync, readFileSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { latexText } from "../../src/common/userText.js";
import { tempDir } from "../helpers/buildDemoSite.js";

const PDFLATEX = ["/usr/bin/pdflatex", "/usr/local/bin/pdflatex"].find((p) => existsSync(p)) ?? null;
const PDFTOTEXT = ["/usr/bin/pdftotext", "/usr/local/bin/pdftotext"].find((p) => existsSync(p)) ?? null;
const required = process.env.COSMOLEDGER_REQUIRE_BROWSER === "1";

const LABEL = "A&B 5% $x$ #1 a_b {c} ~d ^e \\f |g <h> i";

describe("LaTeX escaping round-trips through TeX", () => {
  it.skipIf((!PDFLATEX || !PDFTOTEXT) && !required)("every special character prints as itself", () => {
    expect(PDFLATEX && PDFTOTEXT, "pdflatex and pdftotext must be installed").toBeTruthy();
    const dir = tempDir();
    writeFileSync(
      join(dir, "doc.tex"),
      `\\documentclass{article}\n\\pagestyle{empty}\n\\begin{document}\n\\noindent ${latexText(LABEL)}\n\\end{document}\n`,
    );
    const tex = spawnSync(PDFLATEX!, ["-interaction=nonstopmode", "-halt-on-error", "doc.tex"], {
      cwd: dir,
      encoding: "utf8",
      timeout: 120_000,
    });
    expect(tex.status, tex.stdout.slice(-800)).toBe(0);
    const text = spawnSync(PDFTOTEXT!, ["doc.pdf", "-"], { cwd: dir, encoding: "utf8" }).stdout;
    // pdftotext gives the typeset characters: TeX's \textasciitilde and \textasciicircum are the spacing accents
    // U+02DC and U+02C6, and \_ is drawn as a rule, which reads back as a space.
    const read = text
      .replace(/\s+/g, " ")
      .trim()
      .replace(/\u02dc/g, "~")
      .replace(/\u02c6/g, "^");
    expect(read).toBe(LABEL.replace("_", " "));
    expect(readFileSync(join(dir, "doc.log"), "latin1")).not.toMatch(/Missing character/);
  });
});
