// The pages' what-if engine (dist/bundle/what-if-engine.js: the scenario pipeline bundled for the browser) gives
// the very tables document `cosmoledger compute --json` writes for the same scenario text: 20 random models
// (fixed seed), compared as JSON text, so every double and every hash must agree. Source of the expectation: the
// requirement that the page run the same code as the command line (same code, same doubles).
import { describe, expect, it } from "vitest";
import { readFileSync, readdirSync, writeFileSync } from "node:fs";
import { join } from "node:path";
import { runInNewContext } from "node:vm";
import fc from "fast-check";
import { parse } from "yaml";
import { whatIf } from "../../src/pageEngine/whatIfEngine.js";
import { ROOT, compileProject, runCli, tempDir } from "../helpers/buildDemoSite.js";

type Engine = { whatIfTables: (text: string, file: string) => { doc: unknown } | { problems: string[] } };

function loadEngine(): Engine {
  // What a page offers the script (a browser has these as globals; nothing from Node).
  const context: Record<string, unknown> = { TextEncoder, TextDecoder, structuredClone };
  runInNewContext(readFileSync(join(ROOT, "dist/bundle/what-if-engine.js"), "utf8"), context);
  return context.cosmoledgerWhatIfEngine as Engine;
}

const model = fc.record({
  H0: fc.double({ min: 55, max: 80, noNaN: true }),
  Omega_m: fc.double({ min: 0.15, max: 0.45, noNaN: true }),
  Omega_k: fc.double({ min: -0.05, max: 0.05, noNaN: true }),
  w0: fc.double({ min: -1.3, max: -0.7, noNaN: true }),
  wa: fc.double({ min: -0.5, max: 0.3, noNaN: true }),
  omega_b: fc.double({ min: 0.02, max: 0.025, noNaN: true }),
  massive: fc.boolean(),
  sigma8: fc.option(fc.double({ min: 0.7, max: 0.9, noNaN: true }), { nil: undefined }),
});

describe("the what-if engine bundled for the pages", { timeout: 600_000 }, () => {
  it("computes the same tables document as compute --json, to the last bit, for 20 random models", () => {
    compileProject();
    const engine = loadEngine();
    const dir = tempDir();
    const samples = fc.sample(model, { seed: 20261204, numRuns: 20 });
    for (const [i, m] of samples.entries()) {
      const text = [
        `title: What-if ${i}`,
        `id: what-if-${i}`,
        "redshifts: [0.5, 1, 2, 3]",
        "models:",
        "  - { id: base, H0: 67.4, Omega_m: 0.315 }",
        `  - { id: what-if, extends: base, H0: ${m.H0}, Omega_m: ${m.Omega_m}, Omega_k: ${m.Omega_k}, w0: ${m.w0}, wa: ${m.wa}, omega_b: ${m.omega_b}${m.massive ? ", m_nu_eV: [0.06]" : ""}${m.sigma8 !== undefined ? `, sigma8: ${m.sigma8}` : ""} }`,
        "targets:",
        "  - { name: arc, z: 2, size_kpc: 5 }",
        "surveys:",
        "  - { name: shell, area_deg2: 100, z_min: 0.5, z_max: 1 }",
        "",
      ].join("\n");
      const file = join(dir, `what-if-${i}.yaml`);
      writeFileSync(file, text);
      const cli = runCli(["compute", file, "--json"], dir);
      const page = engine.whatIfTables(text, `what-if-${i}.yaml`); // as compute names it, from the folder
      if (cli.code !== 0) {
        // A model the command line refuses is refused in the page with the same lines.
        expect("problems" in page ? page.problems : []).toEqual(
          cli.stderr.split("\n").filter((l) => l.startsWith("error:")),
        );
        continue;
      }
      expect("doc" in page, JSON.stringify(page)).toBe(true);
      expect(JSON.stringify((page as { doc: unknown }).doc)).toBe(JSON.stringify(JSON.parse(cli.stdout)));
    }
  });

  it("answers the panel of every demo page, from every model, as the engine's source does (no Node globals in a page)", () => {
    compileProject();
    const engine = loadEngine() as unknown as { whatIf: typeof whatIf };
    for (const file of readdirSync(join(ROOT, "scenarios")).filter((f) => f.endsWith(".yaml"))) {
      const source = readFileSync(join(ROOT, "scenarios", file), "utf8");
      const { id, models } = parse(source) as { id: string; models: { id: string }[] };
      for (const m of models) {
        for (const changes of [{}, { w0: -0.95 }] as Record<string, number>[]) {
          // Unchanged, every model of a page computes; a change may be refused (w0 with Omega_Lambda), alike.
          const request = { source, file, id, start: { model: m.id }, changes };
          const page = engine.whatIf(request);
          if (Object.keys(changes).length === 0)
            expect(page.ok, `${file} ${m.id}: ${page.ok ? "" : page.problems.join("; ")}`).toBe(true);
          expect(JSON.stringify(page)).toBe(JSON.stringify(whatIf(request)));
        }
      }
    }
  });

  it("refuses an invalid value with the located words of check", () => {
    const engine = loadEngine();
    const text = "title: t\nid: t\nmodels:\n  - { id: a, H0: seventy, Omega_m: 0.3 }\n";
    const dir = tempDir();
    writeFileSync(join(dir, "t.yaml"), text);
    const check = runCli(["check", "t.yaml"], dir);
    const page = engine.whatIfTables(text, "t.yaml");
    expect("problems" in page ? page.problems : []).toEqual(
      check.stderr.split("\n").filter((l) => l.startsWith("error:")),
    );
  });
});
