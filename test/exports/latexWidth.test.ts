// Every LaTeX export of a wide scenario (eight models, two with a spread) fits a landscape A4 page in \footnotesize:
// compiled with pdflatex using exactly the packages it names, the log holds no overfull box wider than 1 pt
// (TeX reports every line or table wider than the text; common practice for checking layout).
import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { existsSync, mkdirSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";

const PDFLATEX = ["/usr/bin/pdflatex", "/usr/local/bin/pdflatex"].find((p) => existsSync(p)) ?? null;
const required = process.env.COSMOLEDGER_REQUIRE_BROWSER === "1";

const WIDE = `title: Eight models for a paper
id: wide
redshifts: [0.1, 0.5, 1, 2, 3, 5]
draws: { count: 60, seed: 3 }
models:
${Array.from({ length: 8 }, (_, i) => `  - { id: m${i}, label: "Model ${i} with a label", H0: ${65 + i}, Omega_m: ${(0.27 + 0.01 * i).toFixed(2)}, omega_b: 0.0224${i < 2 ? ", spread: { normal: { H0: 1 } }" : ""} }`).join("\n")}
targets:
  - { name: Arc, z: 2.3, size_kpc: 5 }
surveys:
  - { name: Shell, area_deg2: 100, z_min: 0.5, z_max: 1, density_per_Mpc3: 1.0e-4 }
`;

describe("LaTeX exports fit the page", { timeout: 600_000 }, () => {
  it.skipIf(!PDFLATEX && !required)("no export is wider than a landscape A4 text in footnotesize", () => {
    expect(PDFLATEX, "pdflatex must be installed").not.toBeNull();
    compileProject();
    const dir = tempDir();
    mkdirSync(join(dir, "scenarios"));
    writeFileSync(join(dir, "scenarios/wide.yaml"), WIDE);
    const r = runCli(["export", "scenarios/wide.yaml", "--format", "tex", "--out", "exp"], dir);
    expect(r.code, r.stderr).toBe(0);
    const folder = join(dir, "exp/wide/draft");
    const files = readdirSync(folder).filter((f) => f.endsWith(".tex") && f !== "assumptions.tex");
    expect(files.length).toBeGreaterThan(20);
    const overfull: string[] = [];
    for (const f of files) {
      const fragment = readFileSync(join(folder, f), "utf8");
      const needs = /^% needs (.*)$/m.exec(fragment)?.[1] ?? "";
      writeFileSync(
        join(dir, "doc.tex"),
        `\\documentclass{article}\n\\usepackage[a4paper,landscape,margin=15mm]{geometry}\n${needs}\n\\begin{document}\n\\footnotesize\n${fragment}\n\\end{document}\n`,
      );
      const tex = spawnSync(PDFLATEX!, ["-interaction=nonstopmode", "-halt-on-error", "doc.tex"], {
        cwd: dir,
        encoding: "utf8",
        timeout: 120_000,
      });
      expect(tex.status, `${f}\n${tex.stdout.slice(-1200)}`).toBe(0);
      const log = readFileSync(join(dir, "doc.log"), "latin1");
      for (const m of log.matchAll(/Overfull \\hbox \(([\d.]+)pt too wide\)/g))
        if (Number(m[1]) > 1) overfull.push(`${f}: ${m[1]} pt`);
    }
    expect(overfull).toEqual([]);
  });
});
